package org.loopform.form;

import java.util.Map;
import org.loopform.units.TimeUnit;

/** Forms built in code for tests that need a variant the catalog does not ship (e.g. no filter). */
final class TestForms {
    private TestForms() {
    }

    static FormDefinition of(String id, Structure structure, FilterSpec filter) {
        boolean parallel = structure == Structure.PARALLEL;
        return new FormDefinition(id, "test form " + id, "", structure,
                new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED),
                new IntegralSpec(parallel ? IntegralWriting.GAIN : IntegralWriting.TIME, TimeUnit.SECONDS, 0.0),
                new DerivativeSpec(parallel ? DerivativeWriting.GAIN : DerivativeWriting.TIME, TimeUnit.SECONDS),
                filter, Weight.fixed(1), Weight.fixed(1), Map.of(), DiscreteAlgorithm.defaults());
    }

    static FormDefinition unfiltered(Structure structure) {
        return of(structure.id() + "-nofilter", structure,
                new FilterSpec(FilterKind.NONE, FilterPlacement.DERIVATIVE, 10, TimeUnit.SECONDS, 0));
    }

    static FormDefinition withLimits(FormDefinition f, Map<String, ParameterLimit> limits) {
        return new FormDefinition(f.id(), f.title(), f.description(), f.structure(), f.gain(), f.integral(),
                f.derivative(), f.filter(), f.b(), f.c(), limits, f.algorithm());
    }
}
