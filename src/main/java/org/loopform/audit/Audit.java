package org.loopform.audit;

import org.loopform.check.LoopSpec;
import org.loopform.check.CheckResult;
import org.loopform.check.LoopCheck;
import java.util.ArrayDeque;
import java.util.Iterator;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.function.BiConsumer;
import java.util.function.BiFunction;
import java.util.function.Consumer;
import java.util.function.Function;
import org.loopform.findings.CheckPolicy;
import org.loopform.units.BadInput;
import java.util.ArrayList;
import java.util.Optional;
import org.loopform.findings.CheckRules;
import org.loopform.findings.Finding;
import org.loopform.findings.Severity;
import org.loopform.findings.Topic;
import org.loopform.replay.LoopReplay;
import org.loopform.replay.Trend;

/**
 * Checks many loops: reads rows as they come, checks them in parallel on all cores, and hands
 * the outcomes to a sink in input order. At most {@link #WINDOW_PER_THREAD} loops per thread are
 * in flight, so memory stays bounded however long the list is. A bad row (one that raises
 * {@link BadInput}) becomes an outcome with its problems; it does not stop the others. Any other
 * exception is a bug of loopform and ends the audit.
 */
public final class Audit {

    static final int WINDOW_PER_THREAD = 32;

    private Audit() {
    }

    /** Runs the audit; {@code sink} sees every outcome in input order, on the calling thread. */
    public static AuditSummary run(Iterator<LoopRow> rows, CheckPolicy policy, int threads,
                                   Consumer<LoopOutcome> sink) {
        return run(rows, policy, threads, o -> null, (o, ignored) -> sink.accept(o));
    }

    /**
     * Runs the audit with a {@code prepare} step that runs on the worker threads right after each
     * check (rendering the loop's output rows, say), so that the calling thread only has to write
     * them; {@code sink} then sees every outcome with what was prepared for it, in input order.
     */
    public static <R> AuditSummary run(Iterator<LoopRow> rows, CheckPolicy policy, int threads,
                                       Function<LoopOutcome, R> prepare, BiConsumer<LoopOutcome, R> sink) {
        return run(rows, policy, threads, null, prepare, sink);
    }

    /**
     * As {@link #run(Iterator, CheckPolicy, int, Function, BiConsumer)}, and with {@code records}
     * (null: none) each loop that has a record is also replayed ({@link #check(LoopRow, CheckPolicy, AuditRecords)}).
     */
    public static <R> AuditSummary run(Iterator<LoopRow> rows, CheckPolicy policy, int threads, AuditRecords records,
                                       Function<LoopOutcome, R> prepare, BiConsumer<LoopOutcome, R> sink) {
        AuditSummary summary = new AuditSummary(records == null ? null : records.shownName());
        int n = Math.max(1, threads);
        ExecutorService pool = Executors.newFixedThreadPool(n, r -> {
            Thread t = new Thread(r, "loopform-audit");
            t.setDaemon(true);
            return t;
        });
        try {
            ArrayDeque<Future<Prepared<R>>> inFlight = new ArrayDeque<>();
            int window = n * WINDOW_PER_THREAD;
            while (rows.hasNext()) {
                LoopRow row = rows.next();
                if (records != null) {
                    records.source().seen(row.tag());
                }
                inFlight.add(pool.submit(() -> {
                    LoopOutcome o = check(row, policy, records);
                    return new Prepared<>(o, prepare.apply(o));
                }));
                if (inFlight.size() >= window) {
                    deliver(inFlight.poll(), summary, sink);
                }
            }
            while (!inFlight.isEmpty()) {
                deliver(inFlight.poll(), summary, sink);
            }
            if (records != null) {
                summary.replay().unmatched(records.source().unmatched());
            }
        } finally {
            pool.shutdownNow();
        }
        return summary;
    }

    private record Prepared<R>(LoopOutcome outcome, R prepared) {
    }

    /** One row's outcome; input problems become the outcome's problems. */
    public static LoopOutcome check(LoopRow row, CheckPolicy policy) {
        return check(row, policy, LoopCheck::run);
    }

    /**
     * One row's outcome with its replay evidence when {@code records} is given (null: none): a loop
     * whose record is found is replayed ({@link LoopReplay}) and the replay's findings (topic
     * replay) join the check's, so they count in its verdict. A record that cannot be read or
     * replayed leaves the check's figures as they are, is reported with its problems, and adds a
     * warning, so the loop never passes clean on evidence that was asked for and is missing. A new
     * loop tuned by rule has no old controller to validate: its record is read (a broken one is
     * still reported, a readable one listed in the provenance) but not replayed
     * ({@link ReplayEvidence.Status#NOT_USED}).
     */
    public static LoopOutcome check(LoopRow row, CheckPolicy policy, AuditRecords records) {
        LoopOutcome o = check(row, policy);
        if (records == null || !o.ok()) {
            return o;
        }
        ReplayEvidence evidence = evidence(row, policy, records);
        CheckResult r = o.result();
        List<Finding> added = new ArrayList<>();
        if (evidence.result() != null) {
            evidence.result().findings().stream().filter(f -> f.topic() == Topic.REPLAY).forEach(added::add);
        } else if (evidence.status() == ReplayEvidence.Status.UNREADABLE) {
            added.add(unreadable(evidence));
        }
        if (!added.isEmpty()) {
            List<Finding> findings = new ArrayList<>(r.findings());
            findings.addAll(added);
            r = new CheckResult(r.loop(), r.scanSeconds(), r.conversion(), r.comparison(), r.mismatch(),
                    r.mismatchCurve(), findings);
        }
        return new LoopOutcome(row, r, o.problems(), evidence);
    }

    /** The warning an unreadable record gives its loop: the evidence asked for is missing. */
    private static Finding unreadable(ReplayEvidence e) {
        return new Finding(Topic.REPLAY, Severity.WARN, null, null, "", CheckRules.REPLAY_POLICY, "The loop's record"
                + " could not be read or replayed, so the listed old controller is not validated against the plant: "
                + String.join("; ", e.problems()) + ". Fix the record and audit again.");
    }

    private static ReplayEvidence evidence(LoopRow row, CheckPolicy policy, AuditRecords records) {
        try {
            Optional<Trend> trend = records.source().find(row.tag());
            if (trend.isEmpty()) {
                return ReplayEvidence.NONE;
            }
            if (row.tunedByRule()) {
                return ReplayEvidence.NOT_USED; // no old controller ran: nothing to validate, no as-found to compare with
            }
            return ReplayEvidence.replayed(LoopReplay.run(row.loop(), trend.get(), records.catalog(), policy,
                    records.fitTuning()));
        } catch (BadInput e) {
            // a record that cannot be read or replayed is this loop's problem, not the audit's
            return ReplayEvidence.unreadable(e.problems().stream()
                    .map(m -> m.startsWith(row.where()) || row.loop().placed(m) || m.contains(".csv") ? m
                            : row.where() + ": record: " + m)
                    .toList());
        }
    }

    /** As {@link #check(LoopRow, CheckPolicy)} with the check given (tests give one that fails). */
    static LoopOutcome check(LoopRow row, CheckPolicy policy, BiFunction<LoopSpec, CheckPolicy, CheckResult> checker) {
        if (!row.ok()) {
            return new LoopOutcome(row, null, row.problems());
        }
        try {
            return new LoopOutcome(row, checker.apply(row.loop(), policy), List.of());
        } catch (BadInput e) {
            // only bad input becomes a bad row; anything else is a bug and stops the audit (exit 3)
            return new LoopOutcome(row, null, e.problems().stream()
                    .map(m -> m.startsWith(row.where()) || row.loop().placed(m) ? m : row.where() + ": " + m)
                    .toList());
        }
    }

    private static <R> void deliver(Future<Prepared<R>> f, AuditSummary summary, BiConsumer<LoopOutcome, R> sink) {
        Prepared<R> p;
        try {
            p = f.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("audit interrupted", e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(c);
        }
        summary.add(p.outcome());
        sink.accept(p.outcome(), p.prepared());
    }
}
