// plumbing: no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * Every command's {@code --help} prints its usage and no picocli warning: a description with a bare {@code %}
 * (picocli formats descriptions with {@code String.format}, so a percent sign is written {@code %%}) makes
 * picocli print "[picocli WARN]" on the standard error stream, which is {@code System.err}, not the err writer.
 */
class HelpWarningsTest {

    @Test
    void help_of_every_command_prints_no_warning() {
        List<List<String>> paths = new ArrayList<>();
        collect(new CommandLine(new Main()), new ArrayList<>(), paths);
        assertThat(paths).as("commands found").hasSizeGreaterThan(8);
        PrintStream saved = System.err;
        for (List<String> path : paths) {
            ByteArrayOutputStream stderr = new ByteArrayOutputStream();
            List<String> args = new ArrayList<>(path);
            args.add("--help");
            CliRun r;
            try {
                System.setErr(new PrintStream(stderr, true, StandardCharsets.UTF_8));
                r = CliRun.of(args.toArray(String[]::new));
            } finally {
                System.setErr(saved);
            }
            String all = stderr.toString(StandardCharsets.UTF_8) + r.err();
            assertThat(r.exitCode()).as(String.join(" ", args)).isZero();
            assertThat(r.out()).as(String.join(" ", args)).contains("Usage:");
            assertThat(all).as(String.join(" ", args)).doesNotContain("WARN");
        }
    }

    private static void collect(CommandLine cl, List<String> path, List<List<String>> paths) {
        paths.add(List.copyOf(path));
        for (var e : cl.getSubcommands().entrySet()) {
            if (e.getValue().getCommandSpec().name().equals(e.getKey())) { // aliases once
                List<String> sub = new ArrayList<>(path);
                sub.add(e.getKey());
                collect(e.getValue(), sub, paths);
            }
        }
    }
}
