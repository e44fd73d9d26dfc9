package org.loopform.cli;

import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import org.loopform.check.Verdict;
import org.loopform.findings.ActionRule;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormDefinition;
import org.loopform.form.WritingContext;
import org.loopform.io.CatalogLoader;
import org.loopform.io.ConfidenceBoxReader;
import org.loopform.io.ProcessReader;
import org.loopform.io.PublishedForm;
import org.loopform.process.ProcessModel;
import org.loopform.report.Cautions;
import org.loopform.report.RobustReport;
import org.loopform.report.TuneReport;
import org.loopform.tuning.ConfidenceBox;
import org.loopform.tuning.RobustCheck;
import org.loopform.tuning.RobustResult;
import org.loopform.tuning.ControllerType;
import org.loopform.tuning.PublishedTuning;
import org.loopform.tuning.Rule;
import org.loopform.tuning.RuleOptions;
import org.loopform.tuning.TuningRules;
import org.loopform.units.BadInput;
import org.loopform.units.Measure;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code loopform tune}: a first tuning by a published rule, carried into the target's form. */
@Command(name = "tune", mixinStandardHelpOptions = true,
        description = {"Computes a tuning by a published rule from a process model (or an ultimate gain and period),"
                + " in the form the rule was published in, and carries it into the target form through the converter."
                + " With a model it reports the resulting loop's margins, Ms and step response; with --scan the whole"
                + " check at the target's scan time."},
        footer = {"", "Rules: zn-step, zn-ultimate (Ziegler & Nichols 1942); cohen-coon (1953); simc (Skogestad 2003,"
                + " series PID, --tau-c); lambda (--lambda); amigo (Astrom & Hagglund 2004); imc (Rivera, Morari &"
                + " Skogestad 1986, --lambda).",
                "Variants (--variant): zn-step paper (PI ti = L/0.3, default) or textbook (3 L); amigo paper"
                        + " (integrating PI ti = 13.4 L, default) or limit (13.35 L).",
                "", "Examples:",
                "  loopform tune --process \"{model: fopdt, gain: 1, time_constant: 10 s, dead_time: 1 s}\" --rule amigo"
                        + " --controller pid",
                "  loopform tune --ultimate 2.26,3.1s --rule zn-ultimate --to ideal-pb-repeats",
                "", "Exit codes: 0 done; 1 a finding of severity fail (or an unstable loop); 2 bad input.", "",
                Cautions.SHORT})
final class TuneCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--process", paramLabel = "MODEL", description = "The process: an inline mapping such as"
            + " \"{model: fopdt, gain: 1.5, time_constant: 60 s, dead_time: 8 s}\", or a YAML file with the same keys"
            + " as a loop file's process block (or a loop file).")
    String process;

    @Option(names = "--ultimate", paramLabel = "KU,TU", description = "Ultimate gain (%%/%%, negative for a process"
            + " whose PV falls as the output rises) and period from a field test, e.g. 2.3,45s. For zn-ultimate.")
    String ultimate;

    @Option(names = "--rule", required = true, paramLabel = "RULE", description = "zn-step, zn-ultimate, cohen-coon,"
            + " simc, lambda, amigo or imc.")
    String rule;

    @Option(names = "--controller", paramLabel = "pi|pid", defaultValue = "pi",
            description = "Controller to tune (default: ${DEFAULT-VALUE}).")
    String controller;

    @Option(names = "--to", paramLabel = "ID|FILE", defaultValue = "ideal",
            description = "Target form: a catalog id or a form file (default: ${DEFAULT-VALUE}).")
    String to;

    @Option(names = "--tau-c", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "SIMC closed-loop time constant (default: the model's effective dead time).")
    Double tauCSeconds;

    @Option(names = "--lambda", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Closed-loop time constant of the lambda and imc rules.")
    Double lambdaSeconds;

    @Option(names = "--variant", paramLabel = "ID", description = "A published variant where sources disagree (see"
            + " below).")
    String variant;

    @Option(names = "--scan", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Target scan time: checks the loop as the target runs it.")
    Double scanSeconds;

    @Option(names = "--pv-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "PV range in engineering units (for engineering-unit forms and gains).")
    Span pvRange;

    @Option(names = "--out-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "Output range in engineering units.")
    Span outRange;

    @Option(names = "--robust", description = "Also check the tuning at every corner of the fit's 95 %% box (--process"
            + " FILE written by 'fit --write-process') and report the worst Ms and margins; exit 1 if a corner is"
            + " unstable.")
    boolean robust;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        Rule r = Rule.byId(rule);
        if (r == null) {
            throw new BadInput("--rule: unknown rule '" + rule + "'; choose one of " + Rule.ids());
        }
        ControllerType c = switch (controller.trim().toLowerCase(Locale.ROOT)) {
            case "pi" -> ControllerType.PI;
            case "pid" -> ControllerType.PID;
            default -> throw new BadInput("--controller: must be pi or pid (got '" + controller + "')");
        };
        if ((process == null) == (ultimate == null)) {
            throw new BadInput("--process or --ultimate: give exactly one (a model, or KU,TU from a field test)");
        }
        FormDefinition target = CatalogLoader.resolve(to, "--to");
        ConfidenceBox box = null;
        if (robust) {
            if (process == null) {
                throw new BadInput("--robust: needs --process FILE written by 'loopform fit --write-process' (its 95 %"
                        + " intervals); a field test's --ultimate has none");
            }
            box = ConfidenceBoxReader.read(process, "--process");
        }
        ProcessModel p = null;
        PublishedTuning t;
        RuleOptions options = new RuleOptions(tauCSeconds, lambdaSeconds,
                variant == null ? null : variant.trim().toLowerCase(Locale.ROOT));
        if (process != null) {
            p = ProcessReader.fromOption(process, "--process", pvRange, outRange);
            t = TuningRules.fromModel(r, c, p, options);
        } else {
            double[] ku = ultimate(ultimate);
            t = TuningRules.fromUltimate(r, c, ku[0], ku[1]);
        }
        // the audit's rows tuned by rule convert from the same form and values (io.PublishedForm)
        FormDefinition source = PublishedForm.form(t, "--rule");
        Map<String, String> values = PublishedForm.values(t);
        Conversion conv = Converter.convert(source, values, target, new WritingContext(pvRange, outRange, scanSeconds));
        CheckResult design = null;
        CheckResult check = null;
        java.util.List<org.loopform.findings.Finding> convFindings = new java.util.ArrayList<>(
                org.loopform.findings.ConversionRules.findings(conv));
        boolean failed = org.loopform.findings.Finding.worst(convFindings) == Severity.FAIL;
        if (p != null) {
            ActionRule.check(conv.sourceLaw().terms(), p.lowFrequencyGain(), p.integrators())
                    .ifPresent(convFindings::add);
            if (scanSeconds != null) {
                check = LoopCheck.run(new LoopSpec("tune", p, source, values, null, target, scanSeconds, pvRange,
                        outRange, "--process"), CheckPolicy.DEFAULT);
                failed |= check.verdict() == Verdict.FAIL;
            } else {
                // the design loop alone: the published law on the model; the scan only sets the target side,
                // which is not reported without --scan
                design = LoopCheck.run(new LoopSpec("tune", p, source, values, null, source,
                        nominalScanSeconds(t, p), pvRange, outRange, "--process"), CheckPolicy.DEFAULT);
                failed |= !design.designStability().isStable();
            }
        }
        RobustResult robustness = null;
        if (box != null) {
            LoopSpec nominal = scanSeconds != null
                    ? new LoopSpec("tune", p, source, values, null, target, scanSeconds, pvRange, outRange, "--process")
                    : new LoopSpec("tune", p, source, values, null, source, nominalScanSeconds(t, p), pvRange,
                    outRange, "--process");
            robustness = RobustCheck.run(nominal, box, CheckPolicy.DEFAULT, scanSeconds != null);
            failed |= robustness.unstableCorners() > 0;
        }
        var out = spec.commandLine().getOut();
        out.print(format.format == OutputFormat.json ? TuneReport.json(t, conv, convFindings, design, check, robustness)
                : TuneReport.text(t, conv, convFindings, values, design, check)
                + (robustness == null ? "" : RobustReport.text(robustness)));
        out.flush();
        return failed ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    /** A scan far below the loop's time scale, for a check whose target side is not reported. */
    private static double nominalScanSeconds(PublishedTuning t, ProcessModel p) {
        double scale = t.integralTimeSeconds();
        if (p.deadTimeSeconds() > 0) {
            scale = Math.min(scale, p.deadTimeSeconds());
        }
        if (t.derivativeTimeSeconds() > 0) {
            scale = Math.min(scale, t.derivativeTimeSeconds());
        }
        return scale / 100;
    }

    static double[] ultimate(String text) {
        int comma = text.indexOf(',');
        if (comma <= 0 || comma == text.length() - 1) {
            throw new BadInput("--ultimate: expected KU,TU such as 2.3,45s (got '" + text + "')");
        }
        double ku;
        try {
            ku = Double.parseDouble(text.substring(0, comma).trim());
        } catch (NumberFormatException e) {
            throw new BadInput("--ultimate: KU must be a number such as 2.3 (got '" + text.substring(0, comma).trim()
                    + "')");
        }
        double tu = Measure.parseSeconds(text.substring(comma + 1).trim(), TimeUnit.SECONDS);
        return new double[] {ku, tu};
    }
}
