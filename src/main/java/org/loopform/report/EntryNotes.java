package org.loopform.report;

import java.util.List;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;

/**
 * The entry sheet's notes for a loop that fails: the technician reads the sheet, not the report, so
 * each row of such a loop says which finding stops it and that nothing of it is to be typed in.
 */
final class EntryNotes {

    /** A short reason longer than this is cut at a word, with an ellipsis. */
    private static final int MAX_REASON_CHARS = 160;
    /** A clause break before this many characters is too early to carry a reason ("As found: ..."). */
    private static final int MIN_REASON_CHARS = 20;

    private EntryNotes() {
    }

    /**
     * {@code "loop fails: TOPIC - REASON; do not enter until resolved"} for the worst finding of a
     * failing loop (a stability failure first, as the most dangerous, otherwise the first failing
     * finding in the check's order), naming the other failing topics after it.
     */
    static String loopFails(List<Finding> findings) {
        List<Finding> failing = findings.stream().filter(f -> f.severity() == Severity.FAIL).toList();
        if (failing.isEmpty()) {
            return "loop fails; do not enter until resolved";
        }
        Finding worst = failing.stream().filter(f -> f.topic() == Topic.STABILITY).findFirst().orElse(failing.get(0));
        List<String> others = failing.stream().map(f -> f.topic().id()).filter(t -> !t.equals(worst.topic().id()))
                .distinct().toList();
        return "loop fails: " + worst.topic().id() + " - " + shortReason(worst.message())
                + (others.isEmpty() ? "" : " (also fails: " + String.join(", ", others) + ")")
                + "; do not enter until resolved";
    }

    /**
     * The message's first clause: up to the first {@code ". "}, {@code "; "} or {@code ": "} outside
     * parentheses that comes after {@value #MIN_REASON_CHARS} characters, cut at
     * {@value #MAX_REASON_CHARS}.
     */
    static String shortReason(String message) {
        String m = message.strip();
        int depth = 0;
        int end = m.length();
        for (int i = 0; i + 1 < m.length(); i++) {
            char ch = m.charAt(i);
            if (ch == '(') {
                depth++;
            } else if (ch == ')') {
                depth = Math.max(0, depth - 1);
            } else if (depth == 0 && i >= MIN_REASON_CHARS && (ch == '.' || ch == ';' || ch == ':')
                    && m.charAt(i + 1) == ' ') {
                end = i;
                break;
            }
        }
        String reason = m.substring(0, end);
        if (reason.endsWith(".")) {
            reason = reason.substring(0, reason.length() - 1);
        }
        if (reason.length() > MAX_REASON_CHARS) {
            int cut = reason.lastIndexOf(' ', MAX_REASON_CHARS);
            reason = reason.substring(0, cut > 0 ? cut : MAX_REASON_CHARS) + "...";
        }
        return reason;
    }

    /** The non-empty parts joined with {@code "; "}. */
    static String join(String first, String second) {
        return first.isEmpty() ? second : second.isEmpty() ? first : first + "; " + second;
    }
}
