package org.loopform.audit;

import java.util.Optional;
import org.loopform.replay.Trend;

/**
 * Where an audit finds a loop's logged record: the record of a tag, or empty when there is none.
 * A record that exists but cannot be read raises {@link org.loopform.units.BadInput} with its
 * problems written as {@code file:line: field: message}; the audit then reports them for that loop
 * and goes on. Called from the audit's worker threads, so implementations must be thread-safe.
 */
@FunctionalInterface
public interface RecordSource {

    /** The record of {@code tag}, or empty when there is none. */
    Optional<Trend> find(String tag);

    /**
     * The records found so far, readable or not, each as an input file (role {@code record}) with
     * its SHA-256, in name order, for the audit's provenance; none by default.
     */
    default java.util.List<InputFile> filesRead() {
        return java.util.List.of();
    }

    /**
     * Told, on the audit's calling thread, of every tag the list holds (bad rows' too), so that the
     * source can later name the records that match no loop; nothing by default.
     */
    default void seen(String tag) {
    }

    /** The records that matched no tag {@link #seen} so far, by name in name order; none by default. */
    default java.util.List<String> unmatched() {
        return java.util.List.of();
    }
}
