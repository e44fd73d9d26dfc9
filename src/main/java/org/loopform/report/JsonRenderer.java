package org.loopform.report;

import java.util.List;
import java.util.Map;
import org.loopform.audit.AuditSummary;
import org.loopform.check.CheckResult;
import org.loopform.check.ScanSweep;
import org.loopform.findings.Finding;
import org.loopform.form.Conversion;
import org.loopform.form.FormDefinition;

/** JSON for tools: snake_case keys, numbers in the units the keys name (the contract in DESIGN.md). */
public final class JsonRenderer implements Renderer {

    public static final JsonRenderer INSTANCE = new JsonRenderer();

    private JsonRenderer() {
    }

    @Override
    public String formList(List<FormDefinition> forms) {
        return FormReport.listJson(forms);
    }

    @Override
    public String form(FormDefinition form) {
        return FormReport.json(form);
    }

    @Override
    public String formValid(String file, FormDefinition form) {
        return FormReport.checkJson(file, form.id(), List.of());
    }

    @Override
    public String formProblems(String file, List<String> problems) {
        return FormReport.checkJson(file, null, problems);
    }

    @Override
    public boolean problemsOnStandardOutput() {
        return true;
    }

    @Override
    public String conversion(Conversion c, List<Finding> findings, Map<String, String> sourceValues) {
        return ConversionReport.json(c, findings);
    }

    @Override
    public String check(CheckResult r) {
        return CheckReport.json(r);
    }

    @Override
    public String sweep(ScanSweep.Result sweep) {
        return SweepReport.json(sweep);
    }

    @Override
    public String auditSummary(AuditSummary summary, String folder) {
        return AuditRows.summaryJsonText(summary, folder);
    }
}
