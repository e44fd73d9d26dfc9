// plumbing: no published source needed
package org.loopform.cli;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.concurrent.Callable;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.loopform.units.BadInput;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * Only {@link BadInput} is exit 2; anything else thrown is a bug of loopform: exit 3, one line on
 * stderr asking for a report, the stack trace only with the global {@code --debug}. A test command
 * added to loopform's own command line throws what it is told to.
 */
@DisplayName("an internal error")
class InternalErrorTest {

    @Command(name = "boom")
    static final class Boom implements Callable<Integer> {
        private final RuntimeException toThrow;

        Boom(RuntimeException toThrow) {
            this.toThrow = toThrow;
        }

        @Override
        public Integer call() {
            throw toThrow;
        }
    }

    private static CliRun run(RuntimeException thrown, String... args) {
        CommandLine cl = Main.commandLine();
        cl.addSubcommand("boom", new Boom(thrown));
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(cl, args, new PrintWriter(out), new PrintWriter(err));
        return new CliRun(code, out.toString(), err.toString());
    }

    @Test
    void is_exit_3_with_one_line_asking_for_a_report_and_no_stack_trace() {
        CliRun r = run(new IllegalStateException("scan state lost\nsecond line"), "boom");

        assertThat(r.exitCode()).isEqualTo(3);
        assertThat(r.err().lines()).singleElement().asString()
                .startsWith("loopform hit an internal error"
                        + " (java.lang.IllegalStateException: scan state lost second line)")
                .contains("please report it with the command and input").contains("--debug");
        assertThat(r.err()).doesNotContain("\tat ");
    }

    @Test
    void an_illegal_argument_is_a_bug_too_not_bad_input() {
        CliRun r = run(new IllegalArgumentException("law coefficient p must be finite"), "boom");

        assertThat(r.exitCode()).isEqualTo(3);
        assertThat(r.err()).contains("internal error");
    }

    @Test
    void prints_the_stack_trace_with_debug_before_or_after_the_command() {
        CliRun before = run(new IllegalStateException("x"), "--debug", "boom");
        CliRun after = run(new IllegalStateException("x"), "boom", "--debug");

        assertThat(before.exitCode()).isEqualTo(3);
        assertThat(before.err()).contains("internal error").contains("\tat org.loopform.cli.InternalErrorTest");
        assertThat(after.exitCode()).isEqualTo(3);
        assertThat(after.err()).contains("\tat org.loopform.cli.InternalErrorTest");
    }

    @Test
    void bad_input_stays_exit_2_with_its_message_only() {
        CliRun r = run(BadInput.of("loops.csv", 17, "ti", "must be > 0 s", "-2 s", "give a positive time"), "boom",
                "--debug");

        assertThat(r.exitCode()).isEqualTo(2);
        assertThat(r.err().strip()).isEqualTo("loopform: loops.csv:17: ti: must be > 0 s (got -2 s); give a positive"
                + " time.");
    }

    @Test
    void debug_is_listed_in_the_help_and_the_exit_codes_name_3() {
        CliRun r = CliRun.of("--help");

        assertThat(r.out()).contains("--debug").contains("3 an internal error");
    }
}
