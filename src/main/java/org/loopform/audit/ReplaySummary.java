package org.loopform.audit;

import java.util.ArrayList;
import java.util.List;
import org.loopform.findings.Severity;

/**
 * What an audit's records showed, gathered as outcomes stream past: loops replayed and how their
 * as-found replay came out (reproduced, not confirmed, refuted, nothing in automatic to compare),
 * loops without a record (the first {@link #TAGS_KEPT} tags kept, the rest counted), new loops tuned
 * by rule whose record was not used (likewise), and records that could not be read (the first
 * {@link #PROBLEMS_KEPT} problems kept, the rest counted).
 */
public final class ReplaySummary {

    /** Tags without a record kept by name; later ones are only counted. */
    public static final int TAGS_KEPT = 50;
    /** Problems of unreadable records kept in full; later ones are only counted. */
    public static final int PROBLEMS_KEPT = 200;

    private final String recordsName;
    private int replayed;
    private int reproduced;
    private int notConfirmed;
    private int quiet;
    private int refuted;
    private int notCompared;
    private int explainedByAlternative;
    private int withoutRecord;
    private final List<String> withoutRecordTags = new ArrayList<>();
    private int unreadable;
    private int notUsed;
    private final List<String> notUsedTags = new ArrayList<>();
    private long problemCount;
    private final List<String> problems = new ArrayList<>();
    private List<String> unmatched = List.of();

    ReplaySummary(String recordsName) {
        this.recordsName = recordsName;
    }

    void add(ReplayEvidence e, String tag) {
        switch (e.status()) {
            case NO_RECORD -> {
                if (withoutRecord++ < TAGS_KEPT) {
                    withoutRecordTags.add(tag);
                }
            }
            case NOT_USED -> {
                if (notUsed++ < TAGS_KEPT) {
                    notUsedTags.add(tag);
                }
            }
            case UNREADABLE -> {
                unreadable++;
                for (String p : e.problems()) {
                    if (problemCount++ < PROBLEMS_KEPT) {
                        problems.add(p);
                    }
                }
            }
            case REPLAYED -> {
                replayed++;
                if (e.result().asFound() == null) {
                    notCompared++;
                } else if (e.result().asFoundSeverity() == Severity.INFO) {
                    reproduced++;
                } else {
                    if (e.result().asFoundSeverity() == Severity.FAIL) {
                        refuted++;
                    } else {
                        notConfirmed++;
                        if (e.result().quietRecord()) {
                            quiet++;
                        }
                    }
                    if (!e.result().explanations().isEmpty() && e.result().explanations().get(0).agreement().rmsPercent()
                            < e.result().asFound().rmsPercent()) {
                        explainedByAlternative++;
                    }
                }
            }
        }
    }

    void unmatched(List<String> records) {
        unmatched = List.copyOf(records);
    }

    /**
     * The records of the folder that match no loop of the list (named {@code FOLDER/NAME.csv}, in
     * name order): nothing was replayed from them. A folder holds few enough files to name each.
     */
    public List<String> unmatchedRecords() {
        return unmatched;
    }

    /** The records' folder as the user named it. */
    public String recordsName() {
        return recordsName;
    }

    public int replayed() {
        return replayed;
    }

    /** Replayed loops whose listed old controller reproduces the log. */
    public int reproduced() {
        return reproduced;
    }

    /**
     * Replayed loops whose record does not confirm the listed old controller (warn): it only partly
     * reproduces the log, another reading explains the log clearly better, or the record is too quiet.
     */
    public int notConfirmed() {
        return notConfirmed;
    }

    /**
     * Of the loops not confirmed, those whose record is too quiet to tell controllers apart (the
     * listed controller matches it, as any controller at rest would).
     */
    public int quiet() {
        return quiet;
    }

    /** Replayed loops whose record refutes the listed old controller (fail). */
    public int refuted() {
        return refuted;
    }

    /** Replayed loops whose record holds nothing in automatic to compare. */
    public int notCompared() {
        return notCompared;
    }

    /** Loops not reproduced for which another reading reproduces the log better. */
    public int explainedByAlternative() {
        return explainedByAlternative;
    }

    public int withoutRecord() {
        return withoutRecord;
    }

    /** The first {@link #TAGS_KEPT} tags without a record, in input order. */
    public List<String> withoutRecordTags() {
        return List.copyOf(withoutRecordTags);
    }

    /**
     * Loops tuned by rule (new loops) that have a record: no old controller ran, so the record was
     * not replayed (neither as-found validation nor as-left preview).
     */
    public int notUsed() {
        return notUsed;
    }

    /** The first {@link #TAGS_KEPT} loops tuned by rule whose record was not used, in input order. */
    public List<String> notUsedTags() {
        return List.copyOf(notUsedTags);
    }

    /** Loops whose record could not be read or replayed. */
    public int unreadable() {
        return unreadable;
    }

    /** Every problem of an unreadable record, counted. */
    public long problemCount() {
        return problemCount;
    }

    /** The first {@link #PROBLEMS_KEPT} problems of unreadable records, in input order. */
    public List<String> problems() {
        return List.copyOf(problems);
    }
}
