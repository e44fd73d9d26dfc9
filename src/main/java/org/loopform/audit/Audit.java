package org.loopform.audit;

import java.util.ArrayDeque;
import java.util.Iterator;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.function.Consumer;
import org.loopform.findings.CheckPolicy;

/**
 * Checks many loops: reads rows as they come, checks them in parallel on all cores, and hands
 * the outcomes to a sink in input order. At most {@link #WINDOW_PER_THREAD} loops per thread are
 * in flight, so memory stays bounded however long the list is. A bad row becomes an outcome
 * with its problems; it does not stop the others.
 */
public final class Audit {

    static final int WINDOW_PER_THREAD = 32;

    private Audit() {
    }

    /** Runs the audit; {@code sink} sees every outcome in input order, on the calling thread. */
    public static AuditSummary run(Iterator<LoopRow> rows, CheckPolicy policy, int threads,
                                   Consumer<LoopOutcome> sink) {
        AuditSummary summary = new AuditSummary();
        int n = Math.max(1, threads);
        ExecutorService pool = Executors.newFixedThreadPool(n, r -> {
            Thread t = new Thread(r, "loopform-audit");
            t.setDaemon(true);
            return t;
        });
        try {
            ArrayDeque<Future<LoopOutcome>> inFlight = new ArrayDeque<>();
            int window = n * WINDOW_PER_THREAD;
            while (rows.hasNext()) {
                LoopRow row = rows.next();
                inFlight.add(pool.submit(() -> check(row, policy)));
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

    /** One row's outcome; input problems become the outcome's problems. */
    public static LoopOutcome check(LoopRow row, CheckPolicy policy) {
        if (!row.ok()) {
            return new LoopOutcome(row, null, row.problems());
        }
        try {
            return new LoopOutcome(row, LoopCheck.run(row.loop(), policy), List.of());
        } catch (IllegalArgumentException e) {
            // input problems (FormException, UnitException and the readers' errors are all of this kind)
            String m = e.getMessage();
            return new LoopOutcome(row, null, List.of(m.startsWith(row.where()) ? m : row.where() + ": " + m));
        }
    }

    private static void deliver(Future<LoopOutcome> f, AuditSummary summary, Consumer<LoopOutcome> sink) {
        LoopOutcome o;
        try {
            o = f.get();
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
        summary.add(o);
        sink.accept(o);
    }
}
