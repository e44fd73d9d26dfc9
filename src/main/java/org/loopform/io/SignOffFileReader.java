package org.loopform.io;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.loopform.audit.SignOff;

/**
 * Reads a sign-off file: a flat YAML mapping with any of {@code prepared_by}, {@code checked_by},
 * {@code approved_by}, {@code change} and {@code revision}, each a single line of text.
 */
public final class SignOffFileReader {
    private SignOffFileReader() {
    }

    static final Set<String> KEYS = Set.of("prepared_by", "checked_by", "approved_by", "change", "revision");

    public static SignOff read(Path path, String shownName) {
        YamlNode root = YamlSource.read(path, shownName);
        List<String> problems = new ArrayList<>(root.unknownKeys(KEYS));
        Map<String, YamlNode> entries = root.entries();
        for (var e : entries.entrySet()) {
            if (!e.getValue().isScalar()) {
                problems.add(e.getValue().where() + "must be one line of text (got a list or mapping); write the name"
                        + " or number on the same line as the key");
            } else if (e.getValue().text().contains("\n")) {
                problems.add(e.getValue().where() + "must be one line of text (got several lines); join them");
            }
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        return new SignOff(text(entries, "prepared_by"), text(entries, "checked_by"), text(entries, "approved_by"),
                text(entries, "change"), text(entries, "revision"));
    }

    private static String text(Map<String, YamlNode> entries, String key) {
        YamlNode n = entries.get(key);
        return n == null ? "" : n.text();
    }
}
