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
                "  loopform fit bump.csv --time time --output out --pv pv",
                "  loopform fit bump.csv --pv-range 0..150 --out-range 0..100 --write-process tic104-process.yaml",
                "", "Exit codes: 0 done; 1 the record cannot support a model (a finding of severity fail); 2 bad"
                        + " input.", "", Cautions.SHORT})
final class FitCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(paramLabel = "RECORD.csv", description = "The record: CSV with a header row.")
    Path record;

    @Option(names = "--time", paramLabel = "COLUMN", defaultValue = "time",
            description = "Time column: seconds or ISO-8601 timestamps (default: ${DEFAULT-VALUE}).")
    String time;

    @Option(names = "--output", paramLabel = "COLUMN", defaultValue = "output",
            description = "Controller output column (default: ${DEFAULT-VALUE}).")
    String output;

    @Option(names = "--pv", paramLabel = "COLUMN", defaultValue = "pv",
            description = "PV column (default: ${DEFAULT-VALUE}).")
    String pv;

    @Option(names = "--pv-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "PV range when the record is in engineering units (else the PV is % of span).")
    Span pvRange;

    @Option(names = "--out-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "Output range when the record is in engineering units (else the output is %).")
    Span outRange;

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
        PlantRecord r = RecordCsvReader.read(record, record.toString(), time, output, pv, outRange, pvRange);
        var out = spec.commandLine().getOut();
        boolean json = format.format == OutputFormat.json;
        if (relay && plot != null) {
            throw new InputException("--plot: draws a step test's fits; leave it out with --relay");
        }
        if (relay) {
            RelayResult rr = RelayAnalysis.analyze(r);
            out.print(json ? FitReport.relayJson(rr) : FitReport.relayText(rr));
            out.flush();
            return failed(rr.findings()) ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
        }
        StepTestResult res = StepIdentification.identify(r, pvRange != null && outRange != null);
        ModelFit best = res.recommendedFit();
        // the plot first: its checks (a file loopform did not write) can still refuse; the process file's were made
        if (plot != null) {
            AtomicFiles.write(plot, AtomicFiles.markedSvg(FitPlot.svg(r, res)), List.of(record));
        }
        if (writeProcess != null && best != null) {
            AtomicFiles.write(writeProcess, FitReport.processBlock(best, record.getFileName().toString()),
                    List.of(record));
        }
        out.print(json ? FitReport.json(res) : FitReport.text(res));
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

    private static boolean failed(List<DataFinding> findings) {
        return findings.stream().anyMatch(f -> f.severity() == Severity.FAIL);
    }
}
