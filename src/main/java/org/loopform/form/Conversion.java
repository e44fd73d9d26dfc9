package org.loopform.form;

import java.util.List;
import java.util.Map;
import org.loopform.law.ControlLaw;
import org.loopform.lti.FrequencyBand;
import org.loopform.law.LawDeviation;

/**
 * The result of carrying one tuning from a source form to a target form: whether the target
 * writes the source law exactly, the target values (as computed, and as entered at the target's
 * resolution), how far the target law strays from the source law over the band and over the band
 * where the loop lives, and the plain facts ({@link ConversionNote}) that {@code findings.ConversionRules}
 * judges.
 *
 * @param textbook     the target values by the textbook relations for laws without a derivative
 *                     filter (Astrom and Hagglund 1995, sec. 3.4), when they differ from the exact
 *                     ones; null otherwise. Gain, integral and derivative only.
 * @param assumptions  what was assumed because the user did not say it (the action, the source's
 *                     filter), in plain words; the same text for every loop with the same source form,
 *                     so an audit states each once
 * @param loopBand     where the loop lives: the band the nearest fit weights (the law's own corners,
 *                     or around the crossover when a process gave one)
 * @param loopDeviation the feedback path's deviation over {@code loopBand}
 * @param refused      values the target does not accept, by parameter name, with the reason: the
 *                     entry sheet marks them "do not enter"
 * @param textbookLoopDeviation for an inexact conversion with {@code textbook} values: their feedback
 *                     path's deviation over {@code loopBand}, written with the target's filter rule
 *                     (what entering them would give), beside the nearest setting's {@code loopDeviation}
 */
public record Conversion(FormDefinition from, FormDefinition to, PidSetting sourceSetting, ControlLaw sourceLaw,
                         PidSetting targetSetting, ControlLaw targetLaw, ControlLaw enteredLaw, boolean exact,
                         WrittenTuning parameters, WrittenTuning entered, LawDeviation deviation,
                         FrequencyBand band, List<ConversionNote> notes, WrittenTuning textbook,
                         List<String> assumptions, FrequencyBand loopBand, LawDeviation loopDeviation,
                         Map<String, String> refused, java.util.Optional<LawDeviation> textbookLoopDeviation) {

    public Conversion {
        notes = List.copyOf(notes);
        assumptions = List.copyOf(assumptions);
        refused = java.util.Collections.unmodifiableMap(new java.util.LinkedHashMap<>(refused));
        if (loopBand == null || loopDeviation == null || textbookLoopDeviation == null) {
            throw new IllegalArgumentException("a conversion needs the band where the loop lives and its deviation there");
        }
    }

    /** The reason the target refuses {@code name}'s value, or null when it accepts it. */
    public String refusal(String name) {
        return refused.get(name);
    }
}
