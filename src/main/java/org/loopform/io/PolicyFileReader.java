package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.PolicyException;

/** Reads a policy file: a flat YAML mapping of threshold names to numbers, overriding the defaults. */
public final class PolicyFileReader {
    private PolicyFileReader() {
    }

    /** The policy in the file at {@code path}, named {@code shownName} in messages. */
    public static CheckPolicy read(Path path, String shownName) {
        return fromRoot(YamlSource.read(path, shownName), shownName);
    }

    /** The policy in YAML {@code text} (tests, fuzzing), named {@code shownName} in messages. */
    public static CheckPolicy parse(String text, String shownName) {
        return fromRoot(YamlSource.parse(text, shownName), shownName);
    }

    private static CheckPolicy fromRoot(YamlNode root, String shownName) {
        List<String> problems = new ArrayList<>(root.unknownKeys(CheckPolicy.DEFAULT.asMap().keySet()));
        Map<String, Double> m = new LinkedHashMap<>();
        Map<String, YamlNode> entries = root.entries();
        if (problems.isEmpty()) {
            entries.forEach((k, v) -> {
                try {
                    double x = Double.parseDouble(v.text().trim());
                    if (!(x >= 0) || !Double.isFinite(x)) {
                        problems.add(v.where() + "must be a number >= 0 (got '" + v.text() + "'); see loopform check"
                                + " --help for the key's meaning and default.");
                    }
                    m.put(k, x);
                } catch (NumberFormatException e) {
                    problems.add(v.where() + "must be a number (got '" + v.text() + "'); write a plain number such as "
                            + CheckPolicy.DEFAULT.asMap().get(k) + ", without a unit.");
                }
            });
        }
        Map<String, Double> merged = new LinkedHashMap<>(CheckPolicy.DEFAULT.asMap());
        merged.putAll(m);
        if (problems.isEmpty() && merged.get("sampling_fail") < merged.get("sampling_warn")) {
            YamlNode at = root.get("sampling_fail").or(() -> root.get("sampling_warn")).orElse(root);
            problems.add(at.where() + "the fail threshold must not be below sampling_warn (got sampling_fail "
                    + merged.get("sampling_fail") + ", sampling_warn " + merged.get("sampling_warn")
                    + "); raise sampling_fail or lower sampling_warn");
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        try {
            return CheckPolicy.DEFAULT.with(m);
        } catch (PolicyException e) {
            // point at the key the message names where the file sets it, else at the top of the file
            int line = e.keys().stream().map(k -> entries.get(k.id())).filter(java.util.Objects::nonNull)
                    .findFirst().map(YamlNode::line).orElse(root.line());
            throw new InputException(shownName + ":" + line + ": " + e.getMessage());
        } catch (org.loopform.units.BadInput e) {
            throw new InputException(shownName + ":" + root.line() + ": " + e.getMessage());
        }
    }
}
