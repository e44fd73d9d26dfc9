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

    /** Reads the process block {@code p} of a YAML file, each problem reported at its own line. */
    public static ProcessModel fromNode(YamlNode p, Span pv, Span out) {
        if (!p.isMapping()) {
            throw new InputException(p.where() + "must be a mapping such as {model: fopdt, gain: 2, time_constant: 60 s,"
                    + " dead_time: 10 s}");
        }
        List<String> bad = p.unknownKeys(KEYS);
        if (!bad.isEmpty()) {
            throw new InputException(bad);
        }
        Map<String, YamlNode> pe = p.entries();
        Map<String, String> values = new java.util.LinkedHashMap<>();
        pe.forEach((k, v) -> values.put(k, v.isSequence() ? String.join(",", v.items().stream()
                .map(YamlNode::text).toList()) : v.text()));
        return read(values, pv, out, key -> (pe.containsKey(key) ? pe.get(key).where()
                : p.file() + ":" + p.line() + ": process." + key + ": "));
    }

    /**
     * Reads a process given on the command line ({@code option} names it in messages): an inline YAML
     * flow mapping such as {@code {model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}}, or
     * the path of a YAML file holding such a mapping (or a loop file's {@code process:} block).
     */
    public static ProcessModel fromOption(String text, String option, Span pv, Span out) {
        String trimmed = text.trim();
        YamlNode root;
        if (trimmed.startsWith("{")) {
            root = YamlSource.parse(trimmed, option);
        } else {
            java.nio.file.Path path = UserPath.of(trimmed, option, "an inline mapping or the path of a YAML file");
            if (!java.nio.file.Files.isRegularFile(path)) {
                throw new InputException(option + ": '" + trimmed + "' is neither an inline mapping such as {model: fopdt,"
                        + " gain: 2, time_constant: 60 s, dead_time: 10 s} nor a readable file");
            }
            root = YamlSource.read(path, trimmed);
        }
        if (root.isMapping() && root.get("process").isPresent()) {
            root = root.get("process").get();
        }
        return fromNode(root, pv, out);
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
        // every value is checked here, under the user's key, so that the model records' own checks
        // (which name Java fields) never see bad input
        return switch (model) {
            case "fopdt" -> new FirstOrderPlusDeadTime(gain(v, scale, where),
                    seconds(v, "time_constant", where, false), deadTime(v, where));
            case "sopdt" -> v.containsKey("damping") || v.containsKey("natural_frequency")
                    ? SecondOrderPlusDeadTime.ofNaturalFrequency(gain(v, scale, where),
                    positive(v, "damping", number(v, "damping", where), "", where),
                    positive(v, "natural_frequency", perSecond(v, "natural_frequency", where), " rad/s", where),
                    deadTime(v, where))
                    : SecondOrderPlusDeadTime.ofTimeConstants(gain(v, scale, where),
                    seconds(v, "time_constant", where, false), seconds(v, "time_constant_2", where, false),
                    deadTime(v, where));
            case "integrating" -> new IntegratingPlusDeadTime(gain(v, scale, where), deadTime(v, where),
                    v.containsKey("lag") ? seconds(v, "lag", where, true) : 0.0);
            case "tf" -> {
                double[] num = list(v, "num", where);
                double[] den = list(v, "den", where);
                for (int k = 0; k < num.length; k++) {
                    num[k] *= scale;
                }
                int numDegree = degree(num);
                int denDegree = degree(den);
                if (numDegree < 0) {
                    throw new InputException(where.apply("num") + "must not be all zeros (got " + v.get("num")
                            + "); a process with no gain cannot be controlled");
                }
                if (denDegree < 0) {
                    throw new InputException(where.apply("den") + "must not be all zeros (got " + v.get("den")
                            + "); list the denominator's coefficients, highest power of s first");
                }
                if (numDegree > denDegree) {
                    throw new InputException(where.apply("num") + "must not have a higher power of s than den (got "
                            + "degree " + numDegree + " over " + denDegree + "); a real process is proper: check the"
                            + " order of the coefficients, highest power first");
                }
                yield new GeneralTransferFunction(TransferFunction.ofDescending(num, den), deadTime(v, where));
            }
            case "" -> throw new InputException(where.apply("model") + "required; one of fopdt, sopdt, "
                    + "integrating, tf");
            default -> throw new InputException(where.apply("model") + "must be fopdt, sopdt, integrating or tf "
                    + "(got '" + model + "')");
        };
    }

    /** The degree of a polynomial given highest power first, or -1 when all its coefficients are zero. */
    private static int degree(double[] descending) {
        for (int k = 0; k < descending.length; k++) {
            if (descending[k] != 0.0) {
                return descending.length - 1 - k;
            }
        }
        return -1;
    }

    /** The process gain in %/% ({@code scale} turns an engineering-unit gain into %/%). */
    private static double gain(Map<String, String> v, double scale, java.util.function.Function<String, String> where) {
        double g = number(v, "gain", where) * scale;
        if (!Double.isFinite(g)) {
            throw new InputException(where.apply("gain") + "must be a finite gain in %/% (got '" + v.get("gain")
                    + "' scaled by the ranges to " + g + "); check the gain and the ranges");
        }
        if (g == 0.0) {
            throw new InputException(where.apply("gain") + "must not be zero (got '" + v.get("gain") + "'); a process"
                    + " the output does not move cannot be controlled: give its measured gain, with its sign");
        }
        return g;
    }

    private static double positive(Map<String, String> v, String key, double x, String unit,
                                   java.util.function.Function<String, String> where) {
        if (!(x > 0) || !Double.isFinite(x)) {
            throw new InputException(where.apply(key) + "must be finite and > 0" + unit + " (got '" + v.get(key)
                    + "')");
        }
        return x;
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
        if (!Double.isFinite(x)) {
            throw new InputException(where.apply(key) + "must be a finite number (got '" + s + "')");
        }
        if (key.equals("gain") && !Plausible.gain(x)) {
            throw new InputException(where.apply(key) + "must lie " + Plausible.gainRange() + " (got '" + s.trim()
                    + "'); check the value and its units");
        }
        return x;
    }

    /** A time in seconds, > 0 (or >= 0 when {@code zeroAllowed}), within {@link Plausible}'s limits. */
    private static double seconds(Map<String, String> v, String key, java.util.function.Function<String, String> where,
                                  boolean zeroAllowed) {
        String s = need(v, key, where);
        double x;
        try {
            x = Measure.parseSeconds(s, TimeUnit.SECONDS);
        } catch (UnitException e) {
            throw new InputException(where.apply(key) + e.getMessage());
        }
        if (!Double.isFinite(x) || x < 0 || x == 0 && !zeroAllowed) {
            throw new InputException(where.apply(key) + "must be a finite time " + (zeroAllowed ? ">= 0" : "> 0")
                    + " (got '" + s + "'); write it with its unit, e.g. 60 s or 1.5 min");
        }
        if (x != 0 && !Plausible.time(x)) {
            throw new InputException(where.apply(key) + (zeroAllowed ? "must be 0 or lie " : "must lie ")
                    + Plausible.timeRange() + " (got '" + s.trim() + "'); check the value and its unit");
        }
        return x;
    }

    private static double deadTime(Map<String, String> v, java.util.function.Function<String, String> where) {
        return v.containsKey("dead_time") ? seconds(v, "dead_time", where, true) : 0.0;
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
                double c = Double.parseDouble(part);
                if (!Double.isFinite(c)) {
                    throw new NumberFormatException(part);
                }
                out.add(c);
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
