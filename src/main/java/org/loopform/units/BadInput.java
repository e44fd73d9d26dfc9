package org.loopform.units;

import java.util.List;

/**
 * Input that loopform cannot use as it is: the one error type for bad input. It alone becomes exit 2
 * (or a bad row of an audit); any other exception is a bug in loopform. It is deliberately not an
 * {@link IllegalArgumentException}, which a bug can throw too.
 *
 * <p>Each problem is written as {@code file:line: field: expected (got found); fix.}, with the user's
 * key as the field, never a Java name. A problem made with {@link #of} also keeps its parts; one made
 * from text (readers that already composed the line) keeps only the text, and its parts are null.
 * It lives in {@code units}, the package every other package may use, so that no domain package
 * needs another to report bad input.
 */
public class BadInput extends RuntimeException {

    private final List<String> problems;
    private final String file;
    private final Integer line;
    private final String field;
    private final String found;
    private final String expected;
    private final String fix;

    /** One problem, already written as a line. */
    public BadInput(String problem) {
        this(List.of(problem));
    }

    /** Several problems at once, one a line in the message. */
    public BadInput(List<String> problems) {
        super(String.join(System.lineSeparator(), requireSome(problems)));
        this.problems = List.copyOf(problems);
        this.file = null;
        this.line = null;
        this.field = null;
        this.found = null;
        this.expected = null;
        this.fix = null;
    }

    private BadInput(String file, Integer line, String field, String expected, String found, String fix) {
        super(format(file, line, field, expected, found, fix));
        this.problems = List.of(getMessage());
        this.file = file;
        this.line = line;
        this.field = field;
        this.found = found;
        this.expected = expected;
        this.fix = fix;
    }

    /**
     * One problem from its parts: {@code file:line: field: expected (got found); fix.} Any part but
     * {@code expected} may be null and is then left out.
     *
     * @param file     the file as the user named it, or null
     * @param line     its 1-based line, or null
     * @param field    the user's key (a column, a YAML key, an option such as {@code --scan}), or null
     * @param expected what a good value looks like, e.g. {@code must be > 0 s}
     * @param found    what was given, as the user wrote it, or null
     * @param fix      how to put it right, or null
     */
    public static BadInput of(String file, Integer line, String field, String expected, String found, String fix) {
        if (expected == null || expected.isBlank()) {
            throw new IllegalArgumentException("a bad-input problem must say what was expected");
        }
        return new BadInput(file, line, field, expected, found, fix);
    }

    private static List<String> requireSome(List<String> problems) {
        if (problems == null || problems.isEmpty()) {
            throw new IllegalArgumentException("bad input needs at least one problem");
        }
        return problems;
    }

    private static String format(String file, Integer line, String field, String expected, String found,
                                 String fix) {
        StringBuilder b = new StringBuilder();
        if (file != null) {
            b.append(file);
            if (line != null) {
                b.append(':').append(line);
            }
            b.append(": ");
        }
        if (field != null) {
            b.append(field).append(": ");
        }
        b.append(expected);
        if (found != null) {
            b.append(" (got ").append(found).append(')');
        }
        if (fix != null) {
            b.append("; ").append(fix);
        }
        if (fix != null && !fix.endsWith(".")) {
            b.append('.');
        }
        return b.toString();
    }

    /** Each problem on its own (one for most). */
    public List<String> problems() {
        return problems;
    }

    /** The file as the user named it, or null when unknown or when made from text. */
    public String file() {
        return file;
    }

    /** The 1-based line in {@link #file()}, or null. */
    public Integer line() {
        return line;
    }

    /** The user's key, or null. */
    public String field() {
        return field;
    }

    /** What was given, or null. */
    public String found() {
        return found;
    }

    /** What a good value looks like, or null when made from text. */
    public String expected() {
        return expected;
    }

    /** How to put it right, or null. */
    public String fix() {
        return fix;
    }
}
