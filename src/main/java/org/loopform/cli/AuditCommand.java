package org.loopform.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.loopform.audit.InputFile;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.SignOff;
import org.loopform.audit.AuditRecords;
import org.loopform.io.RecordFolder;
import org.loopform.io.Fingerprint;
import org.loopform.audit.LoopRow;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.form.FormDefinition;
import org.loopform.io.CatalogLoader;
import org.loopform.io.LoopCsvReader;
import org.loopform.io.LoopXlsxReader;
import org.loopform.io.LoopYamlReader;
import org.loopform.io.PolicyFileReader;
import org.loopform.report.Cautions;
import org.loopform.units.Numbers;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform audit}: a whole loop list carried to the target and checked, with a report to sign. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = {"Converts and checks every loop of a migration (a CSV, xlsx or YAML loop list), in parallel, and"
                + " writes loops.csv, loops.json, entry-sheet.csv and report.html into --out."},
        footer = {"", "CSV header (snake_case, any order): tag, form, kc|pb|kp, ti|reset|ki, td|kd, n, b, c, action,"
                + " scan, pv_range, output_range, model, process_gain, time_constant, time_constant_2, dead_time,"
                + " target_form, target_scan. Empty cells are absent; cells may carry units (30s). An .xlsx"
                + " workbook holds the same columns on a sheet, under a header row that may have title rows above it.",
                "", "Exit codes: 0 no fail; 1 a fail (or a warn with --fail-on warn); 2 bad input (bad rows are"
                + " reported by file, line and field, the other loops are still checked and written).",
                "", Cautions.SHORT})
final class AuditCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Parameters(paramLabel = "LOOPS", description = "The loop list: .csv, .xlsx, or .yaml/.yml with a 'loops:' list.")
    Path input;

    @Mixin
    SheetOption sheetOption;

    @Option(names = "--to", paramLabel = "ID|FILE", description = "Target form for every loop (overrides the list).")
    String to;

    @Option(names = "--scan", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Target scan time for every loop (overrides the list).")
    Double scanSeconds;

    @Option(names = "--out", paramLabel = "DIR", description = "Write the outputs into DIR (created whole at the end).")
    Path out;

    @Option(names = "--force", description = "Replace DIR if it holds an earlier loopform output (loopform never"
            + " replaces a folder it did not write: one without its .loopform-output marker, or with other files).")
    boolean force;

    @Option(names = "--no-report", negatable = false, description = "Skip report.html (CSV and JSON only).")
    boolean noReport;

    @Option(names = "--fail-on", paramLabel = "warn|fail", defaultValue = "fail",
            description = "Exit 1 on loops with this verdict or worse (default: ${DEFAULT-VALUE}).")
    String failOn;

    @Option(names = "--policy", paramLabel = "FILE", description = "Thresholds overriding the defaults (see 'check').")
    Path policyFile;

    @Option(names = "--records", paramLabel = "DIR", description = "A folder of logged records, one TAG.csv per loop"
            + " (columns time, setpoint, pv, output, optional mode and tracking, or those named by --time, --setpoint,"
            + " --pv, --output, --mode, --tracking; see 'loopform replay --help'): each loop with a record is also"
            + " replayed, as found and as left, and its findings join the loop's. A record that matches no loop of"
            + " the list is named once.")
    Path recordsDir;

    @Mixin
    RecordColumnOptions recordColumns;

    @Option(names = "--fit-tuning", description = "With --records: also fit each replayed loop's old gain, integral"
            + " and derivative values (in its form's units) to its logged output by least squares, with 95 %% intervals.")
    boolean fitTuning;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all cores).")
    Integer threads;

    @Mixin
    FormatOption format;

    @Mixin
    SignOffOptions signOffOptions;

    private List<InputFile> files = List.of();
    private SignOff signOff = SignOff.BLANK;
    private long formReadMark;
    private AuditRecords records;

    @Override
    public Integer call() {
        formReadMark = CatalogLoader.formReadMark();
        Severity fail = Severity.parse(failOn).filter(x -> x != Severity.INFO).orElseThrow(() ->
                new org.loopform.units.UnitException("--fail-on: must be warn or fail (got '" + failOn + "')"));
        FormDefinition target = to == null ? null : CatalogLoader.resolve(to, "--to");
        LoopDefaults defaults = new LoopDefaults(target, scanSeconds);
        CheckPolicy policy = policyFile == null ? CheckPolicy.DEFAULT
                : PolicyFileReader.read(policyFile, policyFile.toString());
        String name = input.toString();
        String lower = name.toLowerCase(Locale.ROOT);
        boolean xlsx = SheetOption.isXlsx(name);
        sheetOption.checkApplies(name);
        if (recordsDir == null) {
            String given = fitTuning ? "--fit-tuning" : RecordColumnOptions.firstGiven(spec.commandLine().getParseResult());
            if (given != null) {
                throw new org.loopform.units.UnitException(given + ": applies to the records of --records only; give"
                        + " --records DIR (one TAG.csv per loop), or leave " + given + " out");
            }
        }
        List<Path> inputs = new ArrayList<>(List.of(input));
        if (policyFile != null) {
            inputs.add(policyFile);
        }
        if (to != null && CatalogLoader.bundled().find(to).isEmpty()) {
            inputs.add(Path.of(to));
        }
        List<InputFile> files = new ArrayList<>();
        files.add(new InputFile("loop list", name, Fingerprint.sha256(input, name)));
        if (to != null && CatalogLoader.bundled().find(to).isEmpty()) {
            files.add(new InputFile("form", to, Fingerprint.sha256(Path.of(to), to)));
        }
        if (policyFile != null) {
            files.add(new InputFile("policy", policyFile.toString(), Fingerprint.sha256(policyFile,
                    policyFile.toString())));
        }
        SignOff signOff = signOffOptions.signOff();
        if (signOffOptions.file != null) {
            files.add(new InputFile("sign-off", signOffOptions.file.toString(),
                    Fingerprint.sha256(signOffOptions.file, signOffOptions.file.toString())));
            inputs.add(signOffOptions.file);
        }
        if (recordsDir != null) {
            RecordFolder folder = RecordFolder.open(recordsDir, recordsDir.toString(), recordColumns.columns());
            records = new AuditRecords(folder, recordsDir.toString(), CatalogLoader.bundled().all(), fitTuning);
            inputs.add(recordsDir);
        }
        this.files = files;
        this.signOff = signOff;
        String settings = (to != null ? "target " + target.id() : "targets from the list")
                + (scanSeconds != null ? ", scan " + Numbers.plain(scanSeconds) + " s" : "")
                + (policyFile != null ? ", policy " + policyFile : ", default policy")
                + (recordsDir != null ? ", records from " + recordsDir + (fitTuning ? ", old tunings fitted to them" : "")
                : "");
        int n = threads != null ? Math.max(1, threads) : Runtime.getRuntime().availableProcessors();
        // progress by bytes read: a pipe (/dev/stdin) can be read only once, so it is never counted ahead
        long size = Files.isRegularFile(input) ? sizeOf(input) : -1;
        if (lower.endsWith(".yaml") || lower.endsWith(".yml")) {
            try (LoopYamlReader reader = LoopYamlReader.open(input, name, defaults)) {
                return AuditRunner.run(reader, settings(name, fail, policy, n, inputs, settings,
                        AuditRunner.Progress.bytes(size, reader::bytesRead)), spec.commandLine().getOut(),
                        spec.commandLine().getErr());
            }
        }
        if (xlsx) {
            try (LoopXlsxReader reader = LoopXlsxReader.open(input, name, sheetOption.sheet, defaults)) {
                spec.commandLine().getErr().println("loopform: " + name + ": reading " + reader.description());
                spec.commandLine().getErr().flush();
                return AuditRunner.run(reader, settings(name, fail, policy, n, inputs, settings + ", sheet "
                        + reader.sheetName(), AuditRunner.Progress.UNKNOWN), spec.commandLine().getOut(),
                        spec.commandLine().getErr());
            }
        }
        try (LoopCsvReader reader = LoopCsvReader.open(input, name, defaults)) {
            Iterator<LoopRow> rows = reader;
            return AuditRunner.run(rows, settings(name, fail, policy, n, inputs, settings,
                    AuditRunner.Progress.bytes(size, reader::bytesRead)), spec.commandLine().getOut(),
                    spec.commandLine().getErr());
        }
    }

    private AuditRunner.Settings settings(String name, Severity fail, CheckPolicy policy, int n, List<Path> inputs,
                                          String settings, AuditRunner.Progress progress) {
        return new AuditRunner.Settings(name, out, force, !noReport, policy, fail, format.format, n, inputs, settings,
                progress, signOff, files, formReadMark).withRecords(records);
    }

    private static long sizeOf(Path p) {
        try {
            return Files.size(p);
        } catch (java.io.IOException e) {
            return -1;
        }
    }
}
