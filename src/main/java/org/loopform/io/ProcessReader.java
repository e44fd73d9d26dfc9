package org.loopform.io;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.loopform.lti.TransferFunction;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.GeneralTransferFunction;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.Measure;
import org.loopform.units.Plausible;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;

/**
 * Reads a process model block ({@code model: fopdt | sopdt | integrating | tf}) from a loop
 * file or a CSV row. Times take a unit ({@code 60 s}, {@code 1.5 min}; a bare number is seconds);
 * gains are %/% unless {@code gain_units: engineering}, then PV units per output unit, scaled
 * by the ranges to %/% (K% = K_eu * output span / PV span).
 */
public final class ProcessReader {

    static final Set<String> KEYS = Set.of("model", "gain", "time_constant", "time_constant_2", "damping",
            "natural_frequency", "dead_time", "lag", "num", "den", "gain_units");

    private ProcessReader() {
    }

    /** Reads the process from named text values; {@code where} is "file:line: process." for messages. */
    public static ProcessModel read(Map<String, String> v, Span pv, Span out, java.util.function.Function<String,
            String> where) {
        String model = v.getOrDefault("model", "").trim().toLowerCase(Locale.ROOT);
        double scale = 1.0;
        String units = v.getOrDefault("gain_units", "percent").trim().toLowerCase(Locale.ROOT);
        if (units.equals("engineering")) {
            if (pv == null || out == null) {
                throw new InputException(where.apply("gain_units") + "engineering-unit process gains need ranges "
                        + "{pv: LO..HI, output: LO..HI}; add them, or give the gain in %/%");
            }
            scale = out.width() / pv.width();
        } else if (!units.equals("percent")) {
            throw new InputException(where.apply("gain_units") + "must be percent or engineering (got '" + units + "')");
        }
        try {
            return switch (model) {
                case "fopdt" -> new FirstOrderPlusDeadTime(number(v, "gain", where) * scale,
                        seconds(v, "time_constant", where), deadTime(v, where));
                case "sopdt" -> v.containsKey("damping") || v.containsKey("natural_frequency")
                        ? SecondOrderPlusDeadTime.ofNaturalFrequency(number(v, "gain", where) * scale,
                        number(v, "damping", where), perSecond(v, "natural_frequency", where), deadTime(v, where))
                        : SecondOrderPlusDeadTime.ofTimeConstants(number(v, "gain", where) * scale,
                        seconds(v, "time_constant", where), seconds(v, "time_constant_2", where), deadTime(v, where));
                case "integrating" -> new IntegratingPlusDeadTime(number(v, "gain", where) * scale, deadTime(v, where),
                        v.containsKey("lag") ? seconds(v, "lag", where) : 0.0);
                case "tf" -> {
                    double[] num = list(v, "num", where);
                    double[] den = list(v, "den", where);
                    for (int k = 0; k < num.length; k++) {
                        num[k] *= scale;
                    }
                    yield new GeneralTransferFunction(TransferFunction.ofDescending(num, den), deadTime(v, where));
                }
                case "" -> throw new InputException(where.apply("model") + "required; one of fopdt, sopdt, "
                        + "integrating, tf");
                default -> throw new InputException(where.apply("model") + "must be fopdt, sopdt, integrating or tf "
                        + "(got '" + model + "')");
            };
        } catch (IllegalArgumentException e) {
            if (e instanceof InputException) {
                throw e;
            }
            throw new InputException(where.apply("model") + e.getMessage());
        }
    }

    private static String need(Map<String, String> v, String key, java.util.function.Function<String, String> where) {
        String s = v.get(key);
        if (s == null || s.isBlank()) {
            throw new InputException(where.apply(key) + "required for model " + v.get("model"));
        }
        return s;
    }

    private static double number(Map<String, String> v, String key, java.util.function.Function<String, String> where) {
        String s = need(v, key, where);
        double x;
        try {
            x = Double.parseDouble(s.trim());
        } catch (NumberFormatException e) {
            throw new InputException(where.apply(key) + "must be a number (got '" + s + "')");
        }
        if (key.equals("gain") && !Plausible.gain(x)) {
            throw new InputException(where.apply(key) + "must lie " + Plausible.gainRange() + " (got '" + s.trim()
                    + "'); check the value and its units");
        }
        if (!Double.isFinite(x)) {
            throw new InputException(where.apply(key) + "must be a finite number (got '" + s.trim() + "')");
        }
        return x;
    }

    /** A time that must be > 0 (time constants, lags), within {@link Plausible}'s limits. */
    private static double seconds(Map<String, String> v, String key, java.util.function.Function<String, String> where) {
        double t = anySeconds(v, key, where);
        if (!Plausible.time(t)) {
            throw new InputException(where.apply(key) + "must lie " + Plausible.timeRange() + " (got '"
                    + v.get(key).trim() + "'); check the value and its unit");
        }
        return t;
    }

    private static double anySeconds(Map<String, String> v, String key,
                                     java.util.function.Function<String, String> where) {
        String s = need(v, key, where);
        try {
            return Measure.parseSeconds(s, TimeUnit.SECONDS);
        } catch (UnitException e) {
            throw new InputException(where.apply(key) + e.getMessage());
        }
    }

    /** The dead time: 0, or within {@link Plausible}'s limits. */
    private static double deadTime(Map<String, String> v, java.util.function.Function<String, String> where) {
        if (!v.containsKey("dead_time")) {
            return 0.0;
        }
        double t = anySeconds(v, "dead_time", where);
        if (!Plausible.timeOrZero(t)) {
            throw new InputException(where.apply("dead_time") + "must be 0 or lie " + Plausible.timeRange()
                    + " (got '" + v.get("dead_time").trim() + "'); check the value and its unit");
        }
        return t;
    }

    private static double perSecond(Map<String, String> v, String key,
                                    java.util.function.Function<String, String> where) {
        String s = need(v, key, where);
        try {
            Measure m = Measure.parse(s);
            String u = m.unit().replace(" ", "");
            double radPerSecond;
            if (u.isEmpty() || u.equals("rad/s") || u.equals("1/s")) {
                radPerSecond = m.value();
            } else if (u.equals("rad/min") || u.equals("1/min")) {
                radPerSecond = m.value() / 60;
            } else {
                throw new InputException(where.apply(key) + "unknown unit '" + m.unit() + "'; write rad/s or rad/min");
            }
            // a natural frequency is the inverse of a time: the same limits, inverted
            if (!Plausible.time(1 / radPerSecond)) {
                throw new InputException(where.apply(key) + "must lie within 1e-7 rad/s to 1e6 rad/s (got '" + s.trim()
                        + "'); check the value and its unit");
            }
            return radPerSecond;
        } catch (UnitException e) {
            throw new InputException(where.apply(key) + e.getMessage());
        }
    }

    private static double[] list(Map<String, String> v, String key, java.util.function.Function<String, String> where) {
        String s = need(v, key, where).trim();
        if (s.startsWith("[") && s.endsWith("]")) {
            s = s.substring(1, s.length() - 1);
        }
        List<Double> out = new ArrayList<>();
        for (String part : s.split("[,\\s]+")) {
            if (part.isBlank()) {
                continue;
            }
            try {
                out.add(Double.parseDouble(part));
            } catch (NumberFormatException e) {
                throw new InputException(where.apply(key) + "must be a list of numbers, highest power of s first, "
                        + "e.g. [1, 3, 1] (got '" + part + "')");
            }
        }
        if (out.isEmpty()) {
            throw new InputException(where.apply(key) + "must list at least one coefficient");
        }
        return out.stream().mapToDouble(Double::doubleValue).toArray();
    }
}
