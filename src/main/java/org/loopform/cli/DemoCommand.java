package org.loopform.cli;

import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.audit.InputFile;
import org.loopform.audit.LoopDefaults;
import org.loopform.audit.AuditRecords;
import org.loopform.io.RecordFolder;
import org.loopform.io.TrendColumns;
import org.loopform.io.CatalogLoader;
import org.loopform.io.Fingerprint;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Severity;
import org.loopform.form.FormDefinition;
import org.loopform.io.FormFileReader;
import org.loopform.io.LoopCsvReader;
import org.loopform.report.Cautions;
import org.loopform.report.ChainSection;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code loopform demo}: the audit of the bundled, invented Plant K-7 migration. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Audits the bundled example (an invented plant's migration, examples/plant-k7-loops.csv, into"
                + " the invented target form examples/plant-k7-target.yaml) and writes the report into"
                + " ./loopform-demo/ (or --out). The report also takes one new loop, TIC-104, from its invented bump test"
                + " (examples/records/tic-104-bump.csv) through fit, a published tuning rule (SIMC PI), the target form"
                + " and the check."},
        footer = {"", Cautions.SHORT})
final class DemoCommand implements Callable<Integer> {

    static final String LOOPS = "examples/plant-k7-loops.csv";
    static final String TARGET = "examples/plant-k7-target.yaml";
    /** The bundled, invented records the demo replays (one TAG.csv per loop that has one). */
    static final String RECORDS = "examples/records/replay";

    @Spec
    CommandSpec spec;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "loopform-demo",
            description = "Where to write the report (default: ${DEFAULT-VALUE}); an earlier loopform output there is"
                    + " replaced, a folder loopform did not write never is.")
    Path out;

    @Mixin
    FormatOption format;

    @Mixin
    SignOffOptions signOffOptions;

    @Override
    public Integer call() throws Exception {
        String targetText = resource(TARGET);
        FormDefinition target = FormFileReader.parse(targetText, TARGET);
        List<InputFile> files = List.of(
                new InputFile("loop list", LOOPS + " (bundled)", Fingerprint.sha256(resourceBytes(LOOPS))),
                new InputFile("form", TARGET + " (bundled)", Fingerprint.sha256(resourceBytes(TARGET))),
                new InputFile("record", DemoChain.RECORD + " (bundled, invented)",
                        Fingerprint.sha256(resourceBytes(DemoChain.RECORD))));
        // the new loop TIC-104, from its invented bump test to a checked tuning, in a section of its own
        ChainSection.Chain chain = DemoChain.run(target);
        try (InputStream in = DemoCommand.class.getClassLoader().getResourceAsStream(LOOPS);
             LoopCsvReader rows = LoopCsvReader.of(in, LOOPS, null,
                     new LoopDefaults(target, null))) {
            // replaces an earlier demo (a folder loopform wrote, with its marker), never a folder of the user's
            int code = AuditRunner.run(rows, new AuditRunner.Settings(LOOPS + " (bundled, invented)", out, true, true,
                    CheckPolicy.DEFAULT, Severity.FAIL, format.format, Runtime.getRuntime().availableProcessors(),
                    List.of(), "target " + target.id() + " (invented), scans from the list, default policy, records from "
                    + RECORDS + " (invented)",
                    AuditRunner.Progress.UNKNOWN, signOffOptions.signOff(), files, CatalogLoader.formReadMark())
                    .withRecords(records()), spec.commandLine().getOut(), spec.commandLine().getErr(),
                    ChainSection.html(chain), chain);
            if (format.format == OutputFormat.text) {
                spec.commandLine().getOut().print(System.lineSeparator() + ChainSection.summaryText(chain));
                spec.commandLine().getOut().println("Open " + out.resolve("report.html").toAbsolutePath()
                        + " in a browser. The plant and its loops are invented for this demonstration.");
                spec.commandLine().getOut().flush();
            }
            // the demo shows loops that fail on purpose; that is its point, not an error of the run
            return code == ExitCodes.BAD_INPUT ? code : ExitCodes.OK;
        }
    }

    /** The bundled records, read from the jar as the audit asks for each tag. */
    static AuditRecords records() {
        String shown = RECORDS + " (bundled, invented)";
        return new AuditRecords(RecordFolder.ofText(RECORDS, tag -> {
            try (InputStream in = DemoCommand.class.getClassLoader().getResourceAsStream(RECORDS + "/" + tag + ".csv")) {
                return in == null ? null : new String(in.readAllBytes(), StandardCharsets.UTF_8);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException("the bundled record of " + tag + " cannot be read", e);
            }
        }, TrendColumns.DEFAULT), shown, CatalogLoader.bundled().all());
    }

    private static String resource(String name) throws java.io.IOException {
        return new String(resourceBytes(name), StandardCharsets.UTF_8);
    }

    private static byte[] resourceBytes(String name) throws java.io.IOException {
        try (InputStream in = DemoCommand.class.getClassLoader().getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("the bundled example " + name + " is missing from the jar");
            }
            return in.readAllBytes();
        }
    }
}
