package org.loopform.units;

import java.util.Optional;

/**
 * Reads the unit text a person types after a controller setting ({@link Measure#unit()}, trimmed
 * and lower case, spaces taken out here): a time per repeat ({@code s/repeat}, {@code min/rep}),
 * a rate per time ({@code /min}, {@code 1/min}, {@code repeats/min}, {@code r/min}, {@code rpm}),
 * a count per scan ({@code /scan}), a number of scans ({@code scans}) and percentages
 * ({@code %}, {@code %/%}). The spellings are common practice; what the value then means is the
 * form's business.
 */
public final class UnitText {

    private UnitText() {
    }

    /** The unit without spaces, as compared here: {@code "repeats / min"} becomes {@code "repeats/min"}. */
    public static String compact(String unit) {
        return unit.replace(" ", "");
    }

    /** A time, optionally per repeat: {@code s}, {@code min/repeat}, {@code s/rep}, {@code minperrepeat}. */
    public static Optional<TimeUnit> timePerRepeat(String unit) {
        String u = compact(unit);
        for (String suffix : new String[] {"/repeat", "/rep", "perrepeat"}) {
            if (u.endsWith(suffix)) {
                u = u.substring(0, u.length() - suffix.length());
                break;
            }
        }
        return TimeUnit.parse(u);
    }

    /** A plain time: {@code s}, {@code min}, {@code h} and their words. */
    public static Optional<TimeUnit> time(String unit) {
        return TimeUnit.parse(compact(unit));
    }

    /** A "per time" unit: {@code /min}, {@code 1/min}, {@code repeats/min}, {@code r/min}, {@code rpm}, {@code /s}, {@code /h}. */
    public static Optional<TimeUnit> perTime(String unit) {
        String u = compact(unit);
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

    /** A count per scan: {@code /scan} or {@code per scan}. */
    public static boolean perScan(String unit) {
        String u = compact(unit);
        return u.equals("/scan") || u.equals("perscan");
    }

    /** A number of scans: {@code scans} or {@code scan}. */
    public static boolean scans(String unit) {
        String u = compact(unit);
        return u.equals("scans") || u.equals("scan");
    }

    /** Percent: {@code %}. */
    public static boolean percent(String unit) {
        return compact(unit).equals("%");
    }

    /** Percent per percent: {@code %/%}. */
    public static boolean percentPerPercent(String unit) {
        return compact(unit).equals("%/%");
    }
}
