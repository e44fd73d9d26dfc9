package org.loopform.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.loopform.form.FormDefinition;
import org.loopform.io.CatalogLoader;
import org.loopform.io.FormFileReader;
import org.loopform.io.InputException;
import org.loopform.report.FormReport;
import org.loopform.report.TextTable;
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
        if (format.format == OutputFormat.json) {
            out.print(FormReport.listJson(forms));
        } else {
            TextTable t = new TextTable("id", "structure", "parameters", "title");
            for (FormDefinition f : forms) {
                t.row(f.id(), f.structure().id(), String.join(" ", f.parameterNames()), f.title());
            }
            out.print(t.render(0));
            out.println();
            out.println(forms.size() + " forms. 'loopform forms show ID' gives one in full; a form file of your own"
                    + " works wherever an id does.");
        }
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
            out.print(format.format == OutputFormat.json ? FormReport.json(f) : FormReport.text(f));
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
                if (format.format == OutputFormat.json) {
                    out.print(FormReport.checkJson(file.toString(), f.id(), List.of()));
                } else {
                    out.println(file + ": form " + f.id() + " is valid (" + f.structure().id() + "; parameters "
                            + String.join(", ", f.parameters().stream().map(p -> p.name()).toList()) + ").");
                }
                out.flush();
                return ExitCodes.OK;
            } catch (InputException e) {
                if (format.format == OutputFormat.json) {
                    out.print(FormReport.checkJson(file.toString(), null, e.problems()));
                    out.flush();
                } else {
                    var err = spec.commandLine().getErr();
                    e.problems().forEach(err::println);
                    err.println(e.problems().size() + (e.problems().size() == 1 ? " problem" : " problems")
                            + " in " + file + "; see forms-catalog/README.md for the form-file layout.");
                    err.flush();
                }
                return ExitCodes.BAD_INPUT;
            }
        }
    }
}
