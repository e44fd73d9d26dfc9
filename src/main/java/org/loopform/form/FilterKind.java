package org.loopform.form;

import java.util.Optional;
import java.util.OptionalDouble;
import org.loopform.units.UnitText;

/**
 * What a form lets the user set of its derivative filter, and how that setting is written: the
 * parameter's name (if any), how the written value gives the filter time constant Tf and how Tf
 * is written back. Tf = Td / N for a ratio N (common practice).
 */
public enum FilterKind {
    /** No derivative filter. */
    NONE(null, null) {
        @Override
        double filterSeconds(FilterSpec spec, double derivativeTimeSeconds, Written written) {
            return 0.0;
        }

        @Override
        OptionalDouble write(FilterSpec spec, double derivativeTimeSeconds, double filterSeconds) {
            return OptionalDouble.empty();
        }
    },
    /** A ratio N fixed by the vendor: Tf = Td / N. */
    FIXED_RATIO(null, null) {
        @Override
        double filterSeconds(FilterSpec spec, double derivativeTimeSeconds, Written written) {
            return derivativeTimeSeconds / spec.ratio();
        }

        @Override
        OptionalDouble write(FilterSpec spec, double derivativeTimeSeconds, double filterSeconds) {
            return OptionalDouble.empty();
        }
    },
    /** An adjustable ratio N (parameter {@code n}) with a default: Tf = Td / N. */
    RATIO("n", "derivative filter ratio, Tf = Td/N") {
        @Override
        String unit(FilterSpec spec) {
            return "ratio";
        }

        @Override
        double defaultValue(FilterSpec spec) {
            return spec.ratio();
        }

        @Override
        double filterSeconds(FilterSpec spec, double derivativeTimeSeconds, Written written) {
            if (written.given() && written.off()) {
                return 0.0;
            }
            double n = written.given() ? written.number((u, x) -> Optional.empty(), "; write a bare number")
                    : spec.ratio();
            if (!(n > 0)) {
                throw new FormException("n: the derivative filter ratio must be > 0 (got " + n + "); typical values"
                        + " are 8 to 20, or write n=off for a derivative without a filter");
            }
            return derivativeTimeSeconds / n;
        }

        /** n = 0 stands for "off" (no filter) in a written tuning; it is printed and read back as "off". */
        @Override
        OptionalDouble write(FilterSpec spec, double derivativeTimeSeconds, double filterSeconds) {
            double td = derivativeTimeSeconds;
            return OptionalDouble.of(filterSeconds > 0 && td > 0 ? td / filterSeconds
                    : td > 0 ? FormCodec.FILTER_OFF : spec.ratio());
        }
    },
    /** An adjustable filter time constant Tf (parameter {@code tf}), in the form's unit with a default. */
    TIME_CONSTANT("tf", "derivative filter time constant") {
        @Override
        String unit(FilterSpec spec) {
            return spec.unit().symbol();
        }

        @Override
        double defaultValue(FilterSpec spec) {
            return spec.defaultTime();
        }

        @Override
        double filterSeconds(FilterSpec spec, double derivativeTimeSeconds, Written written) {
            double t = written.given() ? (written.off() ? 0.0 : written.number((u, x) -> UnitText.time(u).map(
                    tu -> spec.unit().fromSeconds(tu.toSeconds(x))), DerivativeWriting.TIME.unitHint()))
                    : spec.defaultTime();
            if (t < 0) {
                throw new FormException("tf: the filter time constant must be >= 0 (got " + t + ")");
            }
            return spec.unit().toSeconds(t);
        }

        @Override
        OptionalDouble write(FilterSpec spec, double derivativeTimeSeconds, double filterSeconds) {
            return OptionalDouble.of(spec.unit().fromSeconds(filterSeconds));
        }
    };

    private final String parameter;
    private final String meaning;

    FilterKind(String parameter, String meaning) {
        this.parameter = parameter;
        this.meaning = meaning;
    }

    /** The parameter a person writes the filter with ({@code n}, {@code tf}); empty when the form fixes the filter. */
    public Optional<String> parameter() {
        return Optional.ofNullable(parameter);
    }

    /** The optional parameter a form with filter {@code spec} lists for it; empty when the form fixes the filter. */
    Optional<FormParameter> formParameter(FilterSpec spec) {
        return parameter().map(name -> new FormParameter(name, unit(spec), meaning, false, defaultValue(spec)));
    }

    /** The unit text of the filter parameter (only asked of a kind that has one). */
    String unit(FilterSpec spec) {
        throw new IllegalStateException(this + " has no filter parameter");
    }

    /** The filter parameter's default, in its unit (only asked of a kind that has one). */
    double defaultValue(FilterSpec spec) {
        throw new IllegalStateException(this + " has no filter parameter");
    }

    /**
     * The filter time constant Tf, s, of a form with filter {@code spec} and derivative time
     * {@code derivativeTimeSeconds}, from the filter parameter as {@code written} (or its default).
     */
    abstract double filterSeconds(FilterSpec spec, double derivativeTimeSeconds, Written written);

    /** The value written for the filter parameter of a setting with Tf = {@code filterSeconds}; empty without one. */
    abstract OptionalDouble write(FilterSpec spec, double derivativeTimeSeconds, double filterSeconds);

    /** The filter parameter as a person wrote it: absent, "off", or a number with or without a unit. */
    interface Written {
        boolean given();

        /** True when the value written is "off" (no filter). */
        boolean off();

        /**
         * The number written, an explicit unit converted into the parameter's own unit by {@code own}
         * (empty: the unit does not fit, and the error ends with {@code unitHint}).
         */
        double number(OwnUnit own, String unitHint);
    }
}
