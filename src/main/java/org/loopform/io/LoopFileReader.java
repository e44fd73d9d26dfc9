package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.loopform.check.LoopSpec;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.WritingContext;
import org.loopform.process.ProcessModel;
import org.loopform.tuning.PublishedTuning;
import org.loopform.units.Span;

/**
 * Reads loop files: one loop block ({@code tag}, {@code process}, {@code tuning}, {@code target},
 * {@code ranges}) or a list of them under {@code loops:}. Every error names file, line and field.
 */
public final class LoopFileReader {

    private static final Set<String> LOOP_KEYS = Set.of("tag", "process", "tuning", "target", "ranges");

    private LoopFileReader() {
    }

    /** The single loop in {@code path} (a file with a {@code loops:} list must hold exactly one). */
    public static LoopSpec readOne(Path path, String shownName) {
        List<LoopSpec> loops = readAll(path, shownName);
        if (loops.size() != 1) {
            throw new InputException(shownName + ":1: expected one loop (got " + loops.size() + "); 'check' takes one"
                    + " loop, 'audit' takes a list");
        }
        return loops.get(0);
    }

    public static List<LoopSpec> readAll(Path path, String shownName) {
        return fromRoot(YamlSource.read(path, shownName));
    }

    public static List<LoopSpec> parseAll(String text, String shownName) {
        return fromRoot(YamlSource.parse(text, shownName));
    }

    private static List<LoopSpec> fromRoot(YamlNode root) {
        if (!root.isMapping()) {
            throw new InputException(root.where() + "a loop file is a mapping with tag, process, tuning, target and "
                    + "ranges, or a list of such blocks under 'loops:'");
        }
        if (root.get("loops").isPresent()) {
            List<String> problems = new ArrayList<>(root.unknownKeys(Set.of("loops")));
            List<LoopSpec> loops = new ArrayList<>();
            for (YamlNode item : root.get("loops").get().items()) {
                try {
                    loops.add(loop(item));
                } catch (InputException e) {
                    problems.addAll(e.problems());
                }
            }
            if (!problems.isEmpty()) {
                throw new InputException(problems);
            }
            return loops;
        }
        return List.of(loop(root));
    }

    /**
     * The loops of a YAML loop list as rows, in order: a block that cannot be read becomes a bad
     * row with its problems, and so does a repeated tag; file-level problems are thrown. Reads the
     * whole list into memory; {@link LoopYamlReader} streams it.
     */
    public static List<org.loopform.audit.LoopRow> rows(Path path, String shownName,
                                                         org.loopform.audit.LoopDefaults defaults) {
        List<org.loopform.audit.LoopRow> rows = new ArrayList<>();
        try (LoopYamlReader r = LoopYamlReader.open(path, shownName, defaults)) {
            r.forEachRemaining(rows::add);
        }
        return rows;
    }

    /** Reads one loop block. */
    public static LoopSpec loop(YamlNode n) {
        Read read = read(n, false);
        if (read.byRule() != null) {
            YamlNode at = n.get("tuning").flatMap(t -> t.get(RuleCells.RULE)).orElse(n);
            throw new InputException(at.where() + "a tuning by rule is read in audit loop lists; for one loop run"
                    + " 'loopform tune --process FILE --rule " + read.byRule().rule().id() + " --scan DURATION --to"
                    + " FORM', or give the tuning values here");
        }
        return read.spec();
    }

    /** A loop block read: its loop, and the rule's tuning when its tuning block names a rule (else null). */
    record Read(LoopSpec spec, org.loopform.tuning.PublishedTuning byRule) {
    }

    static Read read(YamlNode n, boolean targetOptional) {
        List<String> problems = new ArrayList<>(n.unknownKeys(LOOP_KEYS));
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        Map<String, YamlNode> e = n.entries();
        String tag = required(n, e, "tag").text().trim();
        Span pv = null;
        Span out = null;
        if (e.containsKey("ranges")) {
            YamlNode r = e.get("ranges");
            List<String> bad = r.unknownKeys(Set.of("pv", "output"));
            if (!bad.isEmpty()) {
                throw new InputException(bad);
            }
            pv = span(r, "pv");
            out = span(r, "output");
        }
        YamlNode tuning = required(n, e, "tuning");
        Map<String, String> t = scalars(tuning);
        if (RuleCells.any(t.keySet())) {
            return byRule(n, e, tuning, t, tag, pv, out, targetOptional);
        }
        String fromId = t.remove("form");
        if (fromId == null) {
            throw new InputException(tuning.where() + "form: required; a catalog id or a form file path");
        }
        FormDefinition from = resolveForm(tuning, "form", fromId);
        Double sourceScan = t.containsKey("scan") ? seconds(tuning, "scan", t.remove("scan")) : null;
        if (targetOptional && !e.containsKey("target")) {
            checkTuning(tuning, from, t, new WritingContext(pv, out, sourceScan));
            return new Read(new LoopSpec(tag, process(n, e, pv, out), from, t, sourceScan, from, null, pv, out,
                    n.file() + ":" + n.line()), null);
        }
        YamlNode target = required(n, e, "target");
        FormDefinition to = targetForm(target);
        Double targetScan = targetScan(target);
        checkTuning(tuning, from, t, new WritingContext(pv, out, sourceScan != null ? sourceScan : targetScan));
        return new Read(new LoopSpec(tag, process(n, e, pv, out), from, t, sourceScan, to, targetScan, pv, out,
                n.file() + ":" + n.line()), null);
    }

    private static FormDefinition targetForm(YamlNode target) {
        Map<String, String> tg = scalars(target);
        List<String> badTarget = target.unknownKeys(Set.of("form", "scan"));
        if (!badTarget.isEmpty()) {
            throw new InputException(badTarget);
        }
        if (!tg.containsKey("form")) {
            throw new InputException(target.where() + "form: required; a catalog id or a form file path");
        }
        return resolveForm(target, "form", tg.get("form"));
    }

    private static Double targetScan(YamlNode target) {
        Map<String, String> tg = scalars(target);
        return tg.containsKey("scan") ? seconds(target, "scan", tg.get("scan")) : null;
    }

    /**
     * A new loop whose tuning block names a rule ({@code tuning: {rule: simc, controller: pi, tau_c: 10 s}}):
     * the rule's tuning of the loop's process, in the form the rule publishes it.
     */
    private static Read byRule(YamlNode n, Map<String, YamlNode> e, YamlNode tuning, Map<String, String> t, String tag,
                               Span pv, Span out, boolean targetOptional) {
        Map<String, String> ruleKeys = new LinkedHashMap<>();
        RuleCells.KEYS.stream().filter(t::containsKey).forEach(k -> ruleKeys.put(k, t.remove(k)));
        boolean formGiven = t.remove("form") != null;
        ProcessModel process = process(n, e, pv, out);
        PublishedTuning published = RuleCells.tuning(ruleKeys, t.keySet(), formGiven, process,
                key -> key.equals("model") ? e.getOrDefault("process", n).where()
                        : tuning.get(key.replaceFirst("^tuning\\.", "")).map(YamlNode::where)
                        .orElse(tuning.where() + key + ": "),
                "tuning.form", "a process block, such as process: {model: fopdt, gain: 2, time_constant: 60 s,"
                        + " dead_time: 10 s}");
        FormDefinition from = PublishedForm.form(published, "tuning.rule");
        FormDefinition to = from;
        Double targetScan = null;
        if (!targetOptional || e.containsKey("target")) {
            YamlNode target = required(n, e, "target");
            to = targetForm(target);
            targetScan = targetScan(target);
        }
        return new Read(new LoopSpec(tag, process, from, PublishedForm.values(published), null, to, targetScan, pv,
                out, n.file() + ":" + n.line()), published);
    }

    private static ProcessModel process(YamlNode n, Map<String, YamlNode> e, Span pv, Span out) {
        ProcessModel process = null;
        if (e.containsKey("process")) {
            YamlNode p = e.get("process");
            process = ProcessReader.fromNode(p, pv, out);
        }
        return process;
    }

    /**
     * Decodes the tuning once while its lines are known, so a bad parameter is reported at its own
     * line rather than the loop's. Problems that depend on what the command line adds (a scan time
     * given by --scan) are left for the check to report.
     */
    private static void checkTuning(YamlNode tuning, FormDefinition form, Map<String, String> values,
                                    WritingContext ctx) {
        try {
            FormCodec.decode(form, values, ctx, "tuning");
        } catch (FormException e) {
            String message = e.getMessage();
            for (String key : values.keySet()) {
                if (message.startsWith(key + ": ")) {
                    throw new InputException(tuning.get(key).orElse(tuning).where()
                            + message.substring(key.length() + 2));
                }
                if (message.startsWith("unknown parameter '" + key + "'")) {
                    throw new InputException(tuning.get(key).orElse(tuning).where() + message);
                }
            }
            if (message.startsWith("missing parameter")) {
                throw new InputException(tuning.where() + message);
            }
        }
    }

    private static YamlNode required(YamlNode n, Map<String, YamlNode> e, String key) {
        YamlNode v = e.get(key);
        if (v == null) {
            throw new InputException(n.file() + ":" + n.line() + ": " + (n.path().isEmpty() ? "" : n.path() + ".")
                    + key + ": required in a loop block (tag, tuning, target; process and ranges optional)");
        }
        return v;
    }

    private static Map<String, String> scalars(YamlNode n) {
        Map<String, String> m = new LinkedHashMap<>();
        n.entries().forEach((k, v) -> m.put(k, v.text()));
        return m;
    }

    private static FormDefinition resolveForm(YamlNode block, String key, String idOrPath) {
        try {
            return LoopFields.form(idOrPath, Path.of(block.file()).toAbsolutePath().getParent(), "form");
        } catch (InputException ex) {
            YamlNode at = block.get(key).orElse(block);
            throw new InputException(at.where() + ex.getMessage().replaceFirst("^form: ", ""));
        }
    }

    private static Span span(YamlNode r, String key) {
        if (r.get(key).isEmpty()) {
            return null;
        }
        YamlNode v = r.get(key).get();
        return LoopFields.span(v.text(), v.where());
    }

    private static double seconds(YamlNode block, String key, String text) {
        return LoopFields.positiveSeconds(text, block.get(key).orElse(block).where());
    }
}
