package org.loopform.report;

import java.util.List;
import java.util.Map;
import org.loopform.audit.AuditSummary;
import org.loopform.check.CheckResult;
import org.loopform.check.ScanSweep;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.FormDefinition;

/** Text for people: tables and sentences, every figure with its unit. */
public final class TextRenderer implements Renderer {

    public static final TextRenderer INSTANCE = new TextRenderer();

    private TextRenderer() {
    }

    @Override
    public String formList(List<FormDefinition> forms) {
        String nl = System.lineSeparator();
        TextTable t = new TextTable("id", "structure", "parameters", "title");
        for (FormDefinition f : forms) {
            t.row(f.id(), f.structure().id(), String.join(" ", f.parameterNames()), f.title());
        }
        return t.render(0) + nl + forms.size() + " forms. 'loopform forms show ID' gives one in full; a form file of"
                + " your own works wherever an id does." + nl;
    }

    @Override
    public String form(FormDefinition form) {
        return FormReport.text(form);
    }

    @Override
    public String formValid(String file, FormDefinition f) {
        return file + ": form " + f.id() + " is valid (" + f.structure().id() + "; parameters "
                + String.join(", ", f.parameters().stream().map(p -> p.name()).toList()) + ")." + System.lineSeparator();
    }

    @Override
    public String formProblems(String file, List<String> problems) {
        String nl = System.lineSeparator();
        StringBuilder sb = new StringBuilder();
        problems.forEach(p -> sb.append(p).append(nl));
        sb.append(problems.size()).append(problems.size() == 1 ? " problem" : " problems").append(" in ").append(file)
                .append("; see forms-catalog/README.md for the form-file layout.").append(nl);
        return sb.toString();
    }

    @Override
    public boolean problemsOnStandardOutput() {
        return false;
    }

    @Override
    public String conversion(Conversion c, List<Finding> findings, Map<String, String> sourceValues) {
        return ConversionReport.text(c, findings, sourceValues);
    }

    @Override
    public String check(CheckResult r) {
        return CheckReport.text(r);
    }

    @Override
    public String sweep(ScanSweep.Result sweep) {
        return SweepReport.text(sweep);
    }

    @Override
    public String auditSummary(AuditSummary summary, String folder) {
        return AuditRows.summaryText(summary, folder);
    }
}
