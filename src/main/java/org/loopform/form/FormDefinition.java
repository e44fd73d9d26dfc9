package org.loopform.form;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.regex.Pattern;

/**
 * One controller algorithm form: how a family of controllers writes down the PID law (structure,
 * gain, integral, derivative, filter, setpoint weights), what it accepts (limits and resolution
 * per parameter), and how it runs the law each scan. Data, read from a form file; never a subclass.
 */
public record FormDefinition(String id, String title, String description, Structure structure,
                             GainSpec gain, IntegralSpec integral, DerivativeSpec derivative, FilterSpec filter,
                             Weight b, Weight c, Map<String, ParameterLimit> limits, DiscreteAlgorithm algorithm) {

    private static final Pattern ID = Pattern.compile("[a-z0-9][a-z0-9._-]*");

    public FormDefinition {
        description = description == null ? "" : description;
        if (structure == null || gain == null || integral == null || derivative == null || filter == null
                || b == null || c == null || algorithm == null) {
            throw new FormException("form " + id + " is incomplete");
        }
        // every rule is checked, so that one read of a form file reports all of them
        List<String> problems = new ArrayList<>();
        if (id == null || !ID.matcher(id).matches()) {
            problems.add("id: must be lower-case letters, digits, '.', '_' or '-' (got '" + id + "')");
        }
        if (title == null || title.isBlank()) {
            problems.add("title: every form needs a one-line title");
        }
        boolean parallel = structure == Structure.PARALLEL;
        if (!parallel && integral.writing().parallelOnly()) {
            problems.add("integral.as: '" + integral.writing().name().toLowerCase() + "' needs structure "
                    + "parallel; an " + structure.id() + " form writes integral as 'time' or 'rate'");
        }
        if (!parallel && derivative.writing().parallel()) {
            problems.add("derivative.as: '" + derivative.writing().name().toLowerCase() + "' needs structure "
                    + "parallel; an " + structure.id() + " form writes derivative as 'time'");
        }
        if (parallel && !derivative.writing().parallel()) {
            problems.add("derivative.as: a parallel form writes derivative as 'gain' or 'per_scan' (kd)");
        }
        if (parallel && gain.writing() == GainWriting.BAND) {
            problems.add("gain.as: a parallel form writes kp as 'gain'; a band belongs to ideal or series forms");
        }
        if (filter.placement() == FilterPlacement.MEASUREMENT && structure != Structure.SERIES
                && (c.adjustable() || c.defaultValue() != 0)) {
            problems.add("weights.c: a filter on the measurement leaves the setpoint unfiltered, so the "
                    + "setpoint derivative weight must be fixed at 0 (derivative on measurement)");
        }
        if (structure == Structure.SERIES && (c.adjustable()
                || (c.defaultValue() != 0 && c.defaultValue() != 1))) {
            problems.add("weights.c: a series form takes derivative on error (c: 1) or on measurement "
                    + "(c: 0), fixed (got " + (c.adjustable() ? "adjustable" : c.defaultValue()) + ")");
        }
        limits = Map.copyOf(limits);
        List<String> names = parametersOf(structure, gain, integral, derivative, filter, b, c).stream()
                .map(FormParameter::name).filter(n -> !n.equals("action")).toList();
        for (String key : limits.keySet()) {
            if (!names.contains(key)) {
                problems.add("limits." + key + ": form " + id + " has no parameter '" + key
                        + "'; its parameters are " + String.join(", ", names));
            }
        }
        if (!problems.isEmpty()) {
            throw new FormException(problems);
        }
    }

    /** True when a conversion needs PV and output ranges. */
    public boolean needsRanges() {
        return gain.basis() == GainBasis.ENGINEERING;
    }

    /** True when a conversion needs the scan time (a per-scan gain). */
    public boolean needsScan() {
        return integral.writing() == IntegralWriting.PER_SCAN || derivative.writing() == DerivativeWriting.PER_SCAN;
    }

    public String gainName() {
        return gain.writing().name(structure);
    }

    public String integralName() {
        return integral.writing().parameter();
    }

    public String derivativeName() {
        return derivative.writing().parameter();
    }

    /** The unit text of parameter {@code name} ("" for a name the form does not have). */
    public String unitOf(String name) {
        return parameters().stream().filter(p -> p.name().equals(name)).findFirst()
                .map(FormParameter::unit).orElse("");
    }

    /** The names of the numeric parameters, in the order a person reads them. */
    public List<String> parameterNames() {
        return parameters().stream().map(FormParameter::name).filter(n -> !n.equals("action")).toList();
    }

    /** The limit for {@code name}, or {@link ParameterLimit#NONE}. */
    public ParameterLimit limit(String name) {
        return limits.getOrDefault(name, ParameterLimit.NONE);
    }

    /** Every parameter a person types into this form, with unit and meaning. */
    public List<FormParameter> parameters() {
        return parametersOf(structure, gain, integral, derivative, filter, b, c);
    }

    private static List<FormParameter> parametersOf(Structure structure, GainSpec gain, IntegralSpec integral,
                                                    DerivativeSpec derivative, FilterSpec filter, Weight b, Weight c) {
        List<FormParameter> list = new ArrayList<>();
        GainWriting g = gain.writing();
        list.add(new FormParameter(g.name(structure), g.unit(gain.basis()), g.meaning(structure), true, null));
        IntegralWriting i = integral.writing();
        list.add(new FormParameter(i.parameter(), i.unit(gain.basis(), integral.unit()), i.meaning() + offNote(integral),
                true, null));
        DerivativeWriting d = derivative.writing();
        list.add(new FormParameter(d.parameter(), d.unit(gain.basis(), derivative.unit()), d.meaning() + " (0: off)",
                true, null));
        filter.kind().formParameter(filter).ifPresent(list::add);
        if (b.adjustable()) {
            list.add(new FormParameter("b", "ratio", "setpoint weight on proportional action", false, b.defaultValue()));
        }
        if (c.adjustable()) {
            list.add(new FormParameter("c", "ratio", "setpoint weight on derivative action", false, c.defaultValue()));
        }
        if (gain.sign() == SignConvention.ACTION) {
            list.add(new FormParameter("action", "reverse|direct", "controller action", false, null));
        }
        return List.copyOf(list);
    }

    private static String offNote(IntegralSpec integral) {
        double off = integral.offValue();
        String v = off == Math.rint(off) ? Long.toString((long) off) : Double.toString(off);
        return integral.writing().isTime() && off > 0 ? " (" + v + " or more: off)" : " (" + v + ": off)";
    }
}
