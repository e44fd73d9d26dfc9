package org.loopform.audit;

import org.loopform.check.Verdict;
import org.loopform.check.CheckResult;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;

/**
 * The audit's counts, gathered as results stream past: loops by verdict, findings by topic and
 * severity, bad rows, and the worst loops (kept to {@link #WORST_KEPT}) and the first bad-row problems
 * (kept to {@link #BAD_ROW_PROBLEMS_KEPT}, the rest counted), so memory stays bounded however many
 * loops and bad rows stream past.
 */
public final class AuditSummary {

    /** How many of the worst loops the summary keeps, worst first. */
    public static final int WORST_KEPT = 25;

    /** How many bad-row problems the summary keeps in full, in input order; later ones are only counted. */
    public static final int BAD_ROW_PROBLEMS_KEPT = 200;

    /** One of the worst loops: tag, verdict, counts of fail and warn findings, and its worst finding's words. */
    public record Worst(int index, String tag, Verdict verdict, int fails, int warns, String headline,
                        int headlineWeight) {
    }

    /**
     * How much a topic says about how the loop will behave, for ranking within a severity: what
     * threatens the loop itself first (stability, scan, derivative), what changes the law less last.
     */
    static int weight(Topic t) {
        return switch (t) {
            case STABILITY -> 11;
            case ACTION, REPLAY -> 10;
            case ROBUSTNESS -> 9;
            case LIMITS -> 8;
            case SAMPLING -> 7;
            case DERIVATIVE -> 6;
            case DISCRETIZATION, RESPONSE -> 5;
            case WINDUP -> 4;
            case ROUNDING -> 3;
            case REALIZABILITY -> 2;
            case FILTER -> 1;
            case UNITS -> 0;
        };
    }

    private final Map<Verdict, Integer> byVerdict = new EnumMap<>(Verdict.class);
    private final Map<Topic, int[]> byTopic = new TreeMap<>();
    private final List<Worst> worst = new ArrayList<>();
    private final List<String> badRows = new ArrayList<>();
    /** Each distinct assumption with the number of loops it was made for, in first-seen order. */
    private final Map<String, Integer> assumptions = new java.util.LinkedHashMap<>();
    private int loops;
    /** What the records showed; null for an audit without records. */
    private final ReplaySummary replay;
    private int exact;
    /** Checked loops without a process model (only the conversion and the sampling rules), and those of them that pass. */
    private int withoutProcess;
    private int passWithoutProcess;
    private int badRowCount;
    private long badRowProblemCount;

    private static final Comparator<Worst> WORST_FIRST = Comparator.comparing(Worst::verdict).reversed()
            .thenComparing(Comparator.comparingInt(Worst::fails).reversed())
            .thenComparing(Comparator.comparingInt(Worst::headlineWeight).reversed())
            .thenComparing(Comparator.comparingInt(Worst::warns).reversed())
            .thenComparingInt(Worst::index);

    /** The summary of an audit without records. */
    public AuditSummary() {
        this(null);
    }

    /** The summary of an audit given the records in {@code recordsName} (null: none). */
    public AuditSummary(String recordsName) {
        this.replay = recordsName == null ? null : new ReplaySummary(recordsName);
    }

    /** What the records showed, or null when the audit had none. */
    public ReplaySummary replay() {
        return replay;
    }

    public void add(LoopOutcome o) {
        loops++;
        if (replay != null && o.replay() != null) {
            replay.add(o.replay(), o.row().tag());
        }
        if (!o.ok()) {
            badRowCount++;
            for (String p : o.problems()) {
                if (badRowProblemCount++ < BAD_ROW_PROBLEMS_KEPT) {
                    badRows.add(p);
                }
            }
            return;
        }
        CheckResult r = o.result();
        byVerdict.merge(r.verdict(), 1, Integer::sum);
        r.conversion().assumptions().forEach(a -> assumptions.merge(a, 1, Integer::sum));
        if (r.conversion().exact()) {
            exact++;
        }
        if (!r.hasProcess()) {
            withoutProcess++;
            if (r.verdict() == Verdict.PASS) {
                passWithoutProcess++;
            }
        }
        int fails = 0;
        int warns = 0;
        Finding headline = null;
        for (Finding f : r.findings()) {
            int[] c = byTopic.computeIfAbsent(f.topic(), t -> new int[Severity.values().length]);
            c[f.severity().ordinal()]++;
            if (f.severity() == Severity.FAIL) {
                fails++;
            } else if (f.severity() == Severity.WARN) {
                warns++;
            }
            if (headline == null || f.severity().compareTo(headline.severity()) > 0
                    || f.severity() == headline.severity() && weight(f.topic()) > weight(headline.topic())) {
                headline = f;
            }
        }
        if (r.verdict() != Verdict.PASS) {
            worst.add(new Worst(o.row().index(), r.loop().tag(), r.verdict(), fails, warns,
                    headline == null ? "" : headline.topic().id() + ": " + headline.message(),
                    headline == null ? 0 : weight(headline.topic())));
            worst.sort(WORST_FIRST);
            if (worst.size() > WORST_KEPT) {
                worst.remove(worst.size() - 1);
            }
        }
    }

    public int loops() {
        return loops;
    }

    public int checked() {
        return loops - badRowCount();
    }

    public int exactConversions() {
        return exact;
    }

    /** Checked loops without a process model: their stability, margins and responses were not checked. */
    public int withoutProcess() {
        return withoutProcess;
    }

    /** Of {@link #withoutProcess()}, those whose verdict is pass: a pass on the conversion and sampling alone. */
    public int passWithoutProcess() {
        return passWithoutProcess;
    }

    public int count(Verdict v) {
        return byVerdict.getOrDefault(v, 0);
    }

    /** Findings by topic: counts indexed by {@link Severity#ordinal()}. */
    public Map<Topic, int[]> byTopic() {
        Map<Topic, int[]> m = new TreeMap<>();
        byTopic.forEach((k, v) -> m.put(k, v.clone()));
        return m;
    }

    public List<Worst> worst() {
        return List.copyOf(worst);
    }

    /**
     * What was assumed where the loop list did not say it, each stated once with the number of
     * loops it applies to (the same source form gives the same words), in first-seen order.
     */
    public Map<String, Integer> assumptions() {
        return java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(assumptions));
    }

    /** The first {@link #BAD_ROW_PROBLEMS_KEPT} bad-row problems, in input order. */
    public List<String> badRows() {
        return List.copyOf(badRows);
    }

    /** Every bad-row problem counted, kept or not. */
    public long badRowProblemCount() {
        return badRowProblemCount;
    }

    /** Rows that could not be read or checked. */
    public int badRowCount() {
        return badRowCount;
    }

    /** The worst verdict over all loops (FAIL also when a row was bad). */
    public Verdict worstVerdict() {
        if (count(Verdict.FAIL) > 0) {
            return Verdict.FAIL;
        }
        return count(Verdict.WARN) > 0 ? Verdict.WARN : Verdict.PASS;
    }
}
