package org.loopform.cli;

import java.io.PrintWriter;
import org.loopform.form.FormException;
import org.loopform.io.InputException;
import org.loopform.report.Cautions;
import org.loopform.units.UnitException;
import picocli.AutoComplete;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Spec;

/** The {@code loopform} command: carries PID tuning between controller forms and checks the result. */
@Command(name = "loopform", mixinStandardHelpOptions = true, versionProvider = VersionProvider.class,
        description = {"Carries PID tuning between controller algorithm forms exactly, or says how close it can get"
                + " and why; checks the loop as the target will run it (scan time, discretization, filter,"
                + " rounding, limits); audits whole migrations."},
        subcommands = {FormsCommand.class, ConvertCommand.class, CheckCommand.class, AuditCommand.class, DemoCommand.class, AutoComplete.GenerateCompletion.class},
        footer = {"", "Exit codes: 0 done, nothing failed; 1 done, a finding of severity fail; 2 bad input or usage.",
                "", Cautions.SHORT})
public final class Main implements Runnable {

    @Spec
    CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    public static void main(String[] args) {
        System.exit(run(args, new PrintWriter(System.out, true), new PrintWriter(System.err, true)));
    }

    /** Runs loopform with {@code args}, printing to {@code out} and {@code err}; returns the exit code. */
    public static int run(String[] args, PrintWriter out, PrintWriter err) {
        CommandLine cl = commandLine();
        cl.setOut(out);
        cl.setErr(err);
        int code = cl.execute(args);
        out.flush();
        err.flush();
        return code;
    }

    static CommandLine commandLine() {
        CommandLine cl = new CommandLine(new Main());
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            if (ex instanceof InputException || ex instanceof FormException || ex instanceof UnitException) {
                commandLine.getErr().println("loopform: " + ex.getMessage());
                return ExitCodes.BAD_INPUT;
            }
            throw ex;
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
}
