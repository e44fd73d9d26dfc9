package org.loopform.audit;

/**
 * Who prepared, checked and approved a migration audit, under which change and revision. A blank
 * field is a line left to sign by hand on the printed report; none is ever required.
 */
public record SignOff(String preparedBy, String checkedBy, String approvedBy, String change, String revision) {

    /** Nothing filled in: every line is left blank to sign. */
    public static final SignOff BLANK = new SignOff("", "", "", "", "");

    public SignOff {
        preparedBy = clean(preparedBy);
        checkedBy = clean(checkedBy);
        approvedBy = clean(approvedBy);
        change = clean(change);
        revision = clean(revision);
    }

    private static String clean(String s) {
        return s == null ? "" : s.strip();
    }

    /** This sign-off with every field {@code other} fills in taking its place (options over a file). */
    public SignOff overriddenBy(SignOff other) {
        return new SignOff(pick(other.preparedBy, preparedBy), pick(other.checkedBy, checkedBy),
                pick(other.approvedBy, approvedBy), pick(other.change, change), pick(other.revision, revision));
    }

    private static String pick(String first, String second) {
        return first.isEmpty() ? second : first;
    }
}
