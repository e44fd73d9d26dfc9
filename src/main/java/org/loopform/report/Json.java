package org.loopform.report;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import org.loopform.findings.Finding;

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

    public static String write(ObjectNode n) {
        try {
            return MAPPER.writeValueAsString(n) + System.lineSeparator();
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write JSON", e);
        }
    }
}
