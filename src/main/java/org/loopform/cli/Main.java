package org.loopform.cli;

import java.io.PrintWriter;
import org.loopform.report.Cautions;
import org.loopform.units.BadInput;
import picocli.AutoComplete;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParseResult;
import picocli.CommandLine.ScopeType;
import picocli.CommandLine.Spec;

/** The {@code loopform} command: carries PID tuning between controller forms and checks the result. */
@Command(name = "loopform", mixinStandardHelpOptions = true, versionProvider = VersionProvider.class,
        description = {"Carries PID tuning between controller algorithm forms exactly, or says how close it can get"
                + " and why; checks the loop as the target will run it (scan time, discretization, filter,"
                + " rounding, limits); audits whole migrations."},
        subcommands = {FormsCommand.class, ConvertCommand.class, CheckCommand.class, FitCommand.class,
                TuneCommand.class, ReplayCommand.class, AuditCommand.class, DemoCommand.class,
                AutoComplete.GenerateCompletion.class},
        footer = {"", "Exit codes: 0 done, nothing failed; 1 done, a finding of severity fail; 2 bad input or usage;"
                + " 3 an internal error of loopform (please report it).",
                "", Cautions.SHORT})
public final class Main implements Runnable {

    @Spec
    CommandSpec spec;

    /** Read from the parse result by the exception handler; the field only declares the option. */
    @Option(names = "--debug", scope = ScopeType.INHERIT,
            description = "On an internal error, print its stack trace as well (for a bug report).")
    boolean debug;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    public static void main(String[] args) {
        System.exit(run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true)));
    }

    /** Runs loopform with {@code args}, printing to {@code out} and {@code err}; returns the exit code. */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        return run(commandLine(), args, out, err);
    }

    /** Runs {@code cl} (loopform's command line, perhaps with test commands added) with {@code args}. */
    static int run(CommandLine cl, String[] args, PrintWriter out, PrintWriter err) {
        cl.setOut(out);
        cl.setErr(err);
        int code;
        try {
            code = cl.execute(args);
        } catch (StackOverflowError | OutOfMemoryError | RuntimeException e) {
            // picocli lets errors (and anything its handlers rethrow) through: still a bug, still reported
            code = internalError(e, err, java.util.Arrays.asList(args).contains("--debug"));
        }
        out.flush();
        err.flush();
        return code;
    }

    static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new Main());
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            if (ex instanceof BadInput) {
                commandLine.getErr().println("loopform: " + ex.getMessage());
                return ExitCodes.BAD_INPUT;
            }
            return internalError(ex, commandLine.getErr(), debug(parseResult));
        });
        cl.setParameterExceptionHandler((ex, args) -> {
            CommandLine c = ex.getCommandLine();
            c.getErr().println("loopform: " + ex.getMessage());
            c.getErr().println("Try '" + c.getCommandSpec().qualifiedName() + " --help' for usage.");
            return ExitCodes.BAD_INPUT;
        });
        CheckCommand.describePolicy(cl.getSubcommands().get("check"));
        cl.getSubcommands().get("generate-completion").getCommandSpec().usageMessage().hidden(false);
        return cl;
    }

    /**
     * Anything but {@link BadInput} is a bug of loopform: one line asking for a report, the stack
     * trace only with {@code --debug}, exit 3.
     */
    static int internalError(Throwable ex, PrintWriter err, boolean debug) {
        String what = ex.getClass().getName() + (ex.getMessage() == null ? "" : ": " + ex.getMessage());
        err.println("loopform hit an internal error (" + what.replaceAll("\\s*\\R\\s*", " ") + "); please report it"
                + " with the command and input that caused it" + (debug ? "." : " (add --debug for the stack trace)."));
        if (debug) {
            ex.printStackTrace(err);
        }
        err.flush();
        return ExitCodes.INTERNAL_ERROR;
    }

    private static boolean debug(ParseResult parseResult) {
        for (ParseResult p = parseResult; p != null; p = p.subcommand()) {
            if (p.hasMatchedOption("--debug")) {
                return true;
            }
        }
        return false;
    }
}
