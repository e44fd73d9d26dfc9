package org.loopform.io;

import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.function.Function;
import org.loopform.process.ProcessModel;
import org.loopform.tuning.ControllerType;
import org.loopform.tuning.PublishedTuning;
import org.loopform.tuning.Rule;
import org.loopform.tuning.RuleOptions;
import org.loopform.tuning.TuningRules;
import org.loopform.units.BadInput;
import org.loopform.units.Measure;
import org.loopform.units.UnitException;

/**
 * A new loop's tuning by rule, as a loop list gives it: {@code rule} (the ids of {@code tune --rule}),
 * {@code controller} ({@code pi}, the default, or {@code pid}) and the rule's own options,
 * {@code tau_c} (SIMC's closed-loop time constant) and {@code lambda} (the lambda and IMC rules'
 * closed-loop time constant). The tuning is computed by {@link TuningRules#fromModel} exactly as
 * {@code tune} computes it. Every problem names its cell and says how to fix it.
 */
final class RuleCells {

    static final String RULE = "rule";
    static final String CONTROLLER = "controller";
    static final String TAU_C = "tau_c";
    static final String LAMBDA = "lambda";
    /** The keys of a tuning by rule, in the order a person reads them. */
    static final List<String> KEYS = List.of(RULE, CONTROLLER, TAU_C, LAMBDA);
    private static final Set<Rule> READ_LAMBDA = Set.of(Rule.LAMBDA, Rule.IMC);

    private RuleCells() {
    }

    /** Whether {@code keys} hold any key of a tuning by rule. */
    static boolean any(Collection<String> keys) {
        return KEYS.stream().anyMatch(keys::contains);
    }

    /**
     * The rule's tuning of {@code process}.
     *
     * @param cells the row's rule keys that are given, by key
     * @param values the tuning values the row also gives (kc, ti...): a problem with a rule
     * @param formGiven whether the row names a source form: a problem with a rule
     * @param process the row's process model, or null (a problem: a rule needs one)
     * @param at the prefix of a problem at a key ({@code file:line: key: })
     * @param formKey how the row names its source form ({@code form}, {@code tuning.form})
     * @param modelHint how the row gives a process model, for the message when it has none
     */
    static PublishedTuning tuning(Map<String, String> cells, Collection<String> values, boolean formGiven,
                                  ProcessModel process, Function<String, String> at, String formKey,
                                  String modelHint) {
        List<String> problems = new ArrayList<>();
        String ruleText = cells.get(RULE);
        Rule rule = null;
        if (ruleText == null) {
            String given = KEYS.stream().filter(cells::containsKey).findFirst().orElse(CONTROLLER);
            problems.add(at.apply(given) + "applies only to a loop tuned by rule, and the rule is missing; give the"
                    + " rule (" + Rule.ids() + "), or empty " + given + " when the tuning values are given");
        } else {
            rule = Rule.byId(ruleText);
            if (rule == null) {
                problems.add(at.apply(RULE) + "unknown rule '" + ruleText + "'; give one of " + Rule.ids());
            }
        }
        ControllerType controller = ControllerType.PI;
        if (cells.containsKey(CONTROLLER)) {
            switch (cells.get(CONTROLLER).trim().toLowerCase(Locale.ROOT)) {
                case "pi" -> controller = ControllerType.PI;
                case "pid" -> controller = ControllerType.PID;
                default -> problems.add(at.apply(CONTROLLER) + "must be pi or pid (got '" + cells.get(CONTROLLER)
                        + "'); the controller the rule tunes");
            }
        }
        Double tauC = cells.containsKey(TAU_C) ? seconds(cells.get(TAU_C), at.apply(TAU_C), true, problems) : null;
        Double lambda = cells.containsKey(LAMBDA) ? seconds(cells.get(LAMBDA), at.apply(LAMBDA), false, problems)
                : null;
        if (rule != null && tauC != null && rule != Rule.SIMC) {
            problems.add(at.apply(TAU_C) + "is SIMC's closed-loop time constant, and rule " + rule.id() + " does not"
                    + " read it; empty the cell, or use rule simc");
        }
        if (rule != null && lambda != null && !READ_LAMBDA.contains(rule)) {
            problems.add(at.apply(LAMBDA) + "is the closed-loop time constant of the lambda and imc rules, and rule "
                    + rule.id() + " does not read it; empty the cell, or use rule lambda or imc");
        }
        if (rule != null && !values.isEmpty()) {
            problems.add(at.apply(RULE) + "the row gives both a rule (" + rule.id() + ") and tuning values ("
                    + String.join(", ", values) + "); give one of them: empty the rule to check the values given, or"
                    + " empty " + String.join(", ", values) + " to tune this new loop by the rule");
        }
        if (rule != null && formGiven) {
            problems.add(at.apply(formKey) + "a loop tuned by rule " + rule.id() + " starts from the form the rule"
                    + " publishes (ideal or series); empty " + formKey + " (the target form names the new controller)");
        }
        if (rule != null && process == null) {
            problems.add(at.apply(RULE) + "rule " + rule.id() + " tunes from the loop's process model, and this row"
                    + " has none; give " + modelHint + ", which 'loopform fit' finds from a bump test, or give the"
                    + " tuning values instead of the rule");
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        Rule chosen = rule;
        try {
            return TuningRules.fromModel(rule, controller, process, new RuleOptions(tauC, lambda, null));
        } catch (BadInput e) {
            throw new InputException(e.problems().stream().map(m -> cannotApply(m, chosen, at)).toList());
        }
    }

    private static Double seconds(String text, String prefix, boolean zeroAllowed, List<String> problems) {
        try {
            double s = Measure.parseSeconds(text, org.loopform.units.TimeUnit.SECONDS);
            if (zeroAllowed ? s >= 0 : s > 0) {
                return s;
            }
            problems.add(prefix + "must be " + (zeroAllowed ? ">= 0 s" : "> 0 s") + " (got " + text + "); give a"
                    + " time such as 30 s or 0.5 min");
        } catch (UnitException e) {
            problems.add(prefix + e.getMessage());
        }
        return null;
    }

    /**
     * A rule's refusal, written by the tuning package for {@code tune}'s options, said of the row's
     * cells: "--tau-c: required ..." becomes "file:line: tau_c: rule simc cannot be applied: required ...".
     */
    static String cannotApply(String message, Rule rule, Function<String, String> at) {
        String key = RULE;
        String rest = message;
        int colon = message.indexOf(": ");
        if (message.startsWith("--") && colon > 0) {
            String option = message.substring(0, colon);
            rest = message.substring(colon + 2);
            key = switch (option) {
                case "--tau-c" -> TAU_C;
                case "--lambda" -> LAMBDA;
                case "--controller" -> CONTROLLER;
                case "--process" -> "model";
                default -> RULE;
            };
        }
        rest = rest.replace("--tau-c", TAU_C).replace("--lambda", LAMBDA).replace("--controller", CONTROLLER)
                .replace("--process", "the process model").replace("--rule ", "rule ");
        return at.apply(key) + "rule " + rule.id() + " cannot be applied to this loop: " + rest;
    }
}
