package org.loopform.tuning;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Nested;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.loopform.form.Structure;
import org.loopform.lti.Polynomial;
import org.loopform.lti.TransferFunction;
import org.loopform.process.FirstOrderPlusDeadTime;
import org.loopform.process.GeneralTransferFunction;
import org.loopform.process.IntegratingPlusDeadTime;
import org.loopform.process.ProcessModel;
import org.loopform.process.SecondOrderPlusDeadTime;
import org.loopform.units.BadInput;

/** Each rule against its published worked values or its published formula evaluated by hand. */
class PublishedRulesTest {

    private static final ProcessModel K1_T10_L1 = new FirstOrderPlusDeadTime(1, 10, 1);

    private static PublishedTuning tune(Rule r, ControllerType c, ProcessModel p) {
        return TuningRules.fromModel(r, c, p, RuleOptions.DEFAULTS);
    }

    /**
     * Skogestad 2003 (J. Process Control 13:291-309), the paper's worked example of the half rule:
     * g = (-0.3s+1)(0.08s+1)/((2s+1)(s+1)(0.4s+1)(0.2s+1)(0.05s+1)^3).
     */
    static ProcessModel skogestadExample() {
        Polynomial num = Polynomial.ofAscending(1, -0.3).times(Polynomial.ofAscending(1, 0.08));
        Polynomial den = Polynomial.ofAscending(1, 2).times(Polynomial.ofAscending(1, 1))
                .times(Polynomial.ofAscending(1, 0.4)).times(Polynomial.ofAscending(1, 0.2))
                .times(Polynomial.ofAscending(1, 0.05)).times(Polynomial.ofAscending(1, 0.05))
                .times(Polynomial.ofAscending(1, 0.05));
        return new GeneralTransferFunction(new TransferFunction(num, den), 0);
    }

    @Nested
    @DisplayName("SIMC (Skogestad 2003, J. Process Control 13:291-309)")
    class SimcRule {

        @Test
        void half_rule_example_gives_the_papers_first_order_model_and_pi() {
            // Skogestad 2003, worked example: FOPDT k = 1, tau1 = 2.5, theta = 1.47 -> PI Kc = 0.85, tauI = 2.5
            ReducedModel m = HalfRule.firstOrder(skogestadExample());
            assertThat(m.gain()).isCloseTo(1.0, within(1e-9));
            assertThat(m.lagSeconds()).isCloseTo(2.5, within(1e-4));
            assertThat(m.deadTimeSeconds()).isCloseTo(1.47, within(1e-4));
            PublishedTuning t = tune(Rule.SIMC, ControllerType.PI, skogestadExample());
            assertThat(t.gain()).isCloseTo(0.85, within(0.005));
            assertThat(t.integralTimeSeconds()).isCloseTo(2.5, within(1e-4));
            assertThat(t.derivativeTimeSeconds()).isZero();
        }

        @Test
        void half_rule_example_gives_the_papers_second_order_model_and_series_pid() {
            // Skogestad 2003, worked example: SOPDT tau1 = 2, tau2 = 1.2, theta = 0.77 -> Kc = 1.30, tauI = 2, tauD = 1.2
            ReducedModel m = HalfRule.secondOrder(skogestadExample());
            assertThat(m.lagSeconds()).isCloseTo(2.0, within(1e-4));
            assertThat(m.secondLagSeconds()).isCloseTo(1.2, within(1e-4));
            assertThat(m.deadTimeSeconds()).isCloseTo(0.77, within(1e-4));
            PublishedTuning t = tune(Rule.SIMC, ControllerType.PID, skogestadExample());
            assertThat(t.structure()).isEqualTo(Structure.SERIES);
            assertThat(t.gain()).isCloseTo(1.30, within(0.005));
            assertThat(t.integralTimeSeconds()).isCloseTo(2.0, within(1e-4));
            assertThat(t.derivativeTimeSeconds()).isCloseTo(1.2, within(1e-4));
        }

        @Test
        void integrating_rule_uses_four_times_tau_c_plus_theta() {
            // Skogestad 2003, Table 3: integrating k' = 0.5, theta = 2, tau_c = 2 -> Kc = 1/(0.5*4) = 0.5, tauI = 16
            PublishedTuning t = tune(Rule.SIMC, ControllerType.PI, new IntegratingPlusDeadTime(0.5, 2));
            assertThat(t.gain()).isCloseTo(0.5, within(1e-12));
            assertThat(t.integralTimeSeconds()).isCloseTo(16, within(1e-12));
        }

        @Test
        void tau_i_is_capped_at_four_times_tau_c_plus_theta() {
            // Skogestad 2003: tauI = min(tau1, 4(tau_c + theta)); tau1 = 100, theta = 1 -> 8
            PublishedTuning t = tune(Rule.SIMC, ControllerType.PI, new FirstOrderPlusDeadTime(2, 100, 1));
            assertThat(t.integralTimeSeconds()).isCloseTo(8, within(1e-12));
            assertThat(t.gain()).isCloseTo(100 / (2.0 * 2), within(1e-12));
        }

        @Test
        void no_dead_time_needs_tau_c() {
            assertThatThrownBy(() -> tune(Rule.SIMC, ControllerType.PI, new FirstOrderPlusDeadTime(1, 10, 0)))
                    .isInstanceOf(BadInput.class).hasMessageContaining("--tau-c");
        }
    }

    @Nested
    @DisplayName("AMIGO (Astrom & Hagglund 2004, J. Process Control 14:635-650)")
    class AmigoRule {

        @Test
        void pi_on_k1_t10_l1() {
            // Astrom & Hagglund 2004 PI formula evaluated by hand at Kp = 1, T = 10, L = 1: (2.8236, 6.0769)
            PublishedTuning t = tune(Rule.AMIGO, ControllerType.PI, K1_T10_L1);
            assertThat(t.gain()).isCloseTo(2.8236, within(1e-4));
            assertThat(t.integralTimeSeconds()).isCloseTo(6.0769, within(1e-4));
        }

        @Test
        void pid_on_k1_t10_l1() {
            // Astrom & Hagglund 2004 PID formula by hand: K = 0.2 + 4.5 = 4.7, Ti = 8.4/2 = 4.2, Td = 5/10.3
            PublishedTuning t = tune(Rule.AMIGO, ControllerType.PID, K1_T10_L1);
            assertThat(t.gain()).isCloseTo(4.7, within(1e-12));
            assertThat(t.integralTimeSeconds()).isCloseTo(4.2, within(1e-12));
            assertThat(t.derivativeTimeSeconds()).isCloseTo(0.48544, within(1e-5));
        }

        @Test
        void fopdt_rule_tends_to_the_integrating_rule_as_t_grows() {
            // Astrom & Hagglund 2004: Kv = Kp/T held, T -> infinity: PI K -> 0.35/(Kv L), Ti -> 13.35 L;
            // PID K -> 0.45/(Kv L), Ti -> 8 L, Td -> 0.5 L (limits derived from the formulas)
            double kv = 0.02;
            double l = 3;
            double t = 1e9;
            PublishedTuning pi = tune(Rule.AMIGO, ControllerType.PI, new FirstOrderPlusDeadTime(kv * t, t, l));
            PublishedTuning piLimit = TuningRules.fromModel(Rule.AMIGO, ControllerType.PI,
                    new IntegratingPlusDeadTime(kv, l), new RuleOptions(null, null, "limit"));
            assertThat(pi.gain()).isCloseTo(piLimit.gain(), within(1e-4 * piLimit.gain()));
            assertThat(pi.integralTimeSeconds()).isCloseTo(piLimit.integralTimeSeconds(), within(1e-3));
            PublishedTuning pid = tune(Rule.AMIGO, ControllerType.PID, new FirstOrderPlusDeadTime(kv * t, t, l));
            PublishedTuning pidInt = tune(Rule.AMIGO, ControllerType.PID, new IntegratingPlusDeadTime(kv, l));
            assertThat(pid.gain()).isCloseTo(pidInt.gain(), within(1e-4 * pidInt.gain()));
            assertThat(pid.integralTimeSeconds()).isCloseTo(8 * l, within(1e-3));
            assertThat(pid.derivativeTimeSeconds()).isCloseTo(0.5 * l, within(1e-3));
            // the paper's rounded integrating PI (from memory): Ti = 13.4 L
            assertThat(tune(Rule.AMIGO, ControllerType.PI, new IntegratingPlusDeadTime(kv, l)).integralTimeSeconds())
                    .isCloseTo(13.4 * l, within(1e-12));
        }
    }

    @Nested
    @DisplayName("Ziegler & Nichols 1942 (Trans. ASME 64:759-768)")
    class ZieglerNicholsRule {

        @Test
        void step_pid_on_k1_t10_l1() {
            // ZN 1942 step response: a = K L / T = 0.1; PID 1.2/a = 12, Ti = 2 L = 2, Td = L/2 = 0.5
            PublishedTuning t = tune(Rule.ZN_STEP, ControllerType.PID, K1_T10_L1);
            assertThat(t.gain()).isCloseTo(12, within(1e-12));
            assertThat(t.integralTimeSeconds()).isCloseTo(2, within(1e-12));
            assertThat(t.derivativeTimeSeconds()).isCloseTo(0.5, within(1e-12));
        }

        @Test
        void step_pi_integral_time_follows_the_chosen_variant() {
            // ZN 1942: PI Kc = 0.9/a, Ti = L/0.3 in the paper, 3 L in many textbooks
            PublishedTuning paper = tune(Rule.ZN_STEP, ControllerType.PI, K1_T10_L1);
            PublishedTuning textbook = TuningRules.fromModel(Rule.ZN_STEP, ControllerType.PI, K1_T10_L1,
                    new RuleOptions(null, null, "textbook"));
            assertThat(paper.gain()).isCloseTo(9, within(1e-12));
            assertThat(paper.integralTimeSeconds()).isCloseTo(1 / 0.3, within(1e-12));
            assertThat(textbook.integralTimeSeconds()).isCloseTo(3, within(1e-12));
        }

        @Test
        void ultimate_pid_from_ku_and_tu() {
            // ZN 1942 ultimate cycle: 0.6 Ku, Tu/2, Tu/8; Ku = 30, Tu = 2 pi/sqrt 5 (the process 1/(s(s+1)(s+5)))
            double tu = 2 * Math.PI / Math.sqrt(5);
            PublishedTuning t = TuningRules.fromUltimate(Rule.ZN_ULTIMATE, ControllerType.PID, 30, tu);
            assertThat(t.gain()).isCloseTo(18, within(1e-12));
            assertThat(t.integralTimeSeconds()).isCloseTo(1.40496, within(1e-5));
            assertThat(t.derivativeTimeSeconds()).isCloseTo(0.35124, within(1e-5));
            PublishedTuning pi = TuningRules.fromUltimate(Rule.ZN_ULTIMATE, ControllerType.PI, 30, tu);
            assertThat(pi.gain()).isCloseTo(13.5, within(1e-12));
            assertThat(pi.integralTimeSeconds()).isCloseTo(tu / 1.2, within(1e-12));
        }

        @Test
        void only_the_ultimate_rule_reads_an_ultimate_cycle() {
            assertThatThrownBy(() -> TuningRules.fromUltimate(Rule.SIMC, ControllerType.PI, 2, 10))
                    .isInstanceOf(BadInput.class).hasMessageContaining("--process");
        }
    }

    @Nested
    @DisplayName("Cohen & Coon 1953 (Trans. ASME 75:827)")
    class CohenCoonRule {

        @Test
        void pi_and_pid_on_k1_t10_l1() {
            // Cohen & Coon 1953 formulas by hand at R = 0.1: PI (9.0833, 2.7545), PID (13.583, 2.3623, 0.35714)
            PublishedTuning pi = tune(Rule.COHEN_COON, ControllerType.PI, K1_T10_L1);
            assertThat(pi.gain()).isCloseTo(9.0833, within(1e-4));
            assertThat(pi.integralTimeSeconds()).isCloseTo(2.7545, within(1e-4));
            PublishedTuning pid = tune(Rule.COHEN_COON, ControllerType.PID, K1_T10_L1);
            assertThat(pid.gain()).isCloseTo(13.583, within(1e-3));
            assertThat(pid.integralTimeSeconds()).isCloseTo(2.3623, within(1e-4));
            assertThat(pid.derivativeTimeSeconds()).isCloseTo(0.35714, within(1e-5));
        }

        @Test
        void refuses_an_integrating_process() {
            assertThatThrownBy(() -> tune(Rule.COHEN_COON, ControllerType.PI, new IntegratingPlusDeadTime(1, 1)))
                    .isInstanceOf(BadInput.class).hasMessageContaining("self-regulating");
        }
    }

    @Nested
    @DisplayName("IMC-PID (Rivera, Morari & Skogestad 1986, Table 1 - from memory) and lambda (Astrom & Hagglund 2006 ch. 7 - from memory)")
    class ImcAndLambda {

        @Test
        void imc_pid_on_k2_t10_l2_lambda_4() {
            // Rivera et al. 1986 Table 1 by hand: K Kc = (2T+L)/(2(lambda+L)) = 22/12, Ti = T + L/2 = 11,
            // Td = T L/(2T+L) = 20/22
            PublishedTuning t = TuningRules.fromModel(Rule.IMC, ControllerType.PID, new FirstOrderPlusDeadTime(2, 10, 2),
                    new RuleOptions(null, 4.0, null));
            assertThat(t.gain()).isCloseTo(22.0 / 12 / 2, within(1e-12));
            assertThat(t.integralTimeSeconds()).isCloseTo(11, within(1e-12));
            assertThat(t.derivativeTimeSeconds()).isCloseTo(20.0 / 22, within(1e-12));
        }

        @Test
        void lambda_pi_on_fopdt_and_integrating() {
            // lambda tuning by hand: FOPDT K = 2, T = 10, L = 2, lambda = 8: Kc = 10/(2*10) = 0.5, Ti = 10;
            // integrating Kv = 0.1, L = 2, lambda = 8: Ti = 18, Kc = 18/(0.1*100) = 1.8
            PublishedTuning f = TuningRules.fromModel(Rule.LAMBDA, ControllerType.PI, new FirstOrderPlusDeadTime(2, 10, 2),
                    new RuleOptions(null, 8.0, null));
            assertThat(f.gain()).isCloseTo(0.5, within(1e-12));
            assertThat(f.integralTimeSeconds()).isCloseTo(10, within(1e-12));
            PublishedTuning i = TuningRules.fromModel(Rule.LAMBDA, ControllerType.PI, new IntegratingPlusDeadTime(0.1, 2),
                    new RuleOptions(null, 8.0, null));
            assertThat(i.integralTimeSeconds()).isCloseTo(18, within(1e-12));
            assertThat(i.gain()).isCloseTo(1.8, within(1e-12));
        }
    }

    @Nested
    @DisplayName("Ultimate gain and period of textbook processes")
    class Ultimate {

        @ParameterizedTest
        @ValueSource(ints = {3, 4, 5, 6, 8})
        void lag_chain_has_wu_tan_pi_over_n_and_ku_sec_pi_over_n_to_the_n(int n) {
            // derived: 1/(s+1)^n reaches -180 deg where n atan(w) = pi, so wu = tan(pi/n) and
            // Ku = 1/|P(i wu)| = (1 + tan^2(pi/n))^(n/2) = sec(pi/n)^n
            Polynomial den = Polynomial.ONE;
            for (int k = 0; k < n; k++) {
                den = den.times(Polynomial.ofAscending(1, 1));
            }
            var u = UltimateGain.of(new GeneralTransferFunction(new TransferFunction(Polynomial.ONE, den), 0));
            assertThat(u.ultimateRadPerSecond()).isCloseTo(Math.tan(Math.PI / n), within(1e-6));
            assertThat(u.ultimateGain()).isCloseTo(Math.pow(1 / Math.cos(Math.PI / n), n), within(1e-6));
        }

        @Test
        void first_order_with_unit_dead_time() {
            // textbook example e^(-s)/(s+1): Ku = 2.2618, Tu = 3.097 s (w + atan w = pi; from memory, checked by the
            // phase condition in analysis.UltimateCycleTest)
            var u = UltimateGain.of(new FirstOrderPlusDeadTime(1, 1, 1));
            assertThat(u.ultimateGain()).isCloseTo(2.2618, within(1e-4));
            assertThat(u.ultimatePeriodSeconds()).isCloseTo(3.097, within(1e-3));
        }

        @Test
        void zn_ultimate_from_a_reverse_process_gives_a_negative_gain() {
            // ZN 1942 with Ku = 8, Tu = 2 pi/sqrt 3 (1/(s+1)^3, derived); the process falls as the output rises
            Polynomial den = Polynomial.ofAscending(1, 3, 3, 1);
            PublishedTuning t = tune(Rule.ZN_ULTIMATE, ControllerType.PID,
                    new GeneralTransferFunction(new TransferFunction(Polynomial.constant(-1), den), 0));
            assertThat(t.gain()).isCloseTo(-0.6 * 8, within(1e-5));
            assertThat(t.integralTimeSeconds()).isCloseTo(Math.PI / Math.sqrt(3), within(1e-5));
        }

        @Test
        void sopdt_half_rule_on_real_time_constants() {
            // Skogestad 2003 half rule: tau1 = 6, tau2 = 2, theta = 1 -> FOPDT tau = 7, theta = 2
            ReducedModel m = HalfRule.firstOrder(SecondOrderPlusDeadTime.ofTimeConstants(1, 6, 2, 1));
            assertThat(m.lagSeconds()).isCloseTo(7, within(1e-9));
            assertThat(m.deadTimeSeconds()).isCloseTo(2, within(1e-9));
        }
    }
}
