package org.loopform.report;

/** The cautions every report and help text carries. */
public final class Cautions {
    private Cautions() {
    }

    public static final String SHORT = "Caution: tuning changes can upset a process and hurt people. Review every"
            + " value under your site's management of change, try it in manual or in simulation first, and follow"
            + " site procedures, local codes and licensed engineering practice. Safety instrumented functions are"
            + " out of scope.";
}
