package org.loopform.cli;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import org.loopform.findings.ActionRule;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.ConversionRules;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.form.Conversion;
import org.loopform.form.Converter;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.WritingContext;
import org.loopform.io.CatalogLoader;
import org.loopform.io.ProcessReader;
import org.loopform.process.ProcessModel;
import org.loopform.report.Cautions;
import org.loopform.units.Span;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform convert}: one tuning from one form to another. */
@Command(name = "convert", mixinStandardHelpOptions = true,
        description = {"Converts a tuning from one controller form to another: exactly where the target can write the"
                + " same law, otherwise the nearest setting with its deviation and findings."},
        footer = {"", "Examples:",
                "  loopform convert --from ideal --to ideal-pb-repeats kc=1.2 ti=60 td=4",
                "  loopform convert --from series-pb-min --to ideal pb=80 ti=2.5min td=0.4 action=reverse",
                "  loopform convert --from ideal --to parallel-eu kc=1.5 ti=90s td=0 --pv-range 0..150 --out-range 0..100",
                "  loopform convert --from ideal --to ideal-pb-repeats kc=2 ti=60 td=0 --process \"{model: fopdt, gain: -1,"
                        + " time_constant: 60 s, dead_time: 5 s}\"",
                "", "Values may carry a unit that overrides the form's: ti=90s, td=0.5min, reset=2/min, pb=40%%.",
                "Exit codes: 0 done; 1 a finding of severity fail (for example a value beyond the target's limits);"
                        + " 2 bad input.", "", Cautions.SHORT})
final class ConvertCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--from", required = true, paramLabel = "ID|FILE", description = "Source form: a catalog id"
            + " (see 'loopform forms') or a form file.")
    String from;

    @Option(names = "--to", required = true, paramLabel = "ID|FILE", description = "Target form: a catalog id or a"
            + " form file.")
    String to;

    @Parameters(paramLabel = "NAME=VALUE", arity = "1..*", description = "The tuning in the source form, e.g."
            + " kc=1.2 ti=60 td=4.")
    List<String> values;

    @Option(names = "--pv-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "PV range in engineering units (needed by engineering-unit forms).")
    Span pvRange;

    @Option(names = "--out-range", paramLabel = "LO..HI", converter = SpanConverter.class,
            description = "Output range in engineering units (needed by engineering-unit forms).")
    Span outRange;

    @Option(names = "--scan", paramLabel = "DURATION", converter = DurationConverter.class,
            description = "Scan time, e.g. 0.5s or 1min (needed by per-scan forms; also bounds the compared band).")
    Double scanSeconds;

    @Option(names = "--process", paramLabel = "MODEL", description = "The process, when known: an inline mapping"
            + " such as \"{model: fopdt, gain: -1, time_constant: 60 s, dead_time: 5 s}\" or a YAML file with the same"
            + " keys as a loop file's process block. The controller's action is then checked against the process's"
            + " direction.")
    String process;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        FormDefinition source = CatalogLoader.resolve(from, "--from");
        FormDefinition target = CatalogLoader.resolve(to, "--to");
        Map<String, String> raw = parse(values);
        Conversion c = Converter.convert(source, raw, target, new WritingContext(pvRange, outRange, scanSeconds));
        List<Finding> findings = new java.util.ArrayList<>(ConversionRules.findings(c, CheckPolicy.DEFAULT));
        if (process != null) {
            ProcessModel p = ProcessReader.fromOption(process, "--process", pvRange, outRange);
            ActionRule.check(c.sourceLaw().terms(), p.lowFrequencyGain(), p.integrators()).ifPresent(findings::add);
        }
        var out = spec.commandLine().getOut();
        out.print(format.format.renderer().conversion(c, findings, raw));
        out.flush();
        return Finding.worst(findings) == Severity.FAIL ? ExitCodes.FAILED_FINDING : ExitCodes.OK;
    }

    static Map<String, String> parse(List<String> pairs) {
        Map<String, String> m = new LinkedHashMap<>();
        for (String pair : pairs) {
            int eq = pair.indexOf('=');
            if (eq <= 0 || eq == pair.length() - 1) {
                throw new FormException("'" + pair + "': write each value as NAME=VALUE, for example kc=1.2 or ti=90s");
            }
            String name = pair.substring(0, eq).trim().toLowerCase(java.util.Locale.ROOT);
            if (m.put(name, pair.substring(eq + 1).trim()) != null) {
                throw new FormException(name + ": given twice; give each parameter once");
            }
        }
        return m;
    }

    static String expects(FormDefinition f) {
        return FormCodec.expects(f);
    }
}
