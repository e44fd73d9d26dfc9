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
        AuditSummary summary = new AuditSummary();
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
                inFlight.add(pool.submit(() -> {
                    LoopOutcome o = check(row, policy);
                    return new Prepared<>(o, prepare.apply(o));
                }));
                if (inFlight.size() >= window) {
                    deliver(inFlight.poll(), summary, sink);
                }
            }
            while (!inFlight.isEmpty()) {
                deliver(inFlight.poll(), summary, sink);
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
                    .map(m -> m.startsWith(row.where()) ? m : row.where() + ": " + m).toList());
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
