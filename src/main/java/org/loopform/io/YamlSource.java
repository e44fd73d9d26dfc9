package org.loopform.io;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.nodes.Node;

/**
 * Reads a YAML document into SnakeYAML's node tree (safe loading: plain data only, no types),
 * keeping line numbers for error messages.
 */
public final class YamlSource {

    private YamlSource() {
    }

    /** The root node of the file at {@code path}, named {@code shownName} in messages. */
    public static YamlNode read(Path path, String shownName) {
        String text;
        try {
            text = Files.readString(path, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new InputException(shownName + ": no such file; check the path");
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
        return parse(text, shownName);
    }

    /** The root node of YAML {@code text}, named {@code shownName} in messages. */
    public static YamlNode parse(String text, String shownName) {
        LoaderOptions options = new LoaderOptions();
        options.setAllowDuplicateKeys(false);
        options.setMaxAliasesForCollections(20);
        Yaml yaml = new Yaml(new SafeConstructor(options));
        try (Reader r = new StringReader(text.startsWith("\uFEFF") ? text.substring(1) : text)) {
            Node root = yaml.compose(r);
            if (root == null) {
                throw new InputException(shownName + ":1: the file is empty; see forms-catalog/README.md for the layout");
            }
            return new YamlNode(root, "", shownName);
        } catch (MarkedYAMLException e) {
            int line = e.getProblemMark() != null ? e.getProblemMark().getLine() + 1 : 1;
            throw new InputException(shownName + ":" + line + ": not valid YAML: " + e.getProblem()
                    + "; check indentation and quoting near this line");
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }
}
