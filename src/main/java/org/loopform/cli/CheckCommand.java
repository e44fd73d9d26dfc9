package org.loopform.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.audit.CheckResult;
import org.loopform.audit.LoopCheck;
import org.loopform.audit.LoopSpec;
import org.loopform.audit.ScanSweep;
import org.loopform.audit.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.AtomicFiles;
import org.loopform.io.LoopFileReader;
import org.loopform.io.PolicyFileReader;
import org.loopform.report.Cautions;
import org.loopform.report.CheckReport;
import org.loopform.report.LoopPlots;
import org.loopform.report.SweepReport;
import org.loopform.units.Measure;
import org.loopform.units.TimeUnit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform check}: one loop's deployment, design loop against target loop. */
@Command(name = "check", mixinStandardHelpOptions = true,
        description = {"Checks a loop as the target will run it: converts and rounds the tuning, runs the target's"
                + " algorithm at its scan time against the sampled process, and compares margins, Ms and step"
                + " responses with the design loop. Without a process model it compares the controllers and"
                + " applies the sampling rules."},
        footer = {"", "Loop file (YAML):",
                "  tag: TIC-104",
                "  process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}",
                "  tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}",
                "  target: {form: ideal-pb-repeats, scan: 0.5 s}",
                "  ranges: {pv: 0..150, output: 0..100}",
                "", "Exit codes: 0 pass or warn; 1 a finding of severity fail; 2 bad input.", "", Cautions.SHORT})
final class CheckCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(paramLabel = "LOOP.yaml", description = "The loop file.")
    Path loopFile;

    @Option(names = "--scan", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Target scan time, overriding the loop file's (e.g. 0.5s, 250ms).")
    Double scanSeconds;

    @Option(names = "--sweep-scan", paramLabel = "FROM..TO", description = "Check across scan times from FROM to TO"
            + " (e.g. 0.1s..5s) and name the longest that keeps the loop within the policy.")
    String sweep;

    @Option(names = "--plot", paramLabel = "FILE.svg", description = "Write an SVG of the design and target loops'"
            + " responses and of the controller mismatch.")
    Path plot;

    @Option(names = "--policy", paramLabel = "FILE", description = "A YAML file of thresholds overriding the defaults"
            + " (keys: sampling_warn, sampling_fail, derivative_nh_td_warn, derivative_lead_kept_warn, ms_warn,"
            + " ms_increase_warn, phase_margin_warn_deg, gain_margin_warn, mismatch_warn_db, mismatch_warn_deg).")
    Path policyFile;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        LoopSpec loop = LoopFileReader.readOne(loopFile, loopFile.toString());
        CheckPolicy policy = policyFile == null ? CheckPolicy.DEFAULT
                : PolicyFileReader.read(policyFile, policyFile.toString());
        if (scanSeconds != null) {
            loop = loop.withTargetScan(scanSeconds);
        }
        var out = spec.commandLine().getOut();
        if (sweep != null) {
            double[] range = range(sweep);
            ScanSweep.Result result = ScanSweep.run(loop, range[0], range[1], policy);
            out.print(format.format == OutputFormat.json ? SweepReport.json(result) : SweepReport.text(result));
            out.flush();
            return result.longestAcceptableSeconds() == null ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
        }
        CheckResult r = LoopCheck.run(loop, policy);
        if (plot != null) {
            AtomicFiles.write(plot, AtomicFiles.markedSvg(LoopPlots.svg(r)),
                    List.of(loopFile, policyFile == null ? loopFile : policyFile));
        }
        out.print(format.format == OutputFormat.json ? CheckReport.json(r) : CheckReport.text(r));
        if (plot != null && format.format == OutputFormat.text) {
            out.println("Plot written to " + plot);
        }
        out.flush();
        return r.verdict() == Verdict.FAIL ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    static double[] range(String text) {
        int dots = text.indexOf("..");
        if (dots <= 0) {
            throw new org.loopform.units.UnitException("--sweep-scan: expected FROM..TO such as 0.1s..5s (got '" + text
                    + "')");
        }
        double a = Measure.parseSeconds(text.substring(0, dots), TimeUnit.SECONDS);
        double b = Measure.parseSeconds(text.substring(dots + 2), TimeUnit.SECONDS);
        if (!(a > 0) || !(b > a)) {
            throw new org.loopform.units.UnitException("--sweep-scan: needs 0 < FROM < TO (got '" + text + "')");
        }
        return new double[] {a, b};
    }
}
