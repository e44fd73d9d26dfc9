package org.loopform.replay;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.loopform.form.Action;
import org.loopform.form.FilterKind;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.GainBasis;
import org.loopform.form.GainWriting;
import org.loopform.form.IntegralWriting;
import org.loopform.form.PidSetting;
import org.loopform.form.SignConvention;
import org.loopform.form.Structure;
import org.loopform.form.WritingContext;
import org.loopform.units.BadInput;
import org.loopform.units.Numbers;
import org.loopform.units.TimeUnit;

/**
 * The mistakes a loop list most often holds about an old controller, each as an alternative
 * reading of the same written values (common practice in migrations): integral or derivative
 * time read in the other unit (minutes for seconds), a reset rate read as a time per repeat or the
 * other way round, a proportional band read as a gain or the other way round, the opposite
 * action, the derivative filter missing or added, another scan time, and the same numbers written
 * in another catalog form (another structure, units or algorithm). Readings that cannot be decoded
 * are skipped; readings that run the same controller as an earlier one are dropped, so the
 * simplest explanation keeps its place.
 */
final class CandidateSearch {

    /** Scan times tried, as factors of the listed one. */
    static final double[] SCAN_FACTORS = {0.5, 2, 0.2, 5, 0.1, 10};

    private final FormDefinition form;
    private final Map<String, String> written;
    private final WritingContext ctx;
    private final double scanSeconds;
    private final List<Candidate> out = new ArrayList<>();

    private CandidateSearch(FormDefinition form, Map<String, String> written, WritingContext ctx, double scanSeconds) {
        this.form = form;
        this.written = lowerKeys(written);
        this.ctx = ctx;
        this.scanSeconds = scanSeconds;
    }

    /** The alternatives to the listed reading {@code written} in {@code form} at {@code scanSeconds}. */
    static List<Candidate> alternatives(FormDefinition form, Map<String, String> written, WritingContext ctx,
                                        double scanSeconds, List<FormDefinition> catalog) {
        CandidateSearch s = new CandidateSearch(form, written, ctx, scanSeconds);
        Candidate listed = s.decode(ExplanationKind.FORM, "as listed", form, s.written, scanSeconds);
        s.units();
        s.action();
        s.filter();
        s.scans();
        for (FormDefinition other : catalog) {
            if (!other.id().equals(form.id())) {
                s.inForm(other);
            }
        }
        List<Candidate> kept = new ArrayList<>();
        for (Candidate c : s.out) {
            boolean seen = listed != null && c.sameControllerAs(listed);
            for (Candidate k : kept) {
                seen |= c.sameControllerAs(k);
            }
            if (!seen) {
                kept.add(c);
            }
        }
        return kept;
    }

    /**
     * Pairs of mistakes, tried when no single one reproduces the log: each single reading of
     * {@code singles} (any kind) combined with each units, action, filter and scan reading of its
     * own values (common practice: a list typed from an old console can hold two independent
     * mistakes, such as minutes taken for seconds and the action flag lost). A pair that runs the
     * same controller as the listed one, a single reading or an earlier pair is dropped, so the
     * simplest explanation keeps its place; two scan changes are not combined.
     */
    static List<Candidate> pairs(Candidate listed, List<Candidate> singles, WritingContext ctx) {
        List<Candidate> out = new ArrayList<>();
        for (Candidate first : singles) {
            CandidateSearch s = new CandidateSearch(first.form(), first.tuning(), ctx, first.scanSeconds());
            s.units();
            s.action();
            s.filter();
            if (first.kind() != ExplanationKind.SCAN) {
                s.scans();
            }
            for (Candidate second : s.out) {
                Candidate pair = new Candidate(ExplanationKind.COMBINED, first.description() + " and "
                        + second.description(), second.form(), second.tuning(), second.setting(), second.scanSeconds());
                boolean seen = listed != null && pair.sameControllerAs(listed);
                for (Candidate c : singles) {
                    seen |= pair.sameControllerAs(c);
                }
                for (Candidate c : out) {
                    seen |= pair.sameControllerAs(c);
                }
                if (!seen) {
                    out.add(pair);
                }
            }
        }
        return out;
    }

    /** The listed reading itself, decoded, or null when it cannot be. */
    static Candidate listed(FormDefinition form, Map<String, String> written, WritingContext ctx, double scanSeconds) {
        CandidateSearch s = new CandidateSearch(form, written, ctx, scanSeconds);
        return s.decode(ExplanationKind.FORM, "as listed", form, s.written, scanSeconds);
    }

    private void units() {
        String i = form.integralName();
        String d = form.derivativeName();
        Double iv = number(i);
        Double dv = number(d);
        boolean parallel = form.structure() == Structure.PARALLEL;
        Double iOther = null;
        TimeUnit iUnit = form.integral().unit();
        TimeUnit iSwap = swap(iUnit);
        if (iv != null && iv > 0 && !form.integral().isOff(iv) && iSwap != null
                && form.integral().writing() != IntegralWriting.PER_SCAN) {
            double factor = form.integral().writing() == IntegralWriting.TIME ? iSwap.seconds() / iUnit.seconds()
                    : iUnit.seconds() / iSwap.seconds();
            iOther = iv * factor;
            add(ExplanationKind.UNITS, i + " is " + shown(iv) + " " + unitText(form.integral().writing(), iSwap)
                    + ", not " + unitText(form.integral().writing(), iUnit), with(i, iOther));
        }
        Double dOther = null;
        TimeUnit dUnit = form.derivative().unit();
        TimeUnit dSwap = swap(dUnit);
        if (dv != null && dv > 0 && dSwap != null && form.derivative().writing() != org.loopform.form.DerivativeWriting.PER_SCAN) {
            dOther = dv * dSwap.seconds() / dUnit.seconds();
            add(ExplanationKind.UNITS, d + " is " + shown(dv) + " " + dSwap.symbol() + ", not " + dUnit.symbol(),
                    with(d, dOther));
        }
        if (iOther != null && dOther != null) {
            Map<String, String> both = with(i, iOther);
            both.put(d, plain(dOther));
            add(ExplanationKind.UNITS, i + " and " + d + " are in " + iSwap.symbol() + ", not " + iUnit.symbol(), both);
        }
        IntegralWriting w = form.integral().writing();
        if (iv != null && iv > 0 && !form.integral().isOff(iv) && !parallel
                && (w == IntegralWriting.TIME || w == IntegralWriting.RATE)) {
            String unit = iUnit.symbol();
            add(ExplanationKind.UNITS, w == IntegralWriting.TIME
                    ? i + " " + shown(iv) + " is a reset rate in repeats per " + unit + ", not " + unit + " per repeat"
                    : i + " " + shown(iv) + " is a time in " + unit + " per repeat, not repeats per " + unit,
                    with(i, 1.0 / iv));
        }
        String g = form.gainName();
        Double gv = number(g);
        if (gv != null && gv != 0 && form.gain().basis() == GainBasis.PERCENT) {
            add(ExplanationKind.UNITS, form.gain().writing() == GainWriting.BAND
                    ? g + " " + shown(gv) + " is a gain, not a proportional band in %"
                    : g + " " + shown(gv) + " is a proportional band in %, not a gain", with(g, 100.0 / gv));
        }
    }

    private void action() {
        if (form.gain().sign() == SignConvention.ACTION) {
            Action listed = written.containsKey("action")
                    ? Action.parse(written.get("action")).orElse(Action.REVERSE) : Action.REVERSE;
            Action other = listed == Action.REVERSE ? Action.DIRECT : Action.REVERSE;
            Map<String, String> m = new LinkedHashMap<>(written);
            m.put("action", other.id());
            add(ExplanationKind.ACTION, other.id() + " action, not " + listed.id(), m);
        } else {
            Double gv = number(form.gainName());
            if (gv != null && gv != 0) {
                add(ExplanationKind.ACTION, "the opposite action (" + form.gainName() + " " + shown(-gv) + ")",
                        with(form.gainName(), -gv));
            }
        }
    }

    private void filter() {
        Double dv = number(form.derivativeName());
        if (dv == null || dv == 0) {
            return;
        }
        if (form.filter().kind() == FilterKind.RATIO) {
            String n = written.get("n");
            Map<String, String> m = new LinkedHashMap<>(written);
            boolean off = n != null && (n.trim().equalsIgnoreCase(FormCodec.OFF) || parseOr(n, -1) == 0);
            if (off) {
                m.remove("n");
                add(ExplanationKind.FILTER, "a derivative filter N = " + shown(form.filter().ratio())
                        + " (the form's default), not none", m);
            } else {
                m.put("n", FormCodec.OFF);
                add(ExplanationKind.FILTER, "no derivative filter (n=off), not N = "
                        + (n == null ? shown(form.filter().ratio()) : n), m);
            }
        } else if (form.filter().kind() == FilterKind.TIME_CONSTANT) {
            Map<String, String> m = new LinkedHashMap<>(written);
            m.put("tf", FormCodec.OFF);
            add(ExplanationKind.FILTER, "no derivative filter (tf=off)", m);
        }
    }

    private void scans() {
        for (double f : SCAN_FACTORS) {
            double h = scanSeconds * f;
            Candidate c = decode(ExplanationKind.SCAN, "scan " + shown(h) + " s, not " + shown(scanSeconds) + " s",
                    form, written, h);
            if (c != null) {
                out.add(c);
            }
        }
    }

    /** The same numbers by role in {@code other}: gain, integral and derivative values, filter, weights, action. */
    private void inForm(FormDefinition other) {
        Map<String, String> m = new LinkedHashMap<>();
        String gain = written.get(form.gainName());
        if (gain == null) {
            return;
        }
        boolean direct = written.containsKey("action")
                && Action.parse(written.get("action")).orElse(Action.REVERSE) == Action.DIRECT;
        double gv = parseOr(gain, Double.NaN);
        if (other.gain().sign() == SignConvention.ACTION) {
            if (gv < 0) {
                direct = true;
                gain = plain(-gv);
            }
            m.put(other.gainName(), gain);
            m.put("action", direct ? Action.DIRECT.id() : Action.REVERSE.id());
        } else {
            m.put(other.gainName(), direct && gv > 0 ? plain(-gv) : gain);
        }
        m.put(other.integralName(), written.getOrDefault(form.integralName(), "0"));
        m.put(other.derivativeName(), written.getOrDefault(form.derivativeName(), "0"));
        for (String extra : List.of("n", "tf", "b", "c")) {
            if (written.containsKey(extra) && other.parameterNames().contains(extra)) {
                m.put(extra, written.get(extra));
            }
        }
        add(ExplanationKind.FORM, "form " + other.id() + " (" + other.title() + ")", other, m, scanSeconds);
    }

    private void add(ExplanationKind kind, String description, Map<String, String> values) {
        add(kind, description, form, values, scanSeconds);
    }

    private void add(ExplanationKind kind, String description, FormDefinition f, Map<String, String> values,
                     double h) {
        Candidate c = decode(kind, description, f, values, h);
        if (c != null) {
            out.add(c);
        }
    }

    /** The candidate, or null when its values cannot be read in {@code f} (the reading is then not a candidate). */
    private Candidate decode(ExplanationKind kind, String description, FormDefinition f, Map<String, String> values,
                             double h) {
        try {
            WritingContext c = new WritingContext(ctx.pvRange(), ctx.outputRange(), h);
            PidSetting s = FormCodec.decode(f, values, c, "source");
            return new Candidate(kind, description, f, values, s, h);
        } catch (BadInput | IllegalArgumentException e) {
            return null;
        }
    }

    private Map<String, String> with(String name, double value) {
        Map<String, String> m = new LinkedHashMap<>(written);
        m.put(name, plain(value));
        return m;
    }

    private Double number(String name) {
        String v = written.get(name);
        if (v == null) {
            return null;
        }
        double x = parseOr(v, Double.NaN);
        return Double.isFinite(x) ? x : null;
    }

    private static double parseOr(String text, double fallback) {
        try {
            return Double.parseDouble(text.trim());
        } catch (NumberFormatException e) {
            return fallback;
        }
    }

    private static TimeUnit swap(TimeUnit u) {
        return switch (u) {
            case SECONDS -> TimeUnit.MINUTES;
            case MINUTES -> TimeUnit.SECONDS;
            case HOURS -> null;
        };
    }

    private static String unitText(IntegralWriting w, TimeUnit u) {
        return w == IntegralWriting.TIME ? u.symbol() : "per " + u.symbol();
    }

    private static Map<String, String> lowerKeys(Map<String, String> m) {
        Map<String, String> out = new LinkedHashMap<>();
        m.forEach((k, v) -> out.put(k.trim().toLowerCase(Locale.ROOT), v));
        return out;
    }

    /**
     * A value as a description shows it: six significant digits, as the rest of the report (the
     * reading itself keeps twelve, {@link #plain}).
     */
    private static String shown(double v) {
        return Numbers.significant(v, 6);
    }

    /** Twelve significant digits, so a reading survives its text (the written values are decoded again). */
    private static String plain(double v) {
        return Numbers.plain(Double.parseDouble(String.format(Locale.ROOT, "%.12g", v)));
    }
}
