package org.loopform.identify;

import java.util.List;

/**
 * What an open-loop record gave: its findings, the graphical two-point estimates, the fitted models
 * (none when a finding of severity fail says the record cannot support one), the model recommended
 * and why.
 *
 * @param findings data findings, worst first
 * @param estimates Smith's and Sundaresan-Krishnaswamy's estimates from the first step (empty when unreadable)
 * @param fits the fitted models
 * @param recommended the recommended model's kind, or null
 * @param reason why it was recommended, or why none was
 * @param noisePercent the PV noise's standard deviation, % of span (from the baseline or sample differences)
 * @param stepPercent the first output step, % of span
 */
public record StepTestResult(List<DataFinding> findings, List<GraphicalEstimate> estimates, List<ModelFit> fits,
                             ModelKind recommended, String reason, double noisePercent, double stepPercent) {

    public StepTestResult {
        findings = List.copyOf(findings);
        estimates = List.copyOf(estimates);
        fits = List.copyOf(fits);
    }

    public ModelFit fit(ModelKind kind) {
        return fits.stream().filter(f -> f.kind() == kind).findFirst().orElse(null);
    }

    public ModelFit recommendedFit() {
        return recommended == null ? null : fit(recommended);
    }
}
