package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.loopform.findings.CheckPolicy;

/** Reads a policy file: a flat YAML mapping of threshold names to numbers, overriding the defaults. */
public final class PolicyFileReader {
    private PolicyFileReader() {
    }

    public static CheckPolicy read(Path path, String shownName) {
        YamlNode root = YamlSource.read(path, shownName);
        List<String> problems = new ArrayList<>(root.unknownKeys(CheckPolicy.DEFAULT.asMap().keySet()));
        Map<String, Double> m = new LinkedHashMap<>();
        if (problems.isEmpty()) {
            root.entries().forEach((k, v) -> {
                try {
                    double x = Double.parseDouble(v.text().trim());
                    if (!(x >= 0) || !Double.isFinite(x)) {
                        problems.add(v.where() + "must be a number >= 0 (got '" + v.text() + "')");
                    }
                    m.put(k, x);
                } catch (NumberFormatException e) {
                    problems.add(v.where() + "must be a number (got '" + v.text() + "')");
                }
            });
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        try {
            return CheckPolicy.DEFAULT.with(m);
        } catch (IllegalArgumentException e) {
            throw new InputException(shownName + ":" + root.line() + ": " + e.getMessage());
        }
    }
}
