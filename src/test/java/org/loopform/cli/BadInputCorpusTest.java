// plumbing: no published source needed (exit codes and messages are loopform's own contract)
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;

/**
 * The bad-input corpus: every folder under {@code src/test/resources/bad-input/} is one kind of bad
 * input, with its files and a {@code case.yaml}:
 * <pre>
 * args: [audit, "{dir}/loops.csv", --to, ideal]   # {dir} is the case's copy in a temporary folder
 * exit: 2
 * stderr: "loops.csv:2: 6 cells, the header has 5"   # a fragment, or a list of fragments
 * </pre>
 * Each case runs through {@link Main#run} on a copy of its folder, and must exit with its code, say
 * its fragments on stderr without a stack trace, write nothing and leave every input as it was
 * (the folder's files and their SHA-256 are the same before and after).
 */
class BadInputCorpusTest {

    private static final Path CORPUS = corpus();

    private static Path corpus() {
        try {
            return Path.of(BadInputCorpusTest.class.getClassLoader().getResource("bad-input").toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    static Stream<String> cases() throws IOException {
        try (Stream<Path> s = Files.list(CORPUS)) {
            return s.filter(Files::isDirectory).map(p -> p.getFileName().toString()).sorted().toList().stream();
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void each_case_exits_with_its_code_says_what_is_wrong_and_touches_nothing(String name, @TempDir Path temp)
            throws Exception {
        Path dir = temp.resolve(name);
        copy(CORPUS.resolve(name), dir);
        Map<String, Object> spec = new Yaml(new SafeConstructor(new LoaderOptions()))
                .load(Files.readString(dir.resolve("case.yaml")));
        @SuppressWarnings("unchecked")
        List<Object> rawArgs = (List<Object>) spec.get("args");
        String[] args = rawArgs.stream().map(a -> String.valueOf(a).replace("{dir}", dir.toString()))
                .toArray(String[]::new);
        Object fragments = spec.get("stderr");
        List<?> expected = fragments instanceof List<?> l ? l : List.of(fragments);

        Map<String, String> before = snapshot(temp);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(args, new PrintWriter(out), new PrintWriter(err));
        Map<String, String> after = snapshot(temp);

        assertThat(code).as("exit code; stderr:%n%s%nstdout:%n%s", err, out).isEqualTo(spec.get("exit"));
        for (Object f : expected) {
            assertThat(err.toString()).as("stderr").contains(String.valueOf(f));
        }
        assertThat(err.toString()).as("no stack trace").doesNotContain("\tat ").doesNotContain("Exception");
        assertThat(after).as("files after the run (nothing written, no input touched)").isEqualTo(before);
    }

    private static void copy(Path from, Path to) throws IOException {
        try (Stream<Path> s = Files.walk(from)) {
            for (Path p : s.toList()) {
                Path target = to.resolve(from.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(target);
                } else {
                    Files.copy(p, target);
                }
            }
        }
    }

    /** Every file and folder under {@code root}, with the SHA-256 of each file's bytes. */
    private static Map<String, String> snapshot(Path root) throws IOException, NoSuchAlgorithmException {
        Map<String, String> m = new TreeMap<>();
        try (Stream<Path> s = Files.walk(root)) {
            for (Path p : s.toList()) {
                String key = root.relativize(p).toString();
                if (Files.isDirectory(p)) {
                    m.put(key + "/", "folder");
                } else {
                    m.put(key, HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                            .digest(Files.readAllBytes(p))));
                }
            }
        }
        return m;
    }
}
