package org.loopform.cli;

import org.loopform.report.Renderer;

import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.form.FormDefinition;
import org.loopform.io.CatalogLoader;
import org.loopform.io.FormFileReader;
import org.loopform.io.InputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code loopform forms}: the catalog, one form in full, and checks of form files. */
@Command(name = "forms", mixinStandardHelpOptions = true,
        description = "Lists the controller forms in the catalog; 'forms show' and 'forms check' look at one.",
        subcommands = {FormsCommand.Show.class, FormsCommand.Check.class})
final class FormsCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Mixin
    FormatOption format;

    @Override
    public Integer call() {
        List<FormDefinition> forms = CatalogLoader.bundled().all();
        var out = spec.commandLine().getOut();
        out.print(format.format.renderer().formList(forms));
        out.flush();
        return ExitCodes.OK;
    }

    @Command(name = "show", mixinStandardHelpOptions = true, description = "Shows one form in full: structure, units,"
            + " filter, weights, limits and algorithm.")
    static final class Show implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(paramLabel = "ID|FILE", description = "A catalog id or a form file.")
        String form;

        @Mixin
        FormatOption format;

        @Override
        public Integer call() {
            FormDefinition f = CatalogLoader.resolve(form, "forms show");
            var out = spec.commandLine().getOut();
            out.print(format.format.renderer().form(f));
            out.flush();
            return ExitCodes.OK;
        }
    }

    @Command(name = "check", mixinStandardHelpOptions = true, description = "Checks a form file and explains every"
            + " problem by file, line and field.")
    static final class Check implements Callable<Integer> {
        @Spec
        CommandSpec spec;

        @Parameters(paramLabel = "FILE", description = "The form file to check.")
        Path file;

        @Mixin
        FormatOption format;

        @Override
        public Integer call() {
            var out = spec.commandLine().getOut();
            try {
                FormDefinition f = FormFileReader.read(file, file.toString());
                out.print(format.format.renderer().formValid(file.toString(), f));
                out.flush();
                return ExitCodes.OK;
            } catch (InputException e) {
                Renderer renderer = format.format.renderer();
                var to = renderer.problemsOnStandardOutput() ? out : spec.commandLine().getErr();
                to.print(renderer.formProblems(file.toString(), e.problems()));
                to.flush();
                return ExitCodes.BAD_INPUT;
            }
        }
    }
}
