package org.loopform.io;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.loopform.tuning.ConfidenceBox;
import org.loopform.units.Span;
import org.loopform.units.UnitException;

/**
 * Reads the {@code intervals:} block that {@code fit --write-process} writes beside the {@code process:}
 * block: one {@code LO..HI} a parameter (gain in %/%, or %/s per % for an integrating model; times in s).
 */
public final class ConfidenceBoxReader {

    static final Set<String> KEYS = Set.of("gain", "time_constant", "time_constant_2", "dead_time");

    private ConfidenceBoxReader() {
    }

    /**
     * The box of the process file {@code text} names ({@code option} in messages); refuses an inline mapping or
     * a file without intervals, saying how to get one.
     */
    public static ConfidenceBox read(String text, String option) {
        String trimmed = text.trim();
        Path path = Path.of(trimmed);
        if (trimmed.startsWith("{") || !Files.isRegularFile(path)) {
            throw new InputException("--robust: needs --process FILE written by 'loopform fit --write-process', which"
                    + " carries the fit's 95 % intervals (got " + option + " '" + trimmed + "')");
        }
        YamlNode root = YamlSource.read(path, trimmed);
        YamlNode process = root.isMapping() ? root.get("process").orElse(null) : null;
        YamlNode block = root.isMapping() ? root.get("intervals").orElse(null) : null;
        if (process == null || block == null) {
            throw new InputException(trimmed + ": --robust: no 'intervals:' block beside 'process:'; write the file"
                    + " with 'loopform fit --write-process', or drop --robust");
        }
        if (!block.isMapping()) {
            throw new InputException(block.where() + "must be a mapping such as {gain: 1.9..2.1, dead_time: 9..11}");
        }
        List<String> bad = block.unknownKeys(KEYS);
        if (!bad.isEmpty()) {
            throw new InputException(bad);
        }
        String model = process.get("model").map(YamlNode::text).orElse("");
        Map<String, Span> intervals = new LinkedHashMap<>();
        for (Map.Entry<String, YamlNode> e : block.entries().entrySet()) {
            try {
                intervals.put(e.getKey(), Span.parse(e.getValue().text()));
            } catch (UnitException ex) {
                throw new InputException(e.getValue().where() + ex.getMessage());
            }
        }
        try {
            return new ConfidenceBox(model.trim().toLowerCase(java.util.Locale.ROOT), intervals);
        } catch (org.loopform.units.BadInput e) {
            throw new InputException(trimmed + ": " + String.join("; ", e.problems()));
        }
    }
}
