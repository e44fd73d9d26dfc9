package org.loopform.report;

import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Locale;
import org.loopform.tuning.PublishedTuning;
import org.loopform.tuning.ReducedModel;
import org.loopform.units.Numbers;

/**
 * How a tuning by a published rule is told in every output: the rule and its source, the values
 * as the rule publishes them with their units, the model it read; {@code tune}'s JSON and the
 * audit's rows tuned by rule (loops.csv, loops.json, the report, the entry sheet) say it alike.
 */
public final class RuleTuningText {

    /** Significant digits of a rule's value as shown (the check converts the full value). */
    static final int DIGITS = 5;

    private RuleTuningText() {
    }

    /** "simc PI": the rule's id and the controller it tuned. */
    public static String title(PublishedTuning t) {
        return t.rule().id() + " " + t.controller().id().toUpperCase(Locale.ROOT);
    }

    /** "kc = 0.75 %/%, ti = 60 s, td = 0 s (ideal, no derivative filter)". */
    public static String values(PublishedTuning t) {
        return "kc = " + Numbers.significant(t.gain(), DIGITS) + " %/%, ti = "
                + Numbers.significant(t.integralTimeSeconds(), DIGITS) + " s, td = "
                + Numbers.significant(t.derivativeTimeSeconds(), DIGITS) + " s (" + TuneReport.publishedForm(t) + ")";
    }

    /** One sentence: "tuned by rule simc PI (Skogestad, ...): kc = ... (ideal, ...)". */
    public static String sentence(PublishedTuning t) {
        return "tuned by rule " + title(t) + " (" + t.rule().source() + "): " + values(t);
    }

    /** A value of the rule's in the unit its name carries: kc in %/%, ti and td in s. */
    static String[] valueAndUnit(PublishedTuning t, String name) {
        return switch (name) {
            case "kc" -> new String[] {Numbers.significant(t.gain(), DIGITS), "%/%"};
            case "ti" -> new String[] {Numbers.significant(t.integralTimeSeconds(), DIGITS), "s"};
            case "td" -> new String[] {Numbers.significant(t.derivativeTimeSeconds(), DIGITS), "s"};
            default -> new String[] {"", ""};
        };
    }

    /** The rule's part of a JSON node: rule, controller, source, the published tuning, figures, model, notes. */
    static void put(ObjectNode n, PublishedTuning t) {
        put(n, t, false);
    }

    /**
     * As {@link #put(ObjectNode, PublishedTuning)}; {@code listWording} names the rule's options as a loop
     * list's columns ({@code tau_c}, {@code lambda}) instead of {@code tune}'s options in the notes.
     */
    static void put(ObjectNode n, PublishedTuning t, boolean listWording) {
        n.put("rule", t.rule().id());
        n.put("controller", t.controller().id());
        n.put("source", t.rule().source());
        ObjectNode pub = n.putObject("published");
        pub.put("structure", t.structure().id());
        pub.put("derivative_filter", "none");
        pub.put("kc", t.gain());
        pub.put("ti_s", t.integralTimeSeconds());
        pub.put("td_s", t.derivativeTimeSeconds());
        ObjectNode fig = n.putObject("figures");
        t.figures().forEach(fig::put);
        if (t.model() != null) {
            ObjectNode m = n.putObject("model");
            ReducedModel r = t.model();
            m.put("model", r.integrating() ? "integrating" : r.secondOrder() ? "sopdt" : "fopdt");
            m.put(r.integrating() ? "slope_per_s" : "gain", r.gain());
            if (!r.integrating()) {
                m.put("time_constant_s", r.lagSeconds());
            }
            if (r.secondOrder()) {
                m.put(r.integrating() ? "lag_s" : "time_constant_2_s", r.secondLagSeconds());
            }
            m.put("dead_time_s", r.deadTimeSeconds());
            m.put("how", r.how());
        } else {
            n.putNull("model");
        }
        var notes = n.putArray("notes");
        t.notes().forEach(x -> notes.add(listWording ? listWording(x) : x));
    }

    /** A rule's note said of a loop list's columns: "--tau-c" becomes "tau_c", "--lambda" "lambda". */
    static String listWording(String note) {
        return note.replace("--tau-c", "tau_c").replace("--lambda", "lambda").replace("--variant", "variant");
    }

    /** The rule's JSON object, for loops.json's {@code tuning_rule}. */
    static ObjectNode json(PublishedTuning t) {
        ObjectNode n = Json.object();
        put(n, t, true);
        return n;
    }
}
