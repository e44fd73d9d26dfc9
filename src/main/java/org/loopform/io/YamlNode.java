package org.loopform.io;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * A YAML node with its dotted path ({@code integral.unit}) and file name, so that every message
 * can say {@code file:line: path: ...}.
 */
public record YamlNode(Node node, String path, String file) {

    public int line() {
        return node.getStartMark() != null ? node.getStartMark().getLine() + 1 : 1;
    }

    /** "file:line: path: " for a message about this node. */
    public String where() {
        return file + ":" + line() + ": " + (path.isEmpty() ? "" : path + ": ");
    }

    public boolean isMapping() {
        return node instanceof MappingNode;
    }

    public boolean isScalar() {
        return node instanceof ScalarNode;
    }

    public boolean isSequence() {
        return node instanceof SequenceNode;
    }

    /** The scalar's text; throws a located error when this is not a scalar. */
    public String text() {
        if (node instanceof ScalarNode s) {
            return s.getValue();
        }
        throw new InputException(where() + "expected a single value (got a " + kind() + ")");
    }

    private String kind() {
        return isMapping() ? "mapping" : isSequence() ? "list" : "value";
    }

    /** The entries of a mapping, in file order; throws a located error when this is not a mapping. */
    public Map<String, YamlNode> entries() {
        if (!(node instanceof MappingNode m)) {
            throw new InputException(where() + "expected a mapping of keys to values (got a " + kind() + ")");
        }
        Map<String, YamlNode> out = new LinkedHashMap<>();
        for (NodeTuple t : m.getValue()) {
            String key = t.getKeyNode() instanceof ScalarNode k ? k.getValue() : String.valueOf(t.getKeyNode());
            out.put(key, new YamlNode(t.getValueNode(), path.isEmpty() ? key : path + "." + key, file));
        }
        return out;
    }

    /** The items of a list; throws a located error when this is not a list. */
    public List<YamlNode> items() {
        if (!(node instanceof SequenceNode s)) {
            throw new InputException(where() + "expected a list (got a " + kind() + ")");
        }
        List<YamlNode> out = new ArrayList<>();
        int k = 0;
        for (Node n : s.getValue()) {
            out.add(new YamlNode(n, path + "[" + k++ + "]", file));
        }
        return out;
    }

    public Optional<YamlNode> get(String key) {
        return Optional.ofNullable(entries().get(key));
    }

    /** Problems for every key of this mapping that is not in {@code known}. */
    public List<String> unknownKeys(Set<String> known) {
        List<String> problems = new ArrayList<>();
        entries().forEach((k, v) -> {
            if (!known.contains(k)) {
                problems.add(file + ":" + v.line() + ": " + v.path() + ": unknown key; expected one of "
                        + String.join(", ", known.stream().sorted().toList()));
            }
        });
        return problems;
    }
}
