package org.loopform.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.LoopRow;
import org.loopform.check.LoopSpec;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.form.FormDefinition;
import org.loopform.io.AtomicFiles;
import org.loopform.io.CatalogLoader;
import org.loopform.io.FolderOutput;
import org.loopform.io.InputException;
import org.loopform.io.LoopCsvReader;
import org.loopform.io.LoopFileReader;
import org.loopform.io.LoopXlsxReader;
import org.loopform.io.PolicyFileReader;
import org.loopform.io.TrendColumns;
import org.loopform.io.TrendCsvReader;
import org.loopform.replay.LoopReplay;
import org.loopform.replay.ReplayResult;
import org.loopform.report.Cautions;
import org.loopform.report.ReplayCsv;
import org.loopform.report.ReplayPlot;
import org.loopform.report.ReplayReport;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform replay}: the old and the new controller run open loop on a logged record. */
@Command(name = "replay", mixinStandardHelpOptions = true,
        description = {"Runs the old controller as listed (form, tuning, scan) on a record's logged setpoint and PV"
                + " and compares its output with the logged one (as found); when they disagree, tries other readings"
                + " of the list (units, action, filter, scan, other catalog forms) and reports those that reproduce"
                + " the log best. Then runs the target as it will be entered on the same signals (as left) and"
                + " reports how its output would differ. Open loop: the PV is the logged one."},
        footer = {"", "LIST may be a CSV, .xlsx (with --sheet) or YAML loop list, read as 'audit' reads it.",
                "", "RECORD is a CSV with a header: time (seconds or ISO-8601 timestamps), setpoint, pv, output in"
                + " the loop's ranges, optional mode (auto/manual/cascade) and tracking (on/off). Empty cells are"
                + " points not logged. With --list, RECORD is a folder holding one TAG.csv per loop.",
                "", "Exit codes: 0 nothing failed; 1 a finding of severity fail; 2 bad input.", "", Cautions.SHORT})
final class ReplayCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(paramLabel = "RECORD", description = "The record (CSV), or with --list the folder of TAG.csv records.")
    Path record;

    @Option(names = "--loop", paramLabel = "LOOP.yaml", description = "The loop file (one loop).")
    Path loopFile;

    @Option(names = "--list", paramLabel = "LIST", description = "A loop list (CSV, .xlsx or YAML) replayed against RECORD/TAG.csv.")
    Path listFile;

    @Mixin
    RecordColumnOptions columnOptions;

    @Mixin
    SheetOption sheetOption;

    @Option(names = "--plot", paramLabel = "FILE.svg", description = "Write an SVG of the logged output and both replays (one loop).")
    Path plot;

    @Option(names = "--to", paramLabel = "ID|FILE", description = "Target form for every loop (replaces the list's"
            + " target_form and the loop file's target form).")
    String to;

    @Option(names = "--out", paramLabel = "DIR", description = "Write replay.csv (one row a loop) and replay.json"
            + " into DIR (a new folder, or loopform's own earlier output with --force).")
    Path outDir;

    @Option(names = "--force", description = "Replace an earlier loopform output in the --out folder.")
    boolean force;

    @Option(names = "--fit-tuning", description = "Also fit the old controller's gain, integral and derivative values"
            + " (in its form's units) to the logged output by least squares, with 95 %% intervals.")
    boolean fitTuning;

    @Option(names = "--policy", paramLabel = "FILE", description = "A YAML file of thresholds (the replay_* keys among them; see 'loopform check --help').")
    Path policyFile;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        if (sheetOption.sheet != null && listFile == null) {
            throw new org.loopform.units.UnitException("--sheet: applies to an .xlsx loop list given with --list;"
                    + " leave --sheet out, or give --list LIST.xlsx");
        }
        if ((loopFile == null) == (listFile == null)) {
            throw new InputException("replay: give exactly one of --loop LOOP.yaml (RECORD is a file) or --list LIST"
                    + " (RECORD is a folder of TAG.csv records)");
        }
        LoopDefaults defaults = to == null ? LoopDefaults.NONE
                : new LoopDefaults(CatalogLoader.resolve(to, "--to"), null);
        CheckPolicy policy = policyFile == null ? CheckPolicy.DEFAULT
                : PolicyFileReader.read(policyFile, policyFile.toString());
        TrendColumns columns = columnOptions.columns();
        List<FormDefinition> catalog = CatalogLoader.bundled().all();
        var out = spec.commandLine().getOut();
        boolean json = format.format == OutputFormat.json;
        if (loopFile != null) {
            LoopSpec loop = defaults.apply(LoopFileReader.readOne(loopFile, loopFile.toString()));
            ReplayResult r = LoopReplay.run(loop, TrendCsvReader.read(record, record.toString(), columns), catalog,
                    policy, fitTuning);
            if (plot != null) {
                AtomicFiles.write(plot, AtomicFiles.markedSvg(ReplayPlot.svg(r)), List.of(record, loopFile));
            }
            Path written = outDir == null ? null
                    : writeFolder(List.of(r), List.of(), List.of(), List.of(record, loopFile));
            out.print(json ? ReplayReport.json(r) : ReplayReport.text(r) + System.lineSeparator()
                    + Cautions.SHORT + System.lineSeparator());
            if (plot != null && !json) {
                out.println("Plot written to " + plot);
            }
            if (written != null && !json) {
                out.println("Replay summary written to " + written);
            }
            out.flush();
            return r.verdict() == Severity.FAIL ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
        }
        if (plot != null) {
            throw new InputException("--plot: draws one loop; use it with --loop");
        }
        sheetOption.checkApplies(listFile.toString());
        if (!Files.isDirectory(record)) {
            throw new InputException(record + ": with --list, RECORD is a folder holding one TAG.csv per loop");
        }
        List<ReplayResult> results = new ArrayList<>();
        List<String> missing = new ArrayList<>();
        List<String> notUsed = new ArrayList<>();
        List<String> bad = new ArrayList<>();
        for (Iterator<LoopRow> it = rows(defaults); it.hasNext(); ) {
            LoopRow row = it.next();
            if (!row.ok()) {
                bad.addAll(row.problems());
                continue;
            }
            Path file = record.resolve(row.tag() + ".csv");
            if (!Files.isRegularFile(file)) {
                missing.add(row.tag());
                continue;
            }
            if (row.tunedByRule()) {
                notUsed.add(row.tag()); // a new loop: no old controller ran that the record could validate
                continue;
            }
            try {
                results.add(LoopReplay.run(row.loop(), TrendCsvReader.read(file, file.toString(), columns), catalog,
                        policy, fitTuning));
            } catch (org.loopform.units.BadInput e) {
                bad.addAll(e.problems());
            }
        }
        Path written = outDir == null || results.isEmpty() && missing.isEmpty() && notUsed.isEmpty() ? null
                : writeFolder(results, missing, notUsed, List.of(record, listFile));
        out.print(json ? ReplayReport.json(results, missing, notUsed) : ReplayReport.text(results, missing, notUsed)
                + System.lineSeparator() + Cautions.SHORT + System.lineSeparator());
        if (written != null && !json) {
            out.println("Replay summary written to " + written);
        }
        out.flush();
        if (!bad.isEmpty()) {
            bad.forEach(b -> spec.commandLine().getErr().println("loopform: " + b));
            return ExitCodes.BAD_INPUT;
        }
        return results.stream().anyMatch(r -> r.verdict() == Severity.FAIL) ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    private Path writeFolder(List<ReplayResult> results, List<String> missing, List<String> notUsed,
                             List<Path> inputs) {
        java.util.Map<String, String> files = new java.util.LinkedHashMap<>();
        files.put("replay.csv", ReplayCsv.csv(results, missing, notUsed));
        files.put("replay.json", ReplayReport.json(results, missing, notUsed));
        return FolderOutput.write(outDir, force, files, inputs);
    }

    private Iterator<LoopRow> rows(LoopDefaults defaults) {
        String lower = listFile.getFileName().toString().toLowerCase(Locale.ROOT);
        if (lower.endsWith(".yaml") || lower.endsWith(".yml")) {
            return LoopFileReader.rows(listFile, listFile.toString(), defaults).iterator();
        }
        List<LoopRow> rows = new ArrayList<>();
        if (SheetOption.isXlsx(lower)) {
            // the reader audit uses: the same columns and checks, every message with its file:sheet!cell
            try (LoopXlsxReader reader = LoopXlsxReader.open(listFile, listFile.toString(), sheetOption.sheet,
                    defaults)) {
                spec.commandLine().getErr().println("loopform: " + listFile + ": reading " + reader.description());
                spec.commandLine().getErr().flush();
                reader.forEachRemaining(rows::add);
            }
            return rows.iterator();
        }
        try (LoopCsvReader reader = LoopCsvReader.open(listFile, listFile.toString(), defaults)) {
            reader.forEachRemaining(rows::add);
        }
        return rows.iterator();
    }
}
