package org.loopform.replay;

/**
 * What a record says of the old controller as listed: it reproduces the logged output, the record
 * does not confirm it (a partial match, a reading that explains the record clearly better, or a
 * record too quiet to tell controllers apart), the record refutes it, or there was nothing in
 * automatic to compare.
 */
public enum AsFoundVerdict {
    REPRODUCED("reproduced", "reproduced"),
    NOT_CONFIRMED("not_confirmed", "not confirmed"),
    REFUTED("refuted", "refuted"),
    NONE("none", "nothing to compare");

    private final String id;
    private final String words;

    AsFoundVerdict(String id, String words) {
        this.id = id;
        this.words = words;
    }

    /** The verdict as JSON and CSV give it: reproduced, not_confirmed, refuted, none. */
    public String id() {
        return id;
    }

    /** The verdict in plain words, for text. */
    public String words() {
        return words;
    }
}
