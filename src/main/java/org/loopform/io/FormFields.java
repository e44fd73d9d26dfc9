package org.loopform.io;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.loopform.units.Measure;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;

/**
 * The scalar fields of a form file (text, choices, numbers, times, flags), each read with its
 * problem collected rather than thrown, so that one read reports every bad field with its line.
 * The section readers ({@link FormFileReader}, {@link FormWeightsReader}, {@link FormLimitsReader},
 * {@link FormAlgorithmReader}) share one instance per file.
 */
final class FormFields {

    /** Every problem found so far, each starting with {@code file:line: }. */
    final List<String> problems = new ArrayList<>();

    String requiredText(YamlNode root, Map<String, YamlNode> top, String key) {
        if (!top.containsKey(key)) {
            problems.add(root.file() + ":" + root.line() + ": " + key + ": required; add '" + key + ": ...'");
            return key.equals("id") ? "missing-id" : "missing";
        }
        return text(top.get(key));
    }

    <E extends Enum<E>> E missing(YamlNode root, String key, Class<E> type) {
        problems.add(root.file() + ":" + root.line() + ": " + key + ": required; one of " + names(type));
        return type.getEnumConstants()[0];
    }

    String text(YamlNode n) {
        try {
            return n.text();
        } catch (InputException e) {
            problems.add(e.getMessage());
            return "";
        }
    }

    <E extends Enum<E>> E choice(YamlNode n, Class<E> type, E fallback, String... allowed) {
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

    TimeUnit timeUnit(YamlNode n) {
        if (n == null) {
            return TimeUnit.SECONDS;
        }
        String t = text(n);
        return TimeUnit.parse(t).orElseGet(() -> {
            problems.add(n.where() + "must be a time unit: s, min or h (got '" + t + "')");
            return TimeUnit.SECONDS;
        });
    }

    double number(YamlNode n) {
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

    double seconds(YamlNode n) {
        String t = text(n);
        try {
            return Measure.parseSeconds(t, TimeUnit.SECONDS);
        } catch (UnitException e) {
            problems.add(n.where() + e.getMessage());
            return 0.0;
        }
    }

    boolean bool(YamlNode n) {
        String t = text(n).trim().toLowerCase(Locale.ROOT);
        if (t.equals("true") || t.equals("yes")) {
            return true;
        }
        if (!t.equals("false") && !t.equals("no")) {
            problems.add(n.where() + "must be true or false (got '" + t + "')");
        }
        return false;
    }
}
