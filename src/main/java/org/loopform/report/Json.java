package org.loopform.report;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.DoubleNode;
import com.fasterxml.jackson.databind.node.ContainerNode;
import java.util.ArrayList;
import java.util.Map;
import org.loopform.findings.Finding;
import org.loopform.units.Numbers;

/** JSON building blocks shared by every report: one mapper, findings in the contract's shape. */
public final class Json {
    static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private Json() {
    }

    public static ObjectNode object() {
        return MAPPER.createObjectNode();
    }

    /** A finding as {@code {"topic", "severity", "figure", "threshold", "unit", "source", "message"}}. */
    public static ObjectNode finding(Finding f) {
        ObjectNode n = object();
        n.put("topic", f.topic().id());
        n.put("severity", f.severity().id());
        putNumber(n, "figure", f.figure());
        putNumber(n, "threshold", f.threshold());
        n.put("unit", f.unit());
        n.put("source", f.source());
        n.put("message", f.message());
        return n;
    }

    public static ArrayNode findings(List<Finding> findings) {
        ArrayNode a = MAPPER.createArrayNode();
        findings.forEach(f -> a.add(finding(f)));
        return a;
    }

    /** Puts a number, or null where the figure does not exist (never NaN or infinity). */
    public static void putNumber(ObjectNode n, String key, Double value) {
        if (value == null || !Double.isFinite(value)) {
            n.putNull(key);
        } else {
            n.put(key, value);
        }
    }

    /**
     * The tree as indented JSON, every floating-point number first rounded to
     * {@link Numbers#MACHINE_DIGITS} significant digits so that no binary noise
     * (117.99999999999999) reaches a reader.
     */
    public static String write(ObjectNode n) {
        try {
            return MAPPER.writeValueAsString(tidied(n)) + System.lineSeparator();
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write JSON", e);
        }
    }

    /**
     * {@code n} with every floating-point number rounded as {@link #write} rounds it, in place: for
     * trees written elsewhere (loops.json's loops, summary, sign-off, provenance and chain).
     */
    public static ObjectNode tidy(ObjectNode n) {
        tidied(n);
        return n;
    }

    /** {@code node} with its floating-point numbers tidied, in place (the trees are built for one write). */
    static JsonNode tidied(JsonNode node) {
        if (node instanceof ObjectNode o) {
            List<Map.Entry<String, JsonNode>> fields = new ArrayList<>();
            o.fields().forEachRemaining(fields::add);
            for (Map.Entry<String, JsonNode> e : fields) {
                if (e.getValue().isFloatingPointNumber()) {
                    o.set(e.getKey(), DoubleNode.valueOf(Numbers.tidy(e.getValue().doubleValue())));
                } else if (e.getValue() instanceof ContainerNode<?>) {
                    tidied(e.getValue());
                }
            }
        } else if (node instanceof ArrayNode a) {
            for (int k = 0; k < a.size(); k++) {
                if (a.get(k).isFloatingPointNumber()) {
                    a.set(k, DoubleNode.valueOf(Numbers.tidy(a.get(k).doubleValue())));
                } else {
                    tidied(a.get(k));
                }
            }
        }
        return node;
    }
}
