package org.loopform.form;

/** The unit labels loopform prints beside each parameter of a form. */
public final class FormUnits {
    private FormUnits() {
    }

    static String gainUnit(GainSpec gain) {
        if (gain.writing() == GainWriting.BAND) {
            return "%";
        }
        return gain.basis() == GainBasis.ENGINEERING ? "out/PV" : "%/%";
    }

    static String integralUnit(FormDefinition f) {
        return integralUnit(f.gain(), f.integral());
    }

    static String derivativeUnit(FormDefinition f) {
        return derivativeUnit(f.gain(), f.derivative());
    }

    static String integralUnit(GainSpec gain, IntegralSpec integral) {
        String t = integral.unit().symbol();
        boolean eu = gain.basis() == GainBasis.ENGINEERING;
        return switch (integral.writing()) {
            case TIME -> t + "/repeat";
            case RATE -> "repeats/" + t;
            case GAIN -> (eu ? "out/PV/" : "1/") + t;
            case PER_SCAN -> eu ? "out/PV per scan" : "per scan";
        };
    }

    static String derivativeUnit(GainSpec gain, DerivativeSpec derivative) {
        String t = derivative.unit().symbol();
        boolean eu = gain.basis() == GainBasis.ENGINEERING;
        return switch (derivative.writing()) {
            case TIME -> t;
            case GAIN -> eu ? "out*" + t + "/PV" : t;
            case PER_SCAN -> eu ? "out/PV scans" : "scans";
        };
    }

    /** The unit label of parameter {@code name} in form {@code f}. */
    public static String of(FormDefinition f, String name) {
        return f.parameters().stream().filter(p -> p.name().equals(name)).findFirst()
                .map(FormParameter::unit).orElse("");
    }
}
