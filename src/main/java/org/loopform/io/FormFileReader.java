package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.Supplier;
import org.loopform.form.AlgorithmKind;
import org.loopform.form.AntiWindup;
import org.loopform.form.DerivativeSpec;
import org.loopform.form.DerivativeWriting;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.Discretization;
import org.loopform.form.FilterKind;
import org.loopform.form.FilterPlacement;
import org.loopform.form.FilterSpec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.GainBasis;
import org.loopform.form.GainSpec;
import org.loopform.form.GainWriting;
import org.loopform.form.IntegralSpec;
import org.loopform.form.IntegralWriting;
import org.loopform.form.ParameterLimit;
import org.loopform.form.SignConvention;
import org.loopform.form.Structure;
import org.loopform.form.Weight;
import org.loopform.units.Measure;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;

/**
 * Reads a form file (schema in {@code forms-catalog/README.md}) into a {@link FormDefinition},
 * collecting every problem with its file, line and field before giving up, so that one run of
 * {@code forms check} explains all of them.
 */
public final class FormFileReader {

    private static final Set<String> TOP = Set.of("id", "title", "description", "structure", "gain", "integral",
            "derivative", "filter", "weights", "limits", "algorithm");

    private final List<String> problems = new ArrayList<>();
    /** Sections that could not be read and stand in with their defaults. */
    private final Set<String> fellBack = new java.util.HashSet<>();

    private FormFileReader() {
    }

    public static FormDefinition read(Path path, String shownName) {
        return fromNode(YamlSource.read(path, shownName));
    }

    public static FormDefinition parse(String yamlText, String shownName) {
        return fromNode(YamlSource.parse(yamlText, shownName));
    }

    static FormDefinition fromNode(YamlNode root) {
        return new FormFileReader().build(root);
    }

    private FormDefinition build(YamlNode root) {
        if (!root.isMapping()) {
            throw new InputException(root.where() + "a form file is a mapping of keys (id, title, structure, ...); "
                    + "see forms-catalog/README.md");
        }
        problems.addAll(root.unknownKeys(TOP));
        Map<String, YamlNode> top = root.entries();
        String id = requiredText(root, top, "id");
        String title = requiredText(root, top, "title");
        String description = top.containsKey("description") ? text(top.get("description")) : "";
        int beforeStructure = problems.size();
        Structure structure = top.containsKey("structure")
                ? choice(top.get("structure"), Structure.class, null) : missing(root, "structure", Structure.class);
        if (problems.size() != beforeStructure) {
            fellBack.add("structure");
        }

        GainSpec gain = section(top, "gain", Set.of("as", "basis", "sign"), n -> new GainSpec(
                choice(n.get("as"), GainWriting.class, GainWriting.GAIN, "gain", "band"),
                choice(n.get("basis"), GainBasis.class, GainBasis.PERCENT, "percent", "engineering"),
                choice(n.get("sign"), SignConvention.class, SignConvention.SIGNED, "signed", "action")),
                () -> new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED));
        IntegralSpec integral = section(top, "integral", Set.of("as", "unit", "off"), n -> new IntegralSpec(
                choice(n.get("as"), IntegralWriting.class, IntegralWriting.TIME, "time", "rate", "gain", "per_scan"),
                timeUnit(n.get("unit")),
                n.containsKey("off") ? number(n.get("off")) : 0.0),
                () -> new IntegralSpec(IntegralWriting.TIME, TimeUnit.SECONDS, 0.0));
        DerivativeSpec derivative = section(top, "derivative", Set.of("as", "unit"), n -> new DerivativeSpec(
                choice(n.get("as"), DerivativeWriting.class, structure == Structure.PARALLEL
                        ? DerivativeWriting.GAIN : DerivativeWriting.TIME, "time", "gain", "per_scan"),
                timeUnit(n.get("unit"))),
                () -> new DerivativeSpec(structure == Structure.PARALLEL ? DerivativeWriting.GAIN
                        : DerivativeWriting.TIME, TimeUnit.SECONDS));
        FilterSpec filter = section(top, "filter", Set.of("kind", "ratio", "placement", "unit", "default"),
                n -> new FilterSpec(
                        choice(n.get("kind"), FilterKind.class, FilterKind.RATIO,
                                "none", "fixed_ratio", "ratio", "time_constant"),
                        choice(n.get("placement"), FilterPlacement.class, FilterPlacement.DERIVATIVE,
                                "derivative", "measurement"),
                        n.containsKey("ratio") ? number(n.get("ratio")) : 10.0,
                        timeUnit(n.get("unit")),
                        n.containsKey("default") ? number(n.get("default")) : 0.0),
                FilterSpec::defaults);
        Weight[] weights = section(top, "weights", Set.of("b", "c"), n -> new Weight[] {
                weight(n.get("b")), weight(n.get("c"))}, () -> new Weight[] {Weight.fixed(1), Weight.fixed(1)});
        Map<String, ParameterLimit> limits = top.containsKey("limits") ? limits(top.get("limits")) : Map.of();
        DiscreteAlgorithm algorithm = top.containsKey("algorithm") ? algorithm(top.get("algorithm"))
                : DiscreteAlgorithm.defaults();

        // the cross-field rules run on what was read, unless a section they depend on stands in with
        // its defaults (a rule about a default the file never wrote would only confuse)
        if (problems.isEmpty() || java.util.Collections.disjoint(fellBack,
                Set.of("structure", "gain", "integral", "derivative", "filter", "weights"))) {
            try {
                FormDefinition form = new FormDefinition(id, title, description, structure, gain, integral, derivative,
                        filter, weights[0], weights[1], limits, algorithm);
                if (problems.isEmpty()) {
                    return form;
                }
            } catch (FormException e) {
                e.problems().forEach(p -> problems.add(locate(root, p)));
            }
        }
        throw new InputException(problems);
    }

    /** Places a cross-field message ("weights.c: ...") at the line of the field it names. */
    private static String locate(YamlNode root, String message) {
        int colon = message.indexOf(": ");
        YamlNode at = root;
        if (colon > 0) {
            String field = message.substring(0, colon);
            YamlNode n = root;
            for (String part : field.split("\\.")) {
                if (!n.isMapping() || n.get(part).isEmpty()) {
                    n = null;
                    break;
                }
                n = n.get(part).get();
            }
            if (n != null) {
                return root.file() + ":" + n.line() + ": " + message;
            }
            String head = field.split("\\.")[0];
            if (root.get(head).isPresent()) {
                at = root.get(head).get();
                return root.file() + ":" + at.line() + ": " + message;
            }
        }
        return root.file() + ":" + at.line() + ": " + message;
    }

    private interface SectionReader<T> {
        T read(Map<String, YamlNode> entries);
    }

    private <T> T section(Map<String, YamlNode> top, String key, Set<String> known, SectionReader<T> reader,
                          Supplier<T> fallback) {
        YamlNode n = top.get(key);
        if (n == null) {
            return fallback.get();
        }
        if (!n.isMapping()) {
            problems.add(n.where() + "expected a mapping with keys " + String.join(", ", known.stream().sorted()
                    .toList()));
            fellBack.add(key);
            return fallback.get();
        }
        problems.addAll(n.unknownKeys(known));
        int before = problems.size();
        try {
            T value = reader.read(n.entries());
            if (problems.size() == before) {
                return value;
            }
        } catch (FormException | UnitException e) {
            // a value already reported stands in as 0 and may break the record; report the cause only
            if (problems.size() == before) {
                String m = e.getMessage();
                problems.add(n.file() + ":" + n.line() + ": " + (m.startsWith(key) ? "" : key + ": ") + m);
            }
        }
        fellBack.add(key);
        return fallback.get();
    }

    private String requiredText(YamlNode root, Map<String, YamlNode> top, String key) {
        if (!top.containsKey(key)) {
            problems.add(root.file() + ":" + root.line() + ": " + key + ": required; add '" + key + ": ...'");
            return key.equals("id") ? "missing-id" : "missing";
        }
        return text(top.get(key));
    }

    private <E extends Enum<E>> E missing(YamlNode root, String key, Class<E> type) {
        problems.add(root.file() + ":" + root.line() + ": " + key + ": required; one of " + names(type));
        return type.getEnumConstants()[0];
    }

    private String text(YamlNode n) {
        try {
            return n.text();
        } catch (InputException e) {
            problems.add(e.getMessage());
            return "";
        }
    }

    private <E extends Enum<E>> E choice(YamlNode n, Class<E> type, E fallback, String... allowed) {
        if (n == null) {
            if (fallback == null) {
                throw new IllegalStateException("no default");
            }
            return fallback;
        }
        String t = text(n).trim().toLowerCase(Locale.ROOT);
        List<String> accepted = allowed.length > 0 ? List.of(allowed) : null;
        for (E e : type.getEnumConstants()) {
            String name = e.name().toLowerCase(Locale.ROOT);
            if (name.equals(t) && (accepted == null || accepted.contains(name))) {
                return e;
            }
        }
        problems.add(n.where() + "must be one of " + (allowed.length > 0 ? String.join(", ", allowed) : names(type))
                + " (got '" + t + "')");
        return fallback != null ? fallback : type.getEnumConstants()[0];
    }

    private static <E extends Enum<E>> String names(Class<E> type) {
        List<String> n = new ArrayList<>();
        for (E e : type.getEnumConstants()) {
            n.add(e.name().toLowerCase(Locale.ROOT));
        }
        return String.join(", ", n);
    }

    private TimeUnit timeUnit(YamlNode n) {
        if (n == null) {
            return TimeUnit.SECONDS;
        }
        String t = text(n);
        return TimeUnit.parse(t).orElseGet(() -> {
            problems.add(n.where() + "must be a time unit: s, min or h (got '" + t + "')");
            return TimeUnit.SECONDS;
        });
    }

    private double number(YamlNode n) {
        String t = text(n);
        try {
            double v = Double.parseDouble(t.trim());
            if (Double.isFinite(v)) {
                return v;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        problems.add(n.where() + "must be a number (got '" + t + "')");
        return 0.0;
    }

    private double seconds(YamlNode n) {
        String t = text(n);
        try {
            return Measure.parseSeconds(t, TimeUnit.SECONDS);
        } catch (UnitException e) {
            problems.add(n.where() + e.getMessage());
            return 0.0;
        }
    }

    private Weight weight(YamlNode n) {
        if (n == null) {
            return Weight.fixed(1.0);
        }
        if (n.isScalar()) {
            return Weight.fixed(number(n));
        }
        if (!n.isMapping()) {
            problems.add(n.where() + "write a fixed weight as a number, or {default: 1, adjustable: true, min: 0, max: 1}");
            return Weight.fixed(1.0);
        }
        problems.addAll(n.unknownKeys(Set.of("default", "adjustable", "min", "max")));
        Map<String, YamlNode> e = n.entries();
        double d = e.containsKey("default") ? number(e.get("default")) : 1.0;
        boolean adjustable = !e.containsKey("adjustable") || bool(e.get("adjustable"));
        double min = e.containsKey("min") ? number(e.get("min")) : 0.0;
        double max = e.containsKey("max") ? number(e.get("max")) : 1.0;
        try {
            return adjustable ? new Weight(d, true, min, max) : Weight.fixed(d);
        } catch (FormException ex) {
            problems.add(n.where() + ex.getMessage());
            return Weight.fixed(1.0);
        }
    }

    private boolean bool(YamlNode n) {
        String t = text(n).trim().toLowerCase(Locale.ROOT);
        if (t.equals("true") || t.equals("yes")) {
            return true;
        }
        if (!t.equals("false") && !t.equals("no")) {
            problems.add(n.where() + "must be true or false (got '" + t + "')");
        }
        return false;
    }

    private Map<String, ParameterLimit> limits(YamlNode n) {
        Map<String, ParameterLimit> out = new LinkedHashMap<>();
        if (!n.isMapping()) {
            problems.add(n.where() + "expected a mapping from parameter name to {min, max, resolution}");
            return out;
        }
        n.entries().forEach((name, v) -> {
            if (!v.isMapping()) {
                problems.add(v.where() + "expected {min: ..., max: ..., resolution: ...}");
                return;
            }
            problems.addAll(v.unknownKeys(Set.of("min", "max", "resolution")));
            Map<String, YamlNode> e = v.entries();
            Double min = e.containsKey("min") ? number(e.get("min")) : null;
            Double max = e.containsKey("max") ? number(e.get("max")) : null;
            Double res = e.containsKey("resolution") ? number(e.get("resolution")) : null;
            try {
                out.put(name, new ParameterLimit(min, max, res));
            } catch (FormException ex) {
                problems.add(v.where() + ex.getMessage());
            }
        });
        return out;
    }

    private DiscreteAlgorithm algorithm(YamlNode n) {
        DiscreteAlgorithm d = DiscreteAlgorithm.defaults();
        if (!n.isMapping()) {
            problems.add(n.where() + "expected a mapping with kind, integral, derivative, anti_windup, tracking_time, "
                    + "output, scan");
            return d;
        }
        problems.addAll(n.unknownKeys(Set.of("kind", "integral", "derivative", "anti_windup", "tracking_time",
                "output", "scan")));
        Map<String, YamlNode> e = n.entries();
        AlgorithmKind kind = choice(e.get("kind"), AlgorithmKind.class, d.kind(), "positional", "velocity");
        Discretization integral = choice(e.get("integral"), Discretization.class, d.integral(),
                "forward", "backward", "trapezoidal");
        Discretization derivative = choice(e.get("derivative"), Discretization.class, d.derivative(),
                "forward", "backward", "trapezoidal", "ramp_invariant", "step_invariant");
        AntiWindup aw = choice(e.get("anti_windup"), AntiWindup.class, d.antiWindup(),
                "clamping", "back_calculation", "none");
        double tracking = e.containsKey("tracking_time") ? seconds(e.get("tracking_time")) : 0.0;
        double low = d.outputLowPercent();
        double high = d.outputHighPercent();
        if (e.containsKey("output")) {
            try {
                Span s = Span.parse(text(e.get("output")));
                low = s.low();
                high = s.high();
            } catch (UnitException ex) {
                problems.add(e.get("output").where() + ex.getMessage());
            }
        }
        List<Double> allowed = new ArrayList<>();
        double minScan = d.minScanSeconds();
        double maxScan = d.maxScanSeconds();
        YamlNode scan = e.get("scan");
        if (scan != null) {
            if (!scan.isMapping()) {
                problems.add(scan.where() + "write {allowed: [0.1 s, 0.5 s, 1 s]} or {min: 0.1 s, max: 10 s}");
            } else {
                problems.addAll(scan.unknownKeys(Set.of("allowed", "min", "max")));
                Map<String, YamlNode> s = scan.entries();
                if (s.containsKey("allowed")) {
                    YamlNode list = s.get("allowed");
                    if (list.isSequence()) {
                        list.items().forEach(item -> allowed.add(seconds(item)));
                    } else {
                        problems.add(list.where() + "expected a list of scan times such as [0.1 s, 0.5 s, 1 s]");
                    }
                }
                if (s.containsKey("min")) {
                    minScan = seconds(s.get("min"));
                }
                if (s.containsKey("max")) {
                    maxScan = seconds(s.get("max"));
                }
            }
        }
        try {
            return new DiscreteAlgorithm(kind, integral, derivative, aw, tracking, low, high, allowed, minScan, maxScan);
        } catch (FormException ex) {
            // the record's messages already start with "algorithm: "
            problems.add(n.file() + ":" + n.line() + ": " + ex.getMessage());
            return d;
        }
    }
}
