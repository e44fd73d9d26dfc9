package org.loopform.report;

import java.io.IOException;
import java.io.Writer;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import org.loopform.check.CheckResult;
import org.loopform.audit.LoopOutcome;
import org.loopform.audit.LoopRow;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormUnits;
import org.loopform.units.Numbers;

/**
 * One loop's part of the HTML report: a header with the verdict, the tuning before and after,
 * the design and target figures side by side, the findings in plain words and, if asked, the
 * plots. A row that could not be checked gets a short section with its problems.
 */
final class HtmlLoopSection {
    private HtmlLoopSection() {
    }

    /** Digits of a converted value: enough to type it in without losing the design. */
    private static final int VALUE_DIGITS = 6;
    /** A feedback-path deviation below these (dB, deg) prints as 0, so the words say "matches" instead. */
    private static final double MATCH_DB = 1e-3;
    private static final double MATCH_DEG = 1e-2;

    static void write(Writer w, LoopOutcome o, boolean withPlots) throws IOException {
        if (!o.ok()) {
            writeBad(w, o);
            return;
        }
        CheckResult r = o.result();
        Conversion c = r.conversion();
        String v = r.verdict().id();
        w.write("<section class=\"loop " + v + "\" id=\"" + Html.loopAnchor(r.loop().tag()) + "\">\n<header>"
                + "<span class=\"badge " + v + "\">" + v.toUpperCase(java.util.Locale.ROOT) + "</span><h2>"
                + Html.esc(r.loop().tag()) + "</h2><span class=\"where\">" + Html.esc(c.from().id()) + " &#8594; "
                + Html.esc(c.to().id()) + " at a " + Numbers.plain(r.scanSeconds()) + " s scan"
                + (r.loop().hasProcess() ? "; process " + Html.esc(ProcessText.of(r.loop().process())) : "")
                + (r.loop().where().isEmpty() ? "" : "; " + Html.esc(r.loop().where()))
                + "</span><a class=\"top\" href=\"#summary\">back to summary</a></header>\n");
        if (o.row().tunedByRule()) {
            writeRule(w, o.row().ruleTuning());
        }
        w.write("<div class=\"cols\">\n");
        writeTuning(w, r, o.row().tunedByRule());
        if (r.hasProcess()) {
            writeFigures(w, r);
        }
        w.write("</div>\n");
        writeConversionNotes(w, r);
        writeFindings(w, r.findings());
        HtmlReplaySection.write(w, o.replay(), withPlots);
        if (withPlots) {
            w.write("<details class=\"plots\" open><summary>Plots: responses, as-found (old) dashed and as-left (new)"
                    + " solid, each step until both have settled; output limits dotted, shaded with a bar at the top"
                    + " where an output sits at a limit; new controller as run, feedback path solid and setpoint path"
                    + " dashed</summary>"
                    + "<div class=\"panels\">\n");
            for (String panel : LoopPlots.panels(r, SvgPlot.Size.COMPACT)) {
                w.write("<figure>");
                w.write(panel);
                w.write("</figure>\n");
            }
            w.write("</div></details>\n");
        }
        w.write("</section>\n");
    }

    private static void writeBad(Writer w, LoopOutcome o) throws IOException {
        LoopRow row = o.row();
        String name = row.tag() == null || row.tag().isBlank() ? "row " + (row.index() + 1) : row.tag();
        w.write("<section class=\"loop bad\" id=\"" + Html.rowAnchor(row.index()) + "\">\n<header>"
                + "<span class=\"badge bad\">NOT CHECKED</span><h2>" + Html.esc(name) + "</h2><span class=\"where\">"
                + Html.esc(row.where()) + "</span><a class=\"top\" href=\"#summary\">back to summary</a></header>\n"
                + "<ul class=\"problems\">\n");
        for (String p : o.problems()) {
            w.write("<li>" + Html.esc(p) + "</li>\n");
        }
        w.write("</ul>\n</section>\n");
    }

    /** Before/after: the source values as written, the target's computed and entered values, each with its unit. */
    /**
     * A new loop tuned by rule: which rule, its source, the model it read and its values as published;
     * the "old" column of the tuning table then holds the rule's values (there is no as-found controller).
     */
    private static void writeRule(Writer w, org.loopform.tuning.PublishedTuning t) throws IOException {
        StringBuilder sb = new StringBuilder("<p class=\"rule\">New loop, tuned by rule <b>")
                .append(Html.esc(RuleTuningText.title(t))).append("</b> (").append(Html.esc(t.rule().source()))
                .append("). As published: ").append(Html.esc(RuleTuningText.values(t))).append('.');
        if (t.model() != null) {
            sb.append(" Model read: ").append(Html.esc(TuneReport.modelText(t.model()))).append('.');
        }
        t.notes().forEach(n -> sb.append(' ').append(Html.esc(RuleTuningText.listWording(n))));
        sb.append(" There is no as-found controller: the old column below holds the rule's values.</p>\n");
        w.write(sb.toString());
    }

    private static void writeTuning(Writer w, CheckResult r, boolean byRule) throws IOException {
        Conversion c = r.conversion();
        Map<String, String> source = r.loop().tuning();
        Map<String, Double> computed = c.parameters().values();
        Map<String, Double> entered = c.entered().values();
        List<String> targetNames = new ArrayList<>(computed.keySet());
        if (c.entered().action() != null) {
            targetNames.add("action");
        }
        FormDefinition from = c.from();
        FormDefinition to = c.to();
        StringBuilder sb = new StringBuilder();
        sb.append("<table class=\"tuning\"><caption>Tuning, as-found (old) and as-left (new)</caption>\n<thead><tr class=\"group\">"
                + "<th></th><th colspan=\"3\">old: ").append(Html.esc(from.id()))
                .append("</th><th class=\"sep\" colspan=\"4\">new: ").append(Html.esc(to.id()))
                .append("</th></tr>\n<tr><th>term</th><th>name</th><th class=\"num\">value</th><th>unit</th>"
                        + "<th class=\"sep\">name</th><th class=\"num\">computed</th><th class=\"num\">to enter</th>"
                        + "<th>unit</th></tr></thead>\n<tbody>\n");
        boolean anyRounded = false;
        for (TuningRows.Row row : TuningRows.pair(new ArrayList<>(source.keySet()), targetNames)) {
            sb.append("<tr><th>").append(Html.esc(row.term())).append("</th>");
            if (row.source() == null) {
                sb.append("<td></td><td></td><td></td>");
            } else {
                String text = source.get(row.source()).trim();
                if (byRule && isNumber(text)) {
                    // the rule's value is converted in full; shown to the digits a person reads
                    text = Numbers.significant(Double.parseDouble(text), VALUE_DIGITS);
                }
                boolean bare = isNumber(text);
                sb.append("<td>").append(Html.esc(row.source())).append("</td><td class=\"num\">")
                        .append(Html.esc(text)).append("</td><td class=\"unit\">")
                        .append(bare ? Html.esc(FormUnits.of(from, row.source())) : "").append("</td>");
            }
            if (row.target() == null) {
                sb.append("<td class=\"sep\"></td><td></td><td></td><td></td>");
            } else if (row.target().equals("action")) {
                String a = c.entered().action().id();
                sb.append("<td class=\"sep\">action</td><td class=\"num\">").append(a).append("</td><td class=\"num\">")
                        .append(a).append("</td><td class=\"unit\"></td>");
            } else {
                String k = row.target();
                double x = computed.get(k);
                double e = entered.getOrDefault(k, x);
                // marked only where rounding changed the value as printed, never for a difference below the digits shown
                boolean rounded = !org.loopform.form.FormCodec.show(to, k, e, VALUE_DIGITS)
                        .equals(org.loopform.form.FormCodec.show(to, k, x, VALUE_DIGITS));
                anyRounded |= rounded;
                String shown = c.refusal(k) != null ? "do not enter (" + Html.esc(c.refusal(k)) + ")"
                        : org.loopform.form.FormCodec.show(to, k, e, VALUE_DIGITS);
                sb.append("<td class=\"sep\">").append(Html.esc(k)).append("</td><td class=\"num\">")
                        .append(org.loopform.form.FormCodec.show(to, k, x, VALUE_DIGITS)).append("</td><td class=\"num")
                        .append(rounded ? " rounded\" title=\"rounded to the new controller's resolution" : "").append("\">")
                        .append(shown).append("</td><td class=\"unit\">").append(Html.esc(FormUnits.of(to, k)))
                        .append("</td>");
            }
            sb.append("</tr>\n");
        }
        sb.append("</tbody></table>\n");
        if (anyRounded) {
            sb.append("<p class=\"note\">Bold, dotted underline: changed by rounding to the new controller's resolution.</p>\n");
        }
        w.write("<div>" + sb + "</div>\n");
    }

    private static boolean isNumber(String text) {
        try {
            Double.parseDouble(text);
            return true;
        } catch (NumberFormatException e) {
            return false;
        }
    }

    private static void writeFigures(Writer w, CheckResult r) throws IOException {
        LoopSide d = LoopSide.design(r);
        LoopSide g = LoopSide.target(r);
        StringBuilder sb = new StringBuilder();
        sb.append("<div><table class=\"figures\"><caption>Loop as-found (old) and as-left (new)</caption>\n<thead><tr>"
                + "<th>figure</th><th class=\"num\">as-found</th><th class=\"num\">as-left</th><th>unit</th></tr></thead>"
                + "\n<tbody>\n");
        for (LoopFigure f : LoopFigure.tableOrder()) {
            if (f.shown(d, g)) {
                row(sb, f.label(), Html.esc(f.text(d)), Html.esc(f.text(g)), f.unit());
            }
        }
        var sp = r.targetRun().setpoint();
        sb.append("</tbody></table>\n<p class=\"note\">Setpoint step of ").append(Html.fig(r.steps().setpointStepPercent(), 3))
                .append(" % and load step of ").append(Html.fig(r.steps().loadStepPercent(), 3)).append(" % at the process"
                + " input, ").append(Html.esc(CheckReport.aboutOperatingPoint(r.steps()))).append(", over ").append(Html.fig(sp.timeSeconds(sp.size() - 1), 4)).append(" s.");
        sb.append(" Stability from the closed-loop poles: as-found ").append(r.designStability().verdict().word())
                .append(", as-left ").append(r.targetStability().verdict().word()).append(" (")
                .append(Html.esc(r.targetStability().explanation())).append(")");
        CheckReport.notStable(r).ifPresent(note -> sb.append(" <strong>Not stable:</strong> ").append(Html.esc(note)));
        if (r.loop().sourceScanSeconds() == null) {
            sb.append(" No scan was given for the old controller, so the as-found loop runs its law continuously: simulated on ").append(Html.fig(r.referenceStepSeconds(), 3))
                    .append(" s and ").append(Html.fig(2 * r.referenceStepSeconds(), 3))
                    .append(" s steps and extrapolated; estimated PV error under ")
                    .append(Html.fig(r.referenceErrorPercent(), 2)).append(" %.");
        } else {
            sb.append(" The as-found loop runs the old controller's own algorithm at its scan.");
        }
        sb.append("</p></div>\n");
        w.write(sb.toString());
    }

    private static void row(StringBuilder sb, String name, String design, String target, String unit) {
        sb.append("<tr><th>").append(name).append("</th><td class=\"num\">").append(design)
                .append("</td><td class=\"num\">").append(target).append("</td><td class=\"unit\">")
                .append(Html.esc(unit)).append("</td></tr>\n");
    }

    private static void writeConversionNotes(Writer w, CheckResult r) throws IOException {
        Conversion c = r.conversion();
        StringBuilder sb = new StringBuilder("<p><b>Conversion:</b> ");
        if (c.exact()) {
            sb.append("exact; the new form writes the same control law as the old.");
        } else if (c.deviation().gainDb() < MATCH_DB && c.deviation().phaseDegrees() < MATCH_DEG) {
            sb.append("not exact; the feedback path matches, but the setpoint path differs (see the findings).");
        } else {
            sb.append("nearest setting the new form can hold; its feedback path is within ")
                    .append(Html.fig(c.deviation().gainDb(), 3)).append(" dB and ")
                    .append(Html.fig(c.deviation().phaseDegrees(), 3)).append(" deg of the old law.");
        }
        sb.append(" <b>New controller as run vs the old law:</b> up to ").append(Html.fig(r.mismatch().gainDb(), 3))
                .append(" dB and ").append(Html.fig(r.mismatch().phaseDegrees(), 3)).append(" deg.");
        if (!r.hasProcess()) {
            sb.append(" No process model: only the controller and the sampling rules were checked.");
        }
        w.write(sb.append("</p>\n").toString());
    }

    private static void writeFindings(Writer w, List<Finding> findings) throws IOException {
        if (findings.isEmpty()) {
            w.write("<p><b>Findings:</b> none.</p>\n");
            return;
        }
        StringBuilder sb = new StringBuilder("<ul class=\"findings\">\n");
        findings.stream().sorted(Comparator.comparing(Finding::severity).reversed()).forEach(f -> {
            String s = f.severity().id();
            sb.append("<li class=\"").append(s).append("\"><span class=\"sev ").append(s).append("\">")
                    .append(s.toUpperCase(java.util.Locale.ROOT)).append("</span> <b>").append(f.topic().id())
                    .append(":</b> ").append(Html.esc(f.message()));
            List<String> why = new ArrayList<>();
            if (f.figure() != null) {
                why.add("figure " + Html.fig(f.figure(), 4) + " " + Html.esc(f.unit()));
            }
            if (f.threshold() != null) {
                why.add("threshold " + Html.fig(f.threshold(), 4) + " " + Html.esc(f.unit()));
            }
            if (!f.source().isEmpty()) {
                why.add("source: " + Html.esc(f.source()));
            }
            if (!why.isEmpty()) {
                sb.append("<span class=\"why\">").append(String.join("; ", why)).append("</span>");
            }
            sb.append("</li>\n");
        });
        w.write(sb.append("</ul>\n").toString());
    }
}
