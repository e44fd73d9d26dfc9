package org.loopform.io;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
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
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.reader.ReaderException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * Reads a YAML document into SnakeYAML's node tree (safe loading: plain data only, no types),
 * keeping line numbers for error messages. Every limit is an {@link InputException} naming the
 * file: at most {@link #MAX_CODE_POINTS} characters for a document read whole (a form, a policy, a
 * loop file for {@code check}; a loop list for {@code audit} is streamed a block at a time by
 * {@link LoopYamlReader} and may hold {@link #MAX_STREAMED_CODE_POINTS}), at most
 * {@link #MAX_ALIASES} aliases to lists or mappings (no "billion laughs"), and at most
 * {@link #MAX_NESTING} levels of nesting (a loop list needs four).
 */
public final class YamlSource {

    /**
     * Characters of a YAML document read whole: 8 Mi, a thousand times a form file. Composing a
     * node tree takes about 40 bytes of memory per character, so this bounds memory too.
     */
    static final int MAX_CODE_POINTS = 8 << 20;
    /** Characters of a streamed loop list: 1 Gi, some four million loops. */
    static final int MAX_STREAMED_CODE_POINTS = 1 << 30;
    /** Aliases ({@code *name}) to lists or mappings; each may copy a whole subtree. */
    static final int MAX_ALIASES = 20;
    /** Nesting levels of lists and mappings. */
    static final int MAX_NESTING = 50;

    private YamlSource() {
    }

    /** The root node of the file at {@code path}, named {@code shownName} in messages. */
    public static YamlNode read(Path path, String shownName) {
        String text = TextInput.readAll(path, shownName, MAX_CODE_POINTS, tooLarge(shownName));
        return parse(text, shownName);
    }

    private static String tooLarge(String shownName) {
        return shownName + ": larger than " + (MAX_CODE_POINTS >> 20) + " Mi characters, the limit for a form,"
                + " policy or loop file read whole; give a long loop list to 'audit', which reads it a loop at a"
                + " time, or as CSV";
    }

    /**
     * SnakeYAML's options: the limits above. Duplicate keys are found by {@link #duplicateKeys}, as
     * loopform only composes nodes and SnakeYAML applies its own duplicate-key rule only when it
     * constructs objects.
     */
    static LoaderOptions options(int codePointLimit) {
        LoaderOptions options = new LoaderOptions();
        options.setMaxAliasesForCollections(MAX_ALIASES);
        options.setNestingDepthLimit(MAX_NESTING);
        options.setCodePointLimit(codePointLimit);
        return options;
    }

    /** The root node of YAML {@code text}, named {@code shownName} in messages. */
    public static YamlNode parse(String text, String shownName) {
        Yaml yaml = new Yaml(new SafeConstructor(options(MAX_CODE_POINTS)));
        try (Reader r = new StringReader(text.startsWith("\uFEFF") ? text.substring(1) : text)) {
            Node root = yaml.compose(r);
            if (root == null) {
                throw new InputException(shownName + ":1: the file is empty; see forms-catalog/README.md for the layout");
            }
            List<String> duplicates = duplicateKeys(root, shownName);
            if (!duplicates.isEmpty()) {
                throw new InputException(duplicates);
            }
            return new YamlNode(root, "", shownName);
        } catch (YAMLException e) {
            throw problem(e, shownName, text);
        } catch (StackOverflowError e) {
            throw tooDeep(shownName);
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
        }
    }

    static InputException tooDeep(String shownName) {
        return new InputException(shownName + ": lists and mappings nested more than " + MAX_NESTING
                + " levels deep; a loop or form file needs only a few");
    }

    /**
     * What a SnakeYAML failure means to the user, with the file and, where known, the line;
     * {@code text} (may be null) locates a bad character.
     */
    static InputException problem(YAMLException e, String shownName, String text) {
        if (e.getCause() instanceof NotUtf8Exception n) {
            return n.toInput();
        }
        if (e instanceof MarkedYAMLException m) {
            int line = m.getProblemMark() != null ? m.getProblemMark().getLine() + 1 : 1;
            String what = String.valueOf(m.getProblem());
            return new InputException(shownName + ":" + line + ": not valid YAML: " + what
                    + (what.contains("undefined alias") ? "; an alias (*name) needs its anchor (&name) earlier in the"
                    + " same loop block" : "; check indentation and quoting near this line"));
        }
        if (e instanceof ReaderException r) {
            return new InputException(shownName + (text != null ? ":" + lineAt(text, r.getPosition()) : "") + ": a"
                    + " control character (code " + r.getCodePoint() + ") that YAML does not allow"
                    + (text == null ? " at character " + r.getPosition() : "") + "; delete it, or save the file as"
                    + " plain UTF-8 text");
        }
        String m = String.valueOf(e.getMessage());
        if (m.contains("exceeds the limit")) {
            return new InputException(text != null ? tooLarge(shownName) : shownName + ": larger than "
                    + (MAX_STREAMED_CODE_POINTS >> 20) + " Mi characters, the limit for a YAML loop list; split it"
                    + " into several files, or give it as CSV, which has no size limit");
        }
        if (m.contains("aliases")) {
            return new InputException(shownName + ": more than " + MAX_ALIASES + " aliases (*name) to lists or"
                    + " mappings; write the values out, as each alias can copy a whole subtree");
        }
        if (m.contains("Nesting Depth")) {
            return tooDeep(shownName);
        }
        return new InputException(shownName + ": not valid YAML (" + m.lines().findFirst().orElse("")
                + "); check the file's indentation and quoting");
    }

    /** The line of the code point at {@code codePointPosition} (from 0): one more than the line breaks before it. */
    private static long lineAt(String text, int codePointPosition) {
        return text.codePoints().limit(codePointPosition).filter(c -> c == '\n').count() + 1;
    }

    /** Every key given twice in one mapping of {@code root}, as located problems. */
    static List<String> duplicateKeys(Node root, String shownName) {
        List<String> duplicates = new ArrayList<>();
        findDuplicateKeys(root, "", shownName, duplicates, Collections.newSetFromMap(new IdentityHashMap<>()));
        return duplicates;
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
