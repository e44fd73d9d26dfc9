package org.loopform.form;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;
import java.util.stream.Collectors;
import org.loopform.units.Measure;
import org.loopform.units.Plausible;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;

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
        double gainValue = number(form, values, form.gainName(), Kind.GAIN);
        double gain;
        if (form.gain().writing() == GainWriting.BAND) {
            if (!(gainValue > 0)) {
                throw new FormException("pb: a proportional band must be > 0 % (got " + gainValue + " %); it is "
                        + "100 / gain, so a small band is a high gain");
            }
            gain = 100.0 / gainValue;
        } else {
            if (gainValue == 0) {
                throw new FormException(form.gainName() + ": gain must not be 0 (got 0); a controller without "
                        + "proportional action cannot be written in these structures");
            }
            gain = gainValue * eu;
        }
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

        // integral
        double iv = number(form, values, form.integralName(), Kind.INTEGRAL);
        IntegralSpec is = form.integral();
        if (iv < 0) {
            throw new FormException(form.integralName() + ": must be >= 0 (got " + iv + " " + FormUnits.integralUnit(form)
                    + "); the controller's action is set by the gain" + (form.gain().sign() == SignConvention.ACTION
                    ? "'s action setting" : "'s sign"));
        }
        boolean integralOff = is.isOff(iv);
        if (!integralOff && iv == 0 && (is.writing() == IntegralWriting.TIME || !parallel)) {
            throw new FormException(form.integralName() + ": 0 is not a valid value for form " + form.id()
                    + ", which writes integral action off as " + org.loopform.units.Numbers.plain(is.offValue()) + " "
                    + FormUnits.integralUnit(form) + (is.writing() == IntegralWriting.TIME ? " or more" : "")
                    + "; give a positive value, or " + org.loopform.units.Numbers.plain(is.offValue())
                    + " to turn integral action off");
        }
        double integral;
        if (parallel) {
            double kiPerSecond = integralOff ? 0.0 : switch (is.writing()) {
                case TIME -> 1.0 / is.unit().toSeconds(iv);
                case RATE, GAIN -> iv / is.unit().seconds();
                case PER_SCAN -> iv / ctx.scan(form, side);
            };
            integral = Math.copySign(kiPerSecond * eu, gain);
        } else {
            if (integralOff) {
                integral = Double.POSITIVE_INFINITY;
            } else {
                integral = is.writing() == IntegralWriting.TIME ? is.unit().toSeconds(iv) : is.unit().seconds() / iv;
            }
        }

        // derivative
        double dv = number(form, values, form.derivativeName(), Kind.DERIVATIVE);
        if (dv < 0) {
            throw new FormException(form.derivativeName() + ": must be >= 0 (got " + dv + " "
                    + FormUnits.derivativeUnit(form) + "); write 0 to turn derivative action off");
        }
        DerivativeSpec ds = form.derivative();
        double derivative = switch (ds.writing()) {
            case TIME -> ds.unit().toSeconds(dv);
            case GAIN -> Math.copySign(ds.unit().toSeconds(dv) * eu, gain);
            case PER_SCAN -> Math.copySign(dv * ctx.scan(form, side) * eu, gain);
        };

        // filter
        double td = parallel ? derivative / gain : derivative;
        double tf = switch (form.filter().kind()) {
            case NONE -> 0.0;
            case FIXED_RATIO -> td / form.filter().ratio();
            case RATIO -> {
                if (values.containsKey("n") && isOff(values.get("n"))) {
                    yield 0.0;
                }
                double n = values.containsKey("n") ? number(form, values, "n", Kind.PLAIN) : form.filter().ratio();
                if (!(n > 0)) {
                    throw new FormException("n: the derivative filter ratio must be > 0 (got " + n + "); typical values"
                            + " are 8 to 20, or write n=off for a derivative without a filter");
                }
                yield td / n;
            }
            case TIME_CONSTANT -> {
                double t = values.containsKey("tf") ? (isOff(values.get("tf")) ? 0.0
                        : number(form, values, "tf", Kind.FILTER_TIME)) : form.filter().defaultTime();
                if (t < 0) {
                    throw new FormException("tf: the filter time constant must be >= 0 (got " + t + ")");
                }
                yield form.filter().unit().toSeconds(t);
            }
        };
        double b = weight(form, values, "b", form.b());
        double c = weight(form, values, "c", form.c());
        plausible(form, values, gain, parallel ? (integral == 0 ? Double.POSITIVE_INFINITY : gain / integral)
                : integral, td, tf);
        return new PidSetting(form.structure(), gain, integral, derivative, tf, b, c);
    }

    /** Writes a setting in {@code form}'s units: the numeric values by name, in the form's order. */
    public static WrittenTuning encode(FormDefinition form, PidSetting s, WritingContext ctx, String side) {
        boolean parallel = form.structure() == Structure.PARALLEL;
        if (s.structure() != form.structure()) {
            throw new IllegalArgumentException("setting is " + s.structure().id() + ", form " + form.id() + " is "
                    + form.structure().id());
        }
        double eu = form.needsRanges() ? ctx.engineeringToPercent(form, side) : 1.0;
        Map<String, Double> v = new LinkedHashMap<>();
        double magnitude = Math.abs(s.gain());
        boolean signed = form.gain().sign() == SignConvention.SIGNED;
        if (form.gain().writing() == GainWriting.BAND) {
            v.put("pb", 100.0 / magnitude);
        } else {
            v.put(form.gainName(), (signed ? s.gain() : magnitude) / eu);
        }
        IntegralSpec is = form.integral();
        double iv;
        if (!s.hasIntegral()) {
            iv = is.offValue();
        } else if (parallel) {
            double ki = Math.abs(s.integral()) / eu;
            iv = switch (is.writing()) {
                case TIME -> is.unit().fromSeconds(1.0 / ki);
                case RATE, GAIN -> ki * is.unit().seconds();
                case PER_SCAN -> ki * ctx.scan(form, side);
            };
        } else {
            iv = is.writing() == IntegralWriting.TIME ? is.unit().fromSeconds(s.integral())
                    : is.unit().seconds() / s.integral();
        }
        v.put(form.integralName(), iv);
        DerivativeSpec ds = form.derivative();
        double kd = Math.abs(s.derivative());
        v.put(form.derivativeName(), switch (ds.writing()) {
            case TIME -> ds.unit().fromSeconds(kd);
            case GAIN -> ds.unit().fromSeconds(kd / eu);
            case PER_SCAN -> kd / eu / ctx.scan(form, side);
        });
        double td = s.derivativeTimeSeconds();
        switch (form.filter().kind()) {
            // n = 0 stands for "off" (no filter) in a written tuning; it is printed and read back as "off"
            case RATIO -> v.put("n", s.filterSeconds() > 0 && td > 0 ? td / s.filterSeconds()
                    : td > 0 ? FILTER_OFF : form.filter().ratio());
            case TIME_CONSTANT -> v.put("tf", form.filter().unit().fromSeconds(s.filterSeconds()));
            default -> { }
        }
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
    public static final double FILTER_OFF = 0.0;
    /** How a person writes "no derivative filter": {@code n=off} (or {@code tf=off}). */
    public static final String OFF = "off";

    /** True when {@code name = value} in a written tuning means "no derivative filter". */
    public static boolean isFilterOff(String name, double value) {
        return name.equals("n") && value == FILTER_OFF;
    }

    private static boolean isOff(String text) {
        return text != null && text.trim().equalsIgnoreCase(OFF);
    }

    /**
     * A written value as a person reads and types it: "off" for a filter switched off, the
     * resolution's digits where the form names a resolution, else {@code digits} significant digits.
     */
    public static String show(FormDefinition form, String name, double value, int digits) {
        if (isFilterOff(name, value)) {
            return OFF;
        }
        return form.limit(name).resolution() != null ? org.loopform.units.Numbers.plain(value)
                : org.loopform.units.Numbers.significant(value, digits);
    }

    /** "kc (%/%), ti (s/repeat), td (s), optional n (ratio, default 10)". */
    public static String expects(FormDefinition form) {
        return form.parameters().stream().map(p -> p.required()
                        ? p.name() + " (" + p.unit() + ")"
                        : "optional " + p.name() + " (" + p.unit()
                        + (p.defaultValue() != null ? ", default " + org.loopform.units.Numbers.plain(p.defaultValue())
                        : p.name().equals("action") ? ", default reverse" : "") + ")")
                .collect(Collectors.joining(", "));
    }

    private static String hint(FormDefinition form, String name) {
        if (name.equals(form.derivativeName())) {
            return "; write " + name + "=0 for a controller without derivative action";
        }
        if (name.equals(form.integralName())) {
            return "; write " + name + "=" + org.loopform.units.Numbers.plain(form.integral().offValue())
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

    private enum Kind { GAIN, INTEGRAL, DERIVATIVE, FILTER_TIME, PLAIN }

    private static double weight(FormDefinition form, Map<String, String> values, String name, Weight w) {
        if (!values.containsKey(name)) {
            return w.defaultValue();
        }
        double v = number(form, values, name, Kind.PLAIN);
        if (!w.adjustable()) {
            throw new FormException(name + ": form " + form.id() + " fixes this setpoint weight at "
                    + org.loopform.units.Numbers.plain(w.defaultValue()) + "; drop '" + name + "'");
        }
        if (v < w.min() || v > w.max()) {
            throw new FormException(name + ": must lie within " + org.loopform.units.Numbers.plain(w.min()) + ".."
                    + org.loopform.units.Numbers.plain(w.max()) + " (got " + v + ")");
        }
        return v;
    }

    /** Reads a value, converting an explicit unit to the form's unit for that parameter. */
    private static double number(FormDefinition form, Map<String, String> values, String name, Kind kind) {
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
        String u = m.unit().replace(" ", "");
        switch (kind) {
            case GAIN -> {
                if (form.gain().writing() == GainWriting.BAND ? u.equals("%") : u.equals("%/%")) {
                    return m.value();
                }
            }
            case INTEGRAL -> {
                IntegralSpec is = form.integral();
                switch (is.writing()) {
                    case TIME -> {
                        Optional<TimeUnit> t = TimeUnit.parse(stripPerRepeat(u));
                        if (t.isPresent()) {
                            return is.unit().fromSeconds(t.get().toSeconds(m.value()));
                        }
                    }
                    case RATE, GAIN -> {
                        Optional<TimeUnit> t = perTime(u);
                        if (t.isPresent()) {
                            return m.value() * is.unit().seconds() / t.get().seconds();
                        }
                    }
                    case PER_SCAN -> {
                        if (u.equals("/scan") || u.equals("perscan")) {
                            return m.value();
                        }
                    }
                    default -> { }
                }
            }
            case DERIVATIVE, FILTER_TIME -> {
                boolean perScan = kind == Kind.DERIVATIVE && form.derivative().writing() == DerivativeWriting.PER_SCAN;
                if (perScan && (u.equals("scans") || u.equals("scan"))) {
                    return m.value();
                }
                TimeUnit own = kind == Kind.DERIVATIVE ? form.derivative().unit() : form.filter().unit();
                Optional<TimeUnit> t = TimeUnit.parse(u);
                if (t.isPresent() && !perScan) {
                    return own.fromSeconds(t.get().toSeconds(m.value()));
                }
            }
            default -> { }
        }
        throw new FormException(name + ": unknown unit '" + m.unit() + "' (got '" + text.trim() + "'); form "
                + form.id() + " writes " + name + " in " + FormUnits.of(form, name) + unitHint(kind, form));
    }

    private static String unitHint(Kind kind, FormDefinition form) {
        return switch (kind) {
            case INTEGRAL -> switch (form.integral().writing()) {
                case TIME -> "; write a time such as 90s or 1.5min";
                case RATE, GAIN -> "; write a rate such as 2/min or 0.05/s";
                case PER_SCAN -> "; write a bare number";
            };
            case DERIVATIVE, FILTER_TIME -> form.derivative().writing() == DerivativeWriting.PER_SCAN
                    && kind == Kind.DERIVATIVE ? "; write a bare number" : "; write a time such as 30s or 0.5min";
            default -> "; write a bare number";
        };
    }

    private static String stripPerRepeat(String u) {
        for (String suffix : new String[] {"/repeat", "/rep", "perrepeat"}) {
            if (u.endsWith(suffix)) {
                return u.substring(0, u.length() - suffix.length());
            }
        }
        return u;
    }

    /** Reads a "per time" unit: /min, 1/min, repeats/min, r/min, rpm, /s, 1/s, repeats/s, /h. */
    private static Optional<TimeUnit> perTime(String u) {
        if (u.equals("rpm")) {
            return Optional.of(TimeUnit.MINUTES);
        }
        int slash = u.indexOf('/');
        if (slash < 0) {
            return Optional.empty();
        }
        String head = u.substring(0, slash);
        if (!(head.isEmpty() || head.equals("1") || head.equals("r") || head.startsWith("repeat"))) {
            return Optional.empty();
        }
        return TimeUnit.parse(u.substring(slash + 1));
    }
}
