package org.loopform.process;

/** Argument checks shared by the process model records; messages carry the offending value. */
final class Require {

    private Require() {
    }

    static void finiteNonZero(String model, String name, double value) {
        if (!Double.isFinite(value) || value == 0.0) {
            throw new IllegalArgumentException(
                    model + ": " + name + " must be finite and non-zero (got " + value + ")");
        }
    }

    static void positive(String model, String name, double value, String unit) {
        if (!Double.isFinite(value) || value <= 0.0) {
            throw new IllegalArgumentException(
                    model + ": " + name + " must be finite and > 0" + unit + " (got " + value + ")");
        }
    }

    static void nonNegative(String model, String name, double value, String unit) {
        if (!Double.isFinite(value) || value < 0.0) {
            throw new IllegalArgumentException(
                    model + ": " + name + " must be finite and >= 0" + unit + " (got " + value + ")");
        }
    }
}
