package org.loopform.io;

import java.io.IOException;
import java.io.OutputStream;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.regex.Pattern;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVRecord;
import org.dhatim.fastexcel.Workbook;
import org.dhatim.fastexcel.Worksheet;

/**
 * Writes {@code examples/plant-k7-loops.xlsx} from {@code examples/plant-k7-loops.csv} (both invented):
 * one sheet, {@code Loops}, with a title row saying the plant is invented, a blank row, then the CSV's
 * header and rows, a plain decimal as a number cell and anything else as a text cell, as a spreadsheet
 * user would type them. The same bytes every time: the workbook's times are set to {@link #WRITTEN}
 * and its entries stored uncompressed ({@link ReproducibleXlsx}), so neither the clock nor the JDK's
 * compressor shows in the file. Regenerate with
 * {@code mvn -o -q test -Dtest=ExampleWorkbookTest -Dloopform.writeExamples=true}.
 */
public final class ExampleWorkbook {

    public static final Path CSV = Path.of("examples/plant-k7-loops.csv");
    public static final Path XLSX = Path.of("examples/plant-k7-loops.xlsx");
    /** The time written into the workbook: a fixed instant, so that the file is reproducible. */
    static final Instant WRITTEN = Instant.parse("2026-01-01T00:00:00Z");
    static final String SHEET = "Loops";
    static final String TITLE = "Plant K-7 loop list: INVENTED for loopform's examples (no real plant);"
            + " the same loops as plant-k7-loops.csv";
    private static final Pattern PLAIN_NUMBER = Pattern.compile("[+-]?(\\d+\\.?\\d*|\\.\\d+)([eE][+-]?\\d+)?");

    private ExampleWorkbook() {
    }

    /** Writes the workbook of {@code csv} to {@code xlsx}. */
    public static void write(Path csv, Path xlsx) throws IOException {
        List<CSVRecord> records;
        try (Reader in = Files.newBufferedReader(csv, StandardCharsets.UTF_8)) {
            records = CSVFormat.RFC4180.parse(in).getRecords();
        }
        try (OutputStream out = Files.newOutputStream(xlsx)) {
            Workbook wb = new Workbook(out, "loopform-examples", "1.0");
            wb.properties().setTitle("Plant K-7 loop list (invented)")
                    .setDescription("Invented for loopform's examples; no real plant.");
            Worksheet ws = wb.newWorksheet(SHEET);
            ws.value(0, 0, TITLE);
            ws.style(0, 0).bold().set();
            for (int r = 0; r < records.size(); r++) {
                CSVRecord rec = records.get(r);
                for (int c = 0; c < rec.size(); c++) {
                    String v = rec.get(c).strip();
                    if (v.isEmpty()) {
                        continue;
                    }
                    // a plain decimal is a number cell, as a spreadsheet keeps what is typed as one
                    if (r > 0 && PLAIN_NUMBER.matcher(v).matches()) {
                        ws.value(2 + r, c, Double.parseDouble(v));
                    } else {
                        ws.value(2 + r, c, v);
                    }
                }
            }
            for (int c = 0; c < records.get(0).size(); c++) {
                ws.style(2, c).bold().set();
            }
            ws.freezePane(0, 3);
            wb.finish();
        }
        ReproducibleXlsx.fixTimes(xlsx, WRITTEN, true);
    }
}
