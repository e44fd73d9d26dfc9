package org.loopform.report;

import java.util.List;
import org.loopform.findings.Finding;
import org.loopform.units.Numbers;

/** Findings in plain words, one paragraph each, worst first. */
public final class FindingText {
    private FindingText() {
    }

    public static String render(List<Finding> findings) {
        StringBuilder sb = new StringBuilder();
        String nl = System.lineSeparator();
        if (findings.isEmpty()) {
            return "Findings: none." + nl;
        }
        sb.append("Findings:").append(nl);
        findings.stream().sorted((a, b) -> b.severity().compareTo(a.severity())).forEach(f -> {
            sb.append("  [").append(f.severity().id()).append("] ").append(f.topic().id()).append(": ")
                    .append(f.message()).append(nl);
            if (f.figure() != null || !f.source().isEmpty()) {
                sb.append("      ");
                if (f.figure() != null) {
                    sb.append("figure ").append(Numbers.significant(f.figure(), 4)).append(' ').append(f.unit());
                    if (f.threshold() != null) {
                        sb.append(", threshold ").append(Numbers.significant(f.threshold(), 4)).append(' ')
                                .append(f.unit());
                    }
                    sb.append("; ");
                }
                sb.append("source: ").append(f.source().isEmpty() ? "-" : f.source()).append(nl);
            }
        });
        return sb.toString();
    }
}
