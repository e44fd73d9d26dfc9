package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.loopform.audit.LoopSpec;
import org.loopform.form.FormCodec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.WritingContext;
import org.loopform.process.ProcessModel;
import org.loopform.units.Measure;
import org.loopform.units.Span;
import org.loopform.units.UnitException;

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
        return loop(n, false);
    }

    static LoopSpec loop(YamlNode n, boolean targetOptional) {
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
        String fromId = t.remove("form");
        if (fromId == null) {
            throw new InputException(tuning.where() + "form: required; a catalog id or a form file path");
        }
        FormDefinition from = resolveForm(tuning, "form", fromId);
        Double sourceScan = t.containsKey("scan") ? seconds(tuning, "scan", t.remove("scan")) : null;
        if (targetOptional && !e.containsKey("target")) {
            checkTuning(tuning, from, t, new WritingContext(pv, out, sourceScan));
            return new LoopSpec(tag, process(n, e, pv, out), from, t, sourceScan, from, null, pv, out,
                    n.file() + ":" + n.line());
        }
        YamlNode target = required(n, e, "target");
        Map<String, String> tg = scalars(target);
        List<String> badTarget = target.unknownKeys(Set.of("form", "scan"));
        if (!badTarget.isEmpty()) {
            throw new InputException(badTarget);
        }
        if (!tg.containsKey("form")) {
            throw new InputException(target.where() + "form: required; a catalog id or a form file path");
        }
        FormDefinition to = resolveForm(target, "form", tg.get("form"));
        Double targetScan = tg.containsKey("scan") ? seconds(target, "scan", tg.get("scan")) : null;
        checkTuning(tuning, from, t, new WritingContext(pv, out, sourceScan != null ? sourceScan : targetScan));
        return new LoopSpec(tag, process(n, e, pv, out), from, t, sourceScan, to, targetScan, pv, out,
                n.file() + ":" + n.line());
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
            String p = idOrPath;
            Path base = Path.of(block.file()).toAbsolutePath().getParent();
            if (!org.loopform.io.CatalogLoader.bundled().find(p).isPresent() && base != null
                    && !UserPath.of(p, key, "a catalog id or the path of a form file").isAbsolute() && java.nio.file.Files.isRegularFile(base.resolve(p))) {
                p = base.resolve(p).toString();
            }
            return CatalogLoader.resolve(p, "form");
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
        try {
            return Span.parse(v.text());
        } catch (UnitException ex) {
            throw new InputException(v.where() + ex.getMessage());
        }
    }

    private static double seconds(YamlNode block, String key, String text) {
        try {
            return Measure.parsePositiveSeconds(text);
        } catch (UnitException ex) {
            YamlNode at = block.get(key).orElse(block);
            throw new InputException(at.where() + ex.getMessage());
        }
    }
}
