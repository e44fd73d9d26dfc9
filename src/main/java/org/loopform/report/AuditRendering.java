package org.loopform.report;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.util.List;
import org.loopform.audit.LoopOutcome;
import org.loopform.check.Verdict;

/**
 * Renders one audited loop's share of the output folder, off the writing thread: its loops.csv
 * row, its entry-sheet rows, its loops.json element, and its report section without plots and (for
 * loops that warn or fail) with them. Rendering is the costly part; writing is then a copy.
 */
public final class AuditRendering {

    private static final ObjectMapper MAPPER = new ObjectMapper();

    private AuditRendering() {
    }

    /**
     * One loop's rendered output; {@code section} and {@code sectionWithPlots} are null without
     * HTML, {@code sectionWithPlots} also for a loop that passes and has no replayed record.
     */
    public record RenderedLoop(List<String> loopRow, List<List<String>> entryRows, String json, String section,
                               String sectionWithPlots, String indexRow,
                               List<List<String>> entryCells) {
    }

    /** Renders {@code o}'s output; safe to call from any thread. */
    public static RenderedLoop render(LoopOutcome o, boolean html) {
        try {
            com.fasterxml.jackson.databind.node.ObjectNode node = AuditRows.loopJson(o);
            if (o.replay() != null) {
                node.set("replay", AuditReplayRows.json(o.replay()));
            }
            // the replay block is built with raw doubles: tidied here as every printed JSON is
            String json = MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(Json.tidy(node));
            String plain = null;
            String plotted = null;
            String index = null;
            if (html) {
                index = HtmlIndex.row(o);
                StringWriter w = new StringWriter();
                HtmlReport.writeLoopSection(w, o, false);
                plain = w.toString();
                boolean replayed = o.replay() != null && o.replay().result() != null;
                if (o.ok() && (o.result().verdict() != Verdict.PASS || replayed)) {
                    StringWriter p = new StringWriter();
                    HtmlReport.writeLoopSection(p, o, true);
                    plotted = p.toString();
                }
            }
            List<String> row = AuditRows.loopRow(o);
            if (o.replay() != null) {
                row = new java.util.ArrayList<>(row);
                row.addAll(AuditReplayRows.cells(o));
            }
            return new RenderedLoop(row, AuditRows.entryRows(o), json, plain, plotted, index,
                    AuditRows.entryCells(o));
        } catch (JsonProcessingException e) {
            throw new UncheckedIOException("cannot render the audit output", e);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot render the audit output", e);
        }
    }
}
