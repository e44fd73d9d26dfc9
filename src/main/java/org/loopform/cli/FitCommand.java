package org.loopform.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.findings.Severity;
import org.loopform.identify.DataFinding;
import org.loopform.identify.ModelFit;
import org.loopform.identify.PlantRecord;
import org.loopform.identify.RelayAnalysis;
import org.loopform.identify.RelayResult;
import org.loopform.identify.StepIdentification;
import org.loopform.identify.StepTestResult;
import org.loopform.io.AtomicFiles;
import org.loopform.io.InputException;
import org.loopform.io.RecordCsvReader;
import org.loopform.report.Cautions;
import org.loopform.report.FitPlot;
import org.loopform.report.FitReport;
import org.loopform.units.Span;
import org.loopform.units.TimeUnit;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform fit}: process models (or an ultimate cycle) from a logged open-loop or relay test. */
@Command(name = "fit", mixinStandardHelpOptions = true,
        description = {"Fits FOPDT, SOPDT and integrating-plus-dead-time models to a logged open-loop test (one or"
                + " several output steps, or a pulse) by least squares on the response simulated from the recorded"
                + " output, with 95 %% intervals, and recommends one; or, with --relay, reads the ultimate gain and"
                + " period from a relay-feedback test. Says when the record cannot support a model."},
        footer = {"", "Examples:",
                "  loopform fit bump.csv --pv-range 0..150 --out-range 0..100 --write-process tic104-process.yaml",
                "  loopform fit bump.csv --percent-of-span --time t_min --time-unit min --output out --pv pv",
                "", "Exit codes: 0 done; 1 the record cannot support a model (a finding of severity fail); 2 bad"
                        + " input.", "", Cautions.SHORT})
final class FitCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(paramLabel = "RECORD.csv", description = "The record: CSV with a header row.")
    Path record;

    @Option(names = "--time", paramLabel = "COLUMN", defaultValue = "time",
            description = "Time column: numbers (seconds, or the unit of --time-unit) or ISO-8601 timestamps"
                    + " (default: ${DEFAULT-VALUE}).")
    String time;

    @Option(names = "--time-unit", paramLabel = "s|min|h", converter = TimeUnitConverter.class,
            description = "The unit of a time column of numbers (default: s).")
    TimeUnit timeUnit;

    @Option(names = "--output", paramLabel = "COLUMN", defaultValue = "output",
            description = "Controller output column (default: ${DEFAULT-VALUE}).")
    String output;

    @Option(names = "--pv", paramLabel = "COLUMN", defaultValue = "pv",
            description = "PV column (default: ${DEFAULT-VALUE}).")
    String pv;

    @Option(names = "--pv-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "The PV's span in the record's units, such as 0..25 for a transmitter of 0 to 25 bar."
                    + " Required with --out-range, unless --percent-of-span.")
    Span pvRange;

    @Option(names = "--out-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "The output's span in the record's units (0..100 when the output is logged in %%)."
                    + " Required with --pv-range, unless --percent-of-span.")
    Span outRange;

    @Option(names = "--percent-of-span", description = "The record's PV and output are both already in percent"
            + " of their spans (0..100); instead of --pv-range and --out-range.")
    boolean percentOfSpan;

    @Option(names = "--relay", description = "The record is a relay-feedback test: read Ku and Tu.")
    boolean relay;

    @Option(names = "--write-process", paramLabel = "FILE", description = "Write the recommended model as a loop"
            + " file's process block (never over an existing file).")
    Path writeProcess;

    @Option(names = "--plot", paramLabel = "FILE.svg", description = "Write an SVG of the recorded PV with the fitted"
            + " responses, the recorded output and the recommended model's residuals (step tests).")
    Path plot;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        if (writeProcess != null && Files.exists(writeProcess)) {
            throw new InputException(writeProcess + ": --write-process: the file exists; loopform never writes over"
                    + " an existing file here: choose a new name");
        }
        if (plot != null && writeProcess != null && plot.toAbsolutePath().normalize()
                .equals(writeProcess.toAbsolutePath().normalize())) {
            throw new InputException(plot + ": --plot and --write-process name the same file; give two names");
        }
        if (relay && plot != null) {
            throw new InputException("--plot: draws a step test's fits; leave it out with --relay");
        }
        requireSpans();
        Span pvSpan = percentOfSpan ? PERCENT : pvRange;
        Span outSpan = percentOfSpan ? PERCENT : outRange;
        RecordCsvReader.Reading read = RecordCsvReader.read(record, record.toString(), time, output, pv, outSpan,
                pvSpan, timeUnit);
        PlantRecord r = read.record();
        FitReport.Reading reading = new FitReport.Reading(pvSpan, outSpan, percentOfSpan, time.strip(),
                read.timeReadAs());
        DataFinding timeFinding = read.timestamps() ? null : timeUnitFinding(time, timeUnit);
        var out = spec.commandLine().getOut();
        boolean json = format.format == OutputFormat.json;
        if (relay) {
            RelayResult rr = RelayAnalysis.analyze(r);
            if (timeFinding != null) {
                rr = new RelayResult(rr.ultimateGain(), rr.ultimatePeriodSeconds(), rr.relayAmplitudePercent(),
                        rr.pvAmplitudePercent(), rr.cycles(), with(rr.findings(), timeFinding));
            }
            out.print(json ? FitReport.relayJson(rr, reading) : FitReport.relayText(rr, reading));
            out.flush();
            return failed(rr.findings()) ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
        }
        StepTestResult res = StepIdentification.identify(r, true);
        if (timeFinding != null) {
            res = new StepTestResult(with(res.findings(), timeFinding), res.estimates(), res.fits(), res.recommended(),
                    res.reason(), res.noisePercent(), res.stepPercent());
        }
        ModelFit best = res.recommendedFit();
        // the plot first: its checks (a file loopform did not write) can still refuse; the process file's were made
        if (plot != null) {
            AtomicFiles.write(plot, AtomicFiles.markedSvg(FitPlot.svg(r, res)), List.of(record));
        }
        if (writeProcess != null && best != null) {
            AtomicFiles.write(writeProcess, FitReport.processBlock(best, record.getFileName().toString(), reading),
                    List.of(record));
        }
        out.print(json ? FitReport.json(res, reading) : FitReport.text(res, reading));
        if (plot != null && !json) {
            out.println("Plot written to " + plot);
        }
        if (writeProcess != null && !json) {
            out.println(best != null ? "Process block written to " + writeProcess
                    : "No process block written: no model is recommended.");
        }
        out.flush();
        return failed(res.findings()) || best == null ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    /** A record declared in percent of span is read over this span. */
    private static final Span PERCENT = new Span(0, 100);

    /** Refuses to guess the record's scaling: both spans, or the declaration that it is in percent, never neither. */
    private void requireSpans() {
        if (percentOfSpan) {
            if (pvRange != null || outRange != null) {
                throw new InputException("--percent-of-span: says the record is already in percent of span, so it"
                        + " takes no " + (pvRange != null ? "--pv-range" : "--out-range") + "; give either both"
                        + " ranges (for a column logged in %, the range 0..100) or --percent-of-span alone");
            }
            return;
        }
        if (pvRange == null && outRange == null) {
            throw new InputException(record + ": fit needs the record's spans to read its PV and output as percent"
                    + " of span, and will not assume them: give --pv-range LO..HI and --out-range LO..HI in the"
                    + " record's units (--out-range 0..100 when the output is logged in %), or --percent-of-span when"
                    + " both columns are already in percent of span");
        }
        if (pvRange == null || outRange == null) {
            String missing = pvRange == null ? "--pv-range" : "--out-range";
            throw new InputException(missing + ": missing; fit needs both spans, the PV's and the output's, in the"
                    + " record's units (" + (pvRange == null ? "the PV's transmitter range, such as 0..150"
                    : "0..100 when the output is logged in %") + ")");
        }
    }

    /**
     * A warning when the time column's name suggests a unit other than the one it was read in (such as
     * {@code time_min} read as seconds); null when it suggests none or the same.
     */
    static DataFinding timeUnitFinding(String column, TimeUnit given) {
        String readAs = given == null ? "s" : given.symbol();
        String suggested = RecordCsvReader.unitSuggestedBy(column).orElse(null);
        if (suggested == null || suggested.equals(readAs)) {
            return null;
        }
        return new DataFinding("time-unit", Severity.WARN, "The time column '" + column.strip() + "' was read in "
                + readAs + (given == null ? " (the default)" : "") + ", but its name suggests " + suggested + ": if its"
                + " numbers are in " + suggested + ", every time constant and dead time above is off by the same"
                + " factor; give --time-unit with the column's unit and fit again.");
    }

    private static List<DataFinding> with(List<DataFinding> findings, DataFinding added) {
        List<DataFinding> all = new java.util.ArrayList<>(findings);
        all.add(added);
        all.sort((a, b) -> b.severity().compareTo(a.severity()));
        return all;
    }

    private static boolean failed(List<DataFinding> findings) {
        return findings.stream().anyMatch(f -> f.severity() == Severity.FAIL);
    }
}
