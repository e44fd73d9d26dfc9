package org.loopform.io;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

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
            List<String> duplicates = new ArrayList<>();
            findDuplicateKeys(root, "", shownName, duplicates, Collections.newSetFromMap(new IdentityHashMap<>()));
            if (!duplicates.isEmpty()) {
                throw new InputException(duplicates);
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

    /**
     * Reports every key given twice in one mapping. Composing a node tree does not apply the
     * loader's duplicate-key rule (only constructing objects does), and a repeated key would
     * otherwise silently replace the first.
     */
    private static void findDuplicateKeys(Node node, String path, String file, List<String> out, Set<Node> seen) {
        if (!seen.add(node)) {
            return; // an alias already visited
        }
        if (node instanceof MappingNode m) {
            Map<String, Integer> firstLine = new HashMap<>();
            for (NodeTuple t : m.getValue()) {
                String key = t.getKeyNode() instanceof ScalarNode k ? k.getValue() : String.valueOf(t.getKeyNode());
                String at = path.isEmpty() ? key : path + "." + key;
                int line = t.getKeyNode().getStartMark().getLine() + 1;
                Integer first = firstLine.putIfAbsent(key, line);
                if (first != null) {
                    out.add(file + ":" + line + ": " + at + ": duplicate key (first given on line " + first
                            + "); give each key once");
                }
                findDuplicateKeys(t.getValueNode(), at, file, out, seen);
            }
        } else if (node instanceof SequenceNode s) {
            int k = 0;
            for (Node item : s.getValue()) {
                findDuplicateKeys(item, path + "[" + k++ + "]", file, out, seen);
            }
        }
    }
}
