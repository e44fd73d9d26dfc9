package org.loopform.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import org.loopform.check.LoopSpec;
import org.loopform.check.ScanSweep;
import org.loopform.check.Verdict;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.PolicyKey;
import org.loopform.io.AtomicFiles;
import org.loopform.io.LoopFileReader;
import org.loopform.io.PolicyFileReader;
import org.loopform.io.ProcessReader;
import org.loopform.report.Cautions;
import org.loopform.report.LoopPlots;
import org.loopform.units.Measure;
import org.loopform.units.Numbers;
import org.loopform.units.TimeUnit;
import picocli.CommandLine;
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

    @Option(names = "--process", paramLabel = "MODEL|FILE", description = "The process, replacing the loop file's"
            + " (or giving one it lacks): an inline mapping such as \"{model: fopdt, gain: 2, time_constant: 60 s,"
            + " dead_time: 10 s}\", or a YAML file holding one (a 'fit --write-process' file, or a loop file).")
    String process;

    @Option(names = "--sweep-scan", paramLabel = "FROM..TO", description = "Check across scan times from FROM to TO"
            + " (e.g. 0.1s..5s) and name the longest that keeps the loop within the policy.")
    String sweep;

    @Option(names = "--plot", paramLabel = "FILE.svg", description = "Write an SVG of the as-found and as-left"
            + " loops' responses (PV and controller output, with the output limits) and of the controller mismatch.")
    Path plot;

    @Option(names = "--policy", paramLabel = "FILE", description = "A YAML file of thresholds overriding the defaults,"
            + " one 'key: number' a line (the keys are listed below). A fail threshold must not be laxer than its"
            + " warning; an unstable loop fails whatever the policy.")
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
        if (process != null) {
            loop = new LoopSpec(loop.tag(), ProcessReader.fromOption(process, "--process", loop.pvRange(),
                    loop.outputRange()), loop.sourceForm(), loop.tuning(), loop.sourceScanSeconds(), loop.targetForm(),
                    loop.targetScanSeconds(), loop.pvRange(), loop.outputRange(), loop.where());
        }
        var out = spec.commandLine().getOut();
        if (sweep != null) {
            double[] range = range(sweep);
            ScanSweep.Result result = ScanSweep.run(loop, range[0], range[1], policy);
            out.print(format.format.renderer().sweep(result));
            out.flush();
            return result.longestAcceptableSeconds() == null ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
        }
        CheckResult r = LoopCheck.run(loop, policy);
        if (plot != null) {
            AtomicFiles.write(plot, AtomicFiles.markedSvg(LoopPlots.svg(r)),
                    List.of(loopFile, policyFile == null ? loopFile : policyFile));
        }
        out.print(format.format.renderer().check(r));
        if (plot != null && format.format == OutputFormat.text) {
            out.println("Plot written to " + plot);
        }
        out.flush();
        return r.verdict() == Verdict.FAIL ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    /** Help section key of the policy key list. */
    static final String POLICY_SECTION = "policyKeys";

    /**
     * Adds the policy keys, with their defaults, units and meanings, to {@code check}'s help, just
     * before its footer: the list is read from the catalogue ({@link PolicyKey}), so it stays complete.
     */
    static void describePolicy(CommandLine check) {
        check.getHelpSectionMap().put(POLICY_SECTION, help -> policyHelp(help.commandSpec().usageMessage().width()));
        List<String> keys = new ArrayList<>(check.getHelpSectionKeys());
        keys.add(keys.indexOf(CommandLine.Model.UsageMessageSpec.SECTION_KEY_FOOTER), POLICY_SECTION);
        check.setHelpSectionKeys(keys);
    }

    /** "Policy keys (--policy FILE), default in brackets:" and one wrapped entry a key. */
    static String policyHelp(int width) {
        StringBuilder sb = new StringBuilder();
        String nl = System.lineSeparator();
        sb.append(nl).append("Policy keys for --policy FILE, with their defaults (sources: README, 'Check policy'):")
                .append(nl);
        for (PolicyKey k : PolicyKey.values()) {
            String head = "  " + k.id() + " = " + Numbers.plain(k.defaultValue()) + " " + k.unit() + ": ";
            wrap(sb, head + k.meaning() + ".", width, "      ");
        }
        return sb.toString();
    }

    private static void wrap(StringBuilder sb, String text, int width, String indent) {
        String nl = System.lineSeparator();
        int column = 0;
        boolean first = true;
        for (String word : text.split(" ", -1)) {
            if (word.isEmpty() && first) {
                sb.append(' ');
                column++;
                continue;
            }
            if (!first && column + 1 + word.length() > width) {
                sb.append(nl).append(indent);
                column = indent.length();
            } else if (!first) {
                sb.append(' ');
                column++;
            }
            sb.append(word);
            column += word.length();
            first = false;
        }
        sb.append(nl);
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
