package org.loopform.io;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Supplier;
import org.loopform.form.DerivativeSpec;
import org.loopform.form.DerivativeWriting;
import org.loopform.form.DiscreteAlgorithm;
import org.loopform.form.FilterKind;
import org.loopform.form.FilterPlacement;
import org.loopform.form.FilterSpec;
import org.loopform.form.FormDefinition;
import org.loopform.form.FormException;
import org.loopform.form.GainBasis;
import org.loopform.form.GainSpec;
import org.loopform.form.GainWriting;
import org.loopform.form.IntegralSpec;
import org.loopform.form.IntegralWriting;
import org.loopform.form.ParameterLimit;
import org.loopform.form.SignConvention;
import org.loopform.form.Structure;
import org.loopform.form.Weight;
import org.loopform.units.TimeUnit;
import org.loopform.units.UnitException;

/**
 * Reads a form file (schema in {@code forms-catalog/README.md}) into a {@link FormDefinition},
 * collecting every problem with its file, line and field before giving up, so that one run of
 * {@code forms check} explains all of them.
 */
public final class FormFileReader {

    private static final Set<String> TOP = Set.of("id", "title", "description", "structure", "gain", "integral",
            "derivative", "filter", "weights", "limits", "algorithm");

    private final FormFields f = new FormFields();
    private final List<String> problems = f.problems;
    /** Sections that could not be read and stand in with their defaults. */
    private final Set<String> fellBack = new java.util.HashSet<>();

    private FormFileReader() {
    }

    public static FormDefinition read(Path path, String shownName) {
        return fromNode(YamlSource.read(path, shownName));
    }

    public static FormDefinition parse(String yamlText, String shownName) {
        return fromNode(YamlSource.parse(yamlText, shownName));
    }

    static FormDefinition fromNode(YamlNode root) {
        return new FormFileReader().build(root);
    }

    private FormDefinition build(YamlNode root) {
        if (!root.isMapping()) {
            throw new InputException(root.where() + "a form file is a mapping of keys (id, title, structure, ...); "
                    + "see forms-catalog/README.md");
        }
        problems.addAll(root.unknownKeys(TOP));
        Map<String, YamlNode> top = root.entries();
        String id = f.requiredText(root, top, "id");
        String title = f.requiredText(root, top, "title");
        String description = top.containsKey("description") ? f.text(top.get("description")) : "";
        int beforeStructure = problems.size();
        Structure structure = top.containsKey("structure")
                ? f.choice(top.get("structure"), Structure.class, null) : f.missing(root, "structure", Structure.class);
        if (problems.size() != beforeStructure) {
            fellBack.add("structure");
        }

        GainSpec gain = section(top, "gain", Set.of("as", "basis", "sign"), n -> new GainSpec(
                f.choice(n.get("as"), GainWriting.class, GainWriting.GAIN, "gain", "band"),
                f.choice(n.get("basis"), GainBasis.class, GainBasis.PERCENT, "percent", "engineering"),
                f.choice(n.get("sign"), SignConvention.class, SignConvention.SIGNED, "signed", "action")),
                () -> new GainSpec(GainWriting.GAIN, GainBasis.PERCENT, SignConvention.SIGNED));
        IntegralSpec integral = section(top, "integral", Set.of("as", "unit", "off"), n -> new IntegralSpec(
                f.choice(n.get("as"), IntegralWriting.class, IntegralWriting.TIME, "time", "rate", "gain", "per_scan"),
                f.timeUnit(n.get("unit")),
                n.containsKey("off") ? f.number(n.get("off")) : 0.0),
                () -> new IntegralSpec(IntegralWriting.TIME, TimeUnit.SECONDS, 0.0));
        DerivativeSpec derivative = section(top, "derivative", Set.of("as", "unit"), n -> new DerivativeSpec(
                f.choice(n.get("as"), DerivativeWriting.class, structure == Structure.PARALLEL
                        ? DerivativeWriting.GAIN : DerivativeWriting.TIME, "time", "gain", "per_scan"),
                f.timeUnit(n.get("unit"))),
                () -> new DerivativeSpec(structure == Structure.PARALLEL ? DerivativeWriting.GAIN
                        : DerivativeWriting.TIME, TimeUnit.SECONDS));
        FilterSpec filter = section(top, "filter", Set.of("kind", "ratio", "placement", "unit", "default"),
                n -> new FilterSpec(
                        f.choice(n.get("kind"), FilterKind.class, FilterKind.RATIO,
                                "none", "fixed_ratio", "ratio", "time_constant"),
                        f.choice(n.get("placement"), FilterPlacement.class, FilterPlacement.DERIVATIVE,
                                "derivative", "measurement"),
                        n.containsKey("ratio") ? f.number(n.get("ratio")) : 10.0,
                        f.timeUnit(n.get("unit")),
                        n.containsKey("default") ? f.number(n.get("default")) : 0.0),
                FilterSpec::defaults);
        Weight[] weights = section(top, "weights", Set.of("b", "c"), n -> new Weight[] {
                FormWeightsReader.read(n.get("b"), f), FormWeightsReader.read(n.get("c"), f)}, () -> new Weight[] {Weight.fixed(1), Weight.fixed(1)});
        Map<String, ParameterLimit> limits = top.containsKey("limits") ? FormLimitsReader.read(top.get("limits"), f) : Map.of();
        DiscreteAlgorithm algorithm = top.containsKey("algorithm") ? FormAlgorithmReader.read(top.get("algorithm"), f)
                : DiscreteAlgorithm.defaults();

        // the cross-field rules run on what was read, unless a section they depend on stands in with
        // its defaults (a rule about a default the file never wrote would only confuse)
        if (problems.isEmpty() || java.util.Collections.disjoint(fellBack,
                Set.of("structure", "gain", "integral", "derivative", "filter", "weights"))) {
            try {
                FormDefinition form = new FormDefinition(id, title, description, structure, gain, integral, derivative,
                        filter, weights[0], weights[1], limits, algorithm);
                if (problems.isEmpty()) {
                    return form;
                }
            } catch (FormException e) {
                e.problems().forEach(p -> problems.add(locate(root, p)));
            }
        }
        throw new InputException(problems);
    }

    /** Places a cross-field message ("weights.c: ...") at the line of the field it names. */
    private static String locate(YamlNode root, String message) {
        int colon = message.indexOf(": ");
        YamlNode at = root;
        if (colon > 0) {
            String field = message.substring(0, colon);
            YamlNode n = root;
            for (String part : field.split("\\.")) {
                if (!n.isMapping() || n.get(part).isEmpty()) {
                    n = null;
                    break;
                }
                n = n.get(part).get();
            }
            if (n != null) {
                return root.file() + ":" + n.line() + ": " + message;
            }
            String head = field.split("\\.")[0];
            if (root.get(head).isPresent()) {
                at = root.get(head).get();
                return root.file() + ":" + at.line() + ": " + message;
            }
        }
        return root.file() + ":" + at.line() + ": " + message;
    }

    private interface SectionReader<T> {
        T read(Map<String, YamlNode> entries);
    }

    private <T> T section(Map<String, YamlNode> top, String key, Set<String> known, SectionReader<T> reader,
                          Supplier<T> fallback) {
        YamlNode n = top.get(key);
        if (n == null) {
            return fallback.get();
        }
        if (!n.isMapping()) {
            problems.add(n.where() + "expected a mapping with keys " + String.join(", ", known.stream().sorted()
                    .toList()));
            fellBack.add(key);
            return fallback.get();
        }
        problems.addAll(n.unknownKeys(known));
        int before = problems.size();
        try {
            T value = reader.read(n.entries());
            if (problems.size() == before) {
                return value;
            }
        } catch (FormException | UnitException e) {
            // a value already reported stands in as 0 and may break the record; report the cause only
            if (problems.size() == before) {
                String m = e.getMessage();
                problems.add(n.file() + ":" + n.line() + ": " + (m.startsWith(key) ? "" : key + ": ") + m);
            }
        }
        fellBack.add(key);
        return fallback.get();
    }

}
