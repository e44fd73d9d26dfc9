package org.loopform.tuning;

import java.util.ArrayList;
import java.util.List;
import org.loopform.analysis.UltimateCycle;
import org.loopform.process.ProcessModel;
import org.loopform.units.BadInput;

/**
 * The published tuning rules, each computed in the form it was published in ({@link PublishedTuning}):
 * from a process model (reduced by Skogestad's half rule where the rule needs a lower order), or,
 * for Ziegler-Nichols' ultimate-cycle rule, from an ultimate gain and period.
 */
public final class TuningRules {

    private TuningRules() {
    }

    /** The tuning {@code rule} gives for {@code process}. */
    public static PublishedTuning fromModel(Rule rule, ControllerType c, ProcessModel process, RuleOptions o) {
        return switch (rule) {
            case SIMC -> Simc.of(c, process, o.tauCSeconds());
            case ZN_ULTIMATE -> {
                UltimateCycle u = UltimateGain.of(process);
                List<String> notes = new ArrayList<>();
                notes.add("Ku and Tu computed from the model (the phase crossover of the process).");
                yield ZieglerNichols.ultimate(c, Math.signum(process.lowFrequencyGain()) * u.ultimateGain(),
                        u.ultimatePeriodSeconds(), null, notes);
            }
            case ZN_STEP -> ZieglerNichols.step(c, HalfRule.firstOrder(process), o.variant());
            case COHEN_COON -> CohenCoon.of(c, HalfRule.firstOrder(process));
            case AMIGO -> Amigo.of(c, HalfRule.firstOrder(process), o.variant());
            case LAMBDA -> Lambda.of(c, HalfRule.firstOrder(process), o.lambdaSeconds());
            case IMC -> Imc.of(c, HalfRule.firstOrder(process), o.lambdaSeconds());
        };
    }

    /**
     * The tuning from an ultimate gain and period (a relay or oscillation test). {@code ultimateGain}
     * is signed like a controller gain: positive for a process whose PV rises with the output.
     */
    public static PublishedTuning fromUltimate(Rule rule, ControllerType c, double ultimateGain, double ultimatePeriodSeconds) {
        if (rule != Rule.ZN_ULTIMATE) {
            throw new BadInput("--ultimate: only --rule zn-ultimate reads an ultimate gain and period; rule "
                    + rule.id() + " needs a model (--process)");
        }
        if (!Double.isFinite(ultimateGain) || ultimateGain == 0) {
            throw new BadInput("--ultimate: KU must be finite and non-zero (got " + ultimateGain + ")");
        }
        if (!(ultimatePeriodSeconds > 0) || !Double.isFinite(ultimatePeriodSeconds)) {
            throw new BadInput("--ultimate: TU must be > 0 s (got " + ultimatePeriodSeconds + " s)");
        }
        return ZieglerNichols.ultimate(c, ultimateGain, ultimatePeriodSeconds, null, List.of());
    }

    static void needsDeadTime(Rule r, ReducedModel m) {
        if (m.deadTimeSeconds() <= 0) {
            throw new BadInput("--rule " + r.id() + ": needs a model with a dead time > 0 s (its formulas divide by"
                    + " L); use simc with --tau-c, or lambda");
        }
    }

    static void needsSelfRegulating(Rule r, ReducedModel m) {
        if (m.integrating()) {
            throw new BadInput("--rule " + r.id() + ": is published for self-regulating processes; for an integrating"
                    + " one use simc, amigo, lambda or zn-step");
        }
    }
}
