package org.loopform.form;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import java.util.function.DoubleSupplier;
import org.loopform.units.Measure;
import org.loopform.units.Numbers;
import org.loopform.units.Plausible;
import org.loopform.units.UnitException;
import org.loopform.units.UnitText;

/**
 * The thin units layer between the values a person writes in a form and the structure's own SI
 * coordinates ({@link PidSetting}): proportional band versus gain (PB = 100/Kc), percent versus
 * engineering-unit basis (Kc% = Kc_eu * PV span / output span), time per repeat versus repeats per
 * time (reset = 1/Ti), per-scan gains (ki h, kd / h), action flag versus signed gain, and "off"
 * values. All of these are common practice; none changes the law.
 */
public final class FormCodec {

    /** Gains beyond this (or below its inverse), %/%, are typing errors, not tunings. */
    static final double MAX_GAIN = 1e9;

    private FormCodec() {
    }

    /**
     * Reads the values written in {@code form} into its structure's coordinates. {@code raw} maps
     * parameter names to text as typed ({@code "90s"}, {@code "2/min"}, {@code "1.2"});
     * {@code side} names the form's role in messages ("source" or "target").
     */
    public static PidSetting decode(FormDefinition form, Map<String, String> raw, WritingContext ctx, String side) {
        Map<String, String> values = new LinkedHashMap<>();
        raw.forEach((k, v) -> values.put(k.trim().toLowerCase(java.util.Locale.ROOT), v));
        for (String key : values.keySet()) {
            if (!key.equals("action") && !form.parameterNames().contains(key)) {
                throw new FormException("unknown parameter '" + key + "' for form " + form.id() + "; it expects "
                        + expects(form));
            }
        }
        for (String name : new String[] {form.gainName(), form.integralName(), form.derivativeName()}) {
            if (!values.containsKey(name)) {
                throw new FormException("missing parameter '" + name + "' for form " + form.id() + "; it expects "
                        + expects(form) + hint(form, name));
            }
        }
        boolean parallel = form.structure() == Structure.PARALLEL;
        double eu = form.needsRanges() ? ctx.engineeringToPercent(form, side) : 1.0;

        // gain and its sign
        GainWriting gw = form.gain().writing();
        double gainValue = number(form, values, form.gainName(), gw::inOwnUnit, gw.unitHint());
        double gain = gw.toGain(form.gainName(), gainValue, eu);
        Optional<Action> action = Optional.empty();
        if (values.containsKey("action")) {
            if (form.gain().sign() != SignConvention.ACTION) {
                throw new FormException("action: form " + form.id() + " writes the action in the sign of its gain "
                        + "(negative = direct); drop 'action' and sign the gain");
            }
            action = Optional.of(Action.parse(values.get("action")).orElseThrow(() -> new FormException(
                    "action: must be reverse or direct (got '" + values.get("action") + "')")));
        }
        if (form.gain().sign() == SignConvention.ACTION) {
            if (gainValue < 0) {
                throw new FormException(form.gainName() + ": form " + form.id() + " takes a positive gain with an "
                        + "action setting (got " + gainValue + "); write action=direct instead of a negative gain");
            }
            gain = Math.abs(gain) * action.orElse(Action.REVERSE).sign();
        }

        if (Math.abs(gain) > MAX_GAIN || Math.abs(gain) < 1 / MAX_GAIN) {
            throw new FormException(form.gainName() + ": " + gainValue + " gives a gain of " + Math.abs(gain)
                    + " %/%, outside what any controller holds (1e-9 to 1e9); check the value and its units");
        }
        DoubleSupplier scan = () -> ctx.scan(form, side);

        // integral
        IntegralSpec is = form.integral();
        IntegralWriting iw = is.writing();
        double iv = number(form, values, form.integralName(), (u, x) -> iw.inOwnUnit(u, x, is.unit()), iw.unitHint());
        if (iv < 0) {
            throw new FormException(form.integralName() + ": must be >= 0 (got " + iv + " " + form.unitOf(form.integralName())
                    + "); the controller's action is set by the gain" + (form.gain().sign() == SignConvention.ACTION
                    ? "'s action setting" : "'s sign"));
        }
        boolean integralOff = is.isOff(iv);
        if (!integralOff && iv == 0 && (iw.isTime() || !parallel)) {
            throw new FormException(form.integralName() + ": 0 is not a valid value for form " + form.id()
                    + ", which writes integral action off as " + Numbers.plain(is.offValue()) + " "
                    + form.unitOf(form.integralName()) + (iw.isTime() ? " or more" : "")
                    + "; give a positive value, or " + Numbers.plain(is.offValue())
                    + " to turn integral action off");
        }
        double integral;
        if (parallel) {
            double kiPerSecond = integralOff ? 0.0 : iw.toCoordinate(iv, is.unit(), true, scan);
            integral = Math.copySign(kiPerSecond * eu, gain);
        } else {
            integral = integralOff ? Double.POSITIVE_INFINITY : iw.toCoordinate(iv, is.unit(), false, scan);
        }

        // derivative
        DerivativeSpec ds = form.derivative();
        DerivativeWriting dw = ds.writing();
        double dv = number(form, values, form.derivativeName(), (u, x) -> dw.inOwnUnit(u, x, ds.unit()), dw.unitHint());
        if (dv < 0) {
            throw new FormException(form.derivativeName() + ": must be >= 0 (got " + dv + " "
                    + form.unitOf(form.derivativeName()) + "); write 0 to turn derivative action off");
        }
        double derivativeMagnitude = dw.toCoordinate(dv, ds.unit(), eu, scan);
        double derivative = dw.parallel() ? Math.copySign(derivativeMagnitude, gain) : derivativeMagnitude;

        // filter
        double td = parallel ? derivative / gain : derivative;
        FilterKind filter = form.filter().kind();
        double tf = filter.filterSeconds(form.filter(), td, written(form, values, filter.parameter()));
        double b = weight(form, values, "b", form.b());
        double c = weight(form, values, "c", form.c());
        plausible(form, values, gain, parallel ? (integral == 0 ? Double.POSITIVE_INFINITY : gain / integral)
                : integral, td, tf);
        return new PidSetting(form.structure(), gain, integral, derivative, tf, b, c);
    }

    /** Writes a setting in {@code form}'s units: the numeric values by name, in the form's order. */
    static WrittenTuning encode(FormDefinition form, PidSetting s, WritingContext ctx, String side) {
        boolean parallel = form.structure() == Structure.PARALLEL;
        if (s.structure() != form.structure()) {
            throw new IllegalArgumentException("setting is " + s.structure().id() + ", form " + form.id() + " is "
                    + form.structure().id());
        }
        double eu = form.needsRanges() ? ctx.engineeringToPercent(form, side) : 1.0;
        Map<String, Double> v = new LinkedHashMap<>();
        boolean signed = form.gain().sign() == SignConvention.SIGNED;
        GainWriting gw = form.gain().writing();
        v.put(form.gainName(), gw.fromGain(s.gain(), signed, eu));
        DoubleSupplier scan = () -> ctx.scan(form, side);
        IntegralSpec is = form.integral();
        double iv;
        if (!s.hasIntegral()) {
            iv = is.offValue();
        } else {
            double coordinate = parallel ? Math.abs(s.integral()) / eu : s.integral();
            iv = is.writing().fromCoordinate(coordinate, is.unit(), parallel, scan);
        }
        v.put(form.integralName(), iv);
        DerivativeSpec ds = form.derivative();
        v.put(form.derivativeName(), ds.writing().fromCoordinate(Math.abs(s.derivative()), ds.unit(), eu, scan));
        double td = s.derivativeTimeSeconds();
        FilterKind filter = form.filter().kind();
        filter.write(form.filter(), td, s.filterSeconds())
                .ifPresent(x -> v.put(filter.parameter().orElseThrow(), x));
        if (form.b().adjustable()) {
            v.put("b", s.b());
        }
        if (form.c().adjustable()) {
            v.put("c", s.c());
        }
        Action action = form.gain().sign() == SignConvention.ACTION ? Action.ofSign(s.gain()) : null;
        return new WrittenTuning(v, action);
    }

    /** The values of {@code t} as text that {@link #decode} reads back. */
    public static Map<String, String> asText(WrittenTuning t) {
        Map<String, String> m = new LinkedHashMap<>();
        t.values().forEach((k, x) -> m.put(k, isFilterOff(k, x) ? OFF : Double.toString(x)));
        if (t.action() != null) {
            m.put("action", t.action().id());
        }
        return m;
    }

    /** The written value of {@code n} that means "no derivative filter". */
    static final double FILTER_OFF = 0.0;
    /** How a person writes "no derivative filter": {@code n=off} (or {@code tf=off}). */
    public static final String OFF = "off";

    /** True when {@code name = value} in a written tuning means "no derivative filter". */
    public static boolean isFilterOff(String name, double value) {
        return FilterKind.RATIO.parameter().orElseThrow().equals(name) && value == FILTER_OFF;
    }

    private static boolean isOff(String text) {
        return text != null && text.trim().equalsIgnoreCase(OFF);
    }

    /**
     * A written value as a person reads and types it: "off" for a filter switched off, the
     * resolution's digits for a value on the resolution's grid (a value to enter), else
     * {@code digits} significant digits (an unrounded conversion shown beside it: 1.74367, never
     * 1.7436702884375173).
     */
    public static String show(FormDefinition form, String name, double value, int digits) {
        if (isFilterOff(name, value)) {
            return OFF;
        }
        ParameterLimit limit = form.limit(name);
        // round() is exact decimal arithmetic, so a value already on the grid rounds to itself
        return limit.resolution() != null && limit.round(value) == value ? Numbers.plain(value)
                : Numbers.significant(value, digits);
    }

    /** "kc (%/%), ti (s/repeat), td (s), optional n (ratio, default 10)". */
    public static String expects(FormDefinition form) {
        return form.parameters().stream().map(p -> p.required()
                        ? p.name() + " (" + p.unit() + ")"
                        : "optional " + p.name() + " (" + p.unit()
                        + (p.defaultValue() != null ? ", default " + Numbers.plain(p.defaultValue())
                        : p.name().equals("action") ? ", default reverse" : "") + ")")
                .collect(Collectors.joining(", "));
    }

    private static String hint(FormDefinition form, String name) {
        if (name.equals(form.derivativeName())) {
            return "; write " + name + "=0 for a controller without derivative action";
        }
        if (name.equals(form.integralName())) {
            return "; write " + name + "=" + Numbers.plain(form.integral().offValue())
                    + " for a controller without integral action";
        }
        return "";
    }

    /**
     * Refuses times beyond {@link Plausible}'s limits, in the terms the user wrote: the integral
     * time (Kc/Ki for parallel forms; infinite when integral action is off), the derivative time
     * and the filter time, all in seconds.
     */
    private static void plausible(FormDefinition form, Map<String, String> values, double gain,
                                  double integralSeconds, double derivativeSeconds, double filterSeconds) {
        String i = form.integralName();
        if (Double.isFinite(integralSeconds) && !Plausible.time(Math.abs(integralSeconds))) {
            throw new FormException(i + ": " + values.get(i) + " gives an integral time of "
                    + Math.abs(integralSeconds) + " s; it must lie " + Plausible.timeRange() + "; check the value and"
                    + " its unit, or write the form's 'off' value for no integral action");
        }
        String d = form.derivativeName();
        if (!Plausible.timeOrZero(Math.abs(derivativeSeconds))) {
            throw new FormException(d + ": " + values.get(d) + " gives a derivative time of "
                    + Math.abs(derivativeSeconds) + " s; it must be 0 or lie " + Plausible.timeRange()
                    + "; check the value and its unit");
        }
        if (!Plausible.timeOrZero(filterSeconds)) {
            String f = values.containsKey("tf") ? "tf" : values.containsKey("n") ? "n" : "filter";
            throw new FormException(f + ": the derivative filter time comes to " + filterSeconds + " s; it must be 0"
                    + " or lie " + Plausible.timeRange() + "; check the filter and derivative values");
        }
    }

    private static double weight(FormDefinition form, Map<String, String> values, String name, Weight w) {
        if (!values.containsKey(name)) {
            return w.defaultValue();
        }
        double v = number(form, values, name, NO_UNIT, PLAIN_HINT);
        if (!w.adjustable()) {
            throw new FormException(name + ": form " + form.id() + " fixes this setpoint weight at "
                    + Numbers.plain(w.defaultValue()) + "; drop '" + name + "'");
        }
        if (v < w.min() || v > w.max()) {
            throw new FormException(name + ": must lie within " + Numbers.plain(w.min()) + ".."
                    + Numbers.plain(w.max()) + " (got " + v + ")");
        }
        return v;
    }

    private static final OwnUnit NO_UNIT = (u, x) -> Optional.empty();
    private static final String PLAIN_HINT = "; write a bare number";

    /** The filter parameter {@code name} as written in {@code values} (absent when the form has none). */
    private static FilterKind.Written written(FormDefinition form, Map<String, String> values, Optional<String> name) {
        boolean given = name.isPresent() && values.containsKey(name.get());
        return new FilterKind.Written() {
            @Override
            public boolean given() {
                return given;
            }

            @Override
            public boolean off() {
                return given && isOff(values.get(name.get()));
            }

            @Override
            public double number(OwnUnit own, String unitHint) {
                return FormCodec.number(form, values, name.orElseThrow(), own, unitHint);
            }
        };
    }

    /** Reads a value, converting an explicit unit to the form's unit for that parameter. */
    private static double number(FormDefinition form, Map<String, String> values, String name, OwnUnit own,
                                 String unitHint) {
        String text = values.get(name);
        Measure m;
        try {
            m = Measure.parse(text);
        } catch (UnitException e) {
            throw new FormException(name + ": " + e.getMessage());
        }
        if (!m.hasUnit()) {
            return m.value();
        }
        return own.convert(m.unit(), m.value()).orElseThrow(() -> new FormException(name + ": unknown unit '"
                + m.unit() + "' (got '" + text.trim() + "'); form " + form.id() + " writes " + name + " in "
                + form.unitOf(name) + unitHint));
    }
}
