package org.loopform.audit;

import java.util.List;
import org.loopform.form.FormDefinition;

/**
 * What an audit needs to add replay evidence to its loops: where the records are ({@code source}),
 * how to name that place in the report ({@code shownName}, a folder as the user gave it), and the
 * catalog the search for explanations tries the other forms of; with {@code fitTuning}, each replayed
 * loop's old tuning is also fitted to its logged output ({@code replay --fit-tuning}).
 */
public record AuditRecords(RecordSource source, String shownName, List<FormDefinition> catalog, boolean fitTuning) {

    /** Records without the tuning fit. */
    public AuditRecords(RecordSource source, String shownName, List<FormDefinition> catalog) {
        this(source, shownName, catalog, false);
    }

    public AuditRecords {
        if (source == null || shownName == null || catalog == null) {
            throw new IllegalArgumentException("audit records need a source, a name and the catalog");
        }
        catalog = List.copyOf(catalog);
    }
}
