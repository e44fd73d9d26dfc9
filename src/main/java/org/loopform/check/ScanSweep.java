package org.loopform.check;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;
import org.loopform.findings.CheckPolicy;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;

/**
 * A loop checked across a range of scan times, and the longest scan that keeps the target loop
 * within the policy: no warning or failure about sampling, derivative, discretization,
 * robustness or stability (the topics the scan time moves).
 */
public final class ScanSweep {

    /** Scan times tried in a range when the target form does not list its own. */
    static final int POINTS = 13;
    static final Set<Topic> SCAN_TOPICS = EnumSet.of(Topic.SAMPLING, Topic.DERIVATIVE, Topic.DISCRETIZATION,
            Topic.ROBUSTNESS, Topic.STABILITY);

    /** The checks by scan time, shortest first, and the longest acceptable scan (null when none is). */
    public record Result(List<CheckResult> checks, Double longestAcceptableSeconds) {
        public Result {
            checks = List.copyOf(checks);
        }
    }

    private ScanSweep() {
    }

    public static Result run(LoopSpec loop, double fromSeconds, double toSeconds, CheckPolicy policy) {
        if (!(fromSeconds > 0) || !(toSeconds > fromSeconds)) {
            throw new IllegalArgumentException("--sweep-scan needs 0 < FROM < TO (got " + fromSeconds + ".." + toSeconds
                    + " s)");
        }
        List<Double> scans = new ArrayList<>();
        for (double h : loop.targetForm().algorithm().allowedScansSeconds()) {
            if (h >= fromSeconds * (1 - 1e-9) && h <= toSeconds * (1 + 1e-9)) {
                scans.add(h);
            }
        }
        if (scans.isEmpty()) {
            for (int k = 0; k < POINTS; k++) {
                scans.add(fromSeconds * Math.pow(toSeconds / fromSeconds, k / (double) (POINTS - 1)));
            }
        }
        scans.sort(null);
        List<CheckResult> checks = new ArrayList<>();
        Double longest = null;
        boolean broken = false;
        for (double h : scans) {
            CheckResult r = LoopCheck.run(loop.withTargetScan(h), policy);
            checks.add(r);
            // the acceptable scans run from the shortest up; a longer one past a bad one does not count
            if (!broken && acceptable(r.findings())) {
                longest = h;
            } else {
                broken = true;
            }
        }
        return new Result(checks, longest);
    }

    /** No warning or failure on a topic the scan time moves. */
    public static boolean acceptable(List<Finding> findings) {
        return findings.stream().noneMatch(f -> SCAN_TOPICS.contains(f.topic()) && f.severity().atLeast(Severity.WARN));
    }
}
