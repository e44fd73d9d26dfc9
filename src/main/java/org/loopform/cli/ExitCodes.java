package org.loopform.cli;

/**
 * loopform's exit codes (see DESIGN.md: 0 done, 1 a failing finding, 2 bad input; 3 a bug of loopform,
 * anything thrown that is not {@link org.loopform.units.BadInput}).
 */
final class ExitCodes {
    static final int OK = 0;
    static final int FAILED_FINDING = 1;
    static final int BAD_INPUT = 2;
    static final int INTERNAL_ERROR = 3;

    private ExitCodes() {
    }
}
