package org.loopform.io;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.Enumeration;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.zip.ZipEntry;
import java.util.zip.ZipFile;
import java.util.zip.ZipOutputStream;

/**
 * Makes a written xlsx workbook the same bytes on every run: the workbook's creation time in its
 * core properties ({@code docProps/core.xml}, {@code dcterms:created}, ECMA-376 Part 2 section 11)
 * and every zip entry's time are set to one given instant, the one the environment's
 * {@code SOURCE_DATE_EPOCH} names (reproducible-builds.org). FastExcel writes the creation time from
 * the clock and offers no way to set it, so the finished file is copied entry by entry, in its own
 * order, with that one text replaced. Zip times are DOS local times: the instant's UTC date and time
 * is written, so the bytes do not depend on the machine's zone (a time before 1980, which DOS time
 * cannot hold, is written as 1980-01-01 00:00, the zip format's earliest).
 */
final class ReproducibleXlsx {

    private static final String CORE = "docProps/core.xml";
    private static final Pattern CREATED = Pattern.compile("(<dcterms:(created|modified)\\b[^>]*>)([^<]*)(</dcterms:\\2>)");
    private static final DateTimeFormatter W3CDTF = DateTimeFormatter.ofPattern("yyyy-MM-dd'T'HH:mm:ss'Z'")
            .withZone(ZoneOffset.UTC);

    private ReproducibleXlsx() {
    }

    /** Rewrites {@code file} in place with every time in it set to {@code when}, its entries deflated. */
    static void fixTimes(Path file, Instant when) throws IOException {
        fixTimes(file, when, false);
    }

    /**
     * As {@link #fixTimes(Path, Instant)}; with {@code stored} the entries are stored uncompressed, so
     * the bytes depend on no compressor's version either (for a small file kept in the repository).
     */
    static void fixTimes(Path file, Instant when, boolean stored) throws IOException {
        LocalDateTime local = LocalDateTime.ofInstant(when, ZoneOffset.UTC);
        String created = W3CDTF.format(when);
        Path copy = file.resolveSibling(file.getFileName() + ".fixing");
        try (ZipFile in = new ZipFile(file.toFile());
             OutputStream raw = new java.io.BufferedOutputStream(Files.newOutputStream(copy));
             ZipOutputStream out = new ZipOutputStream(raw)) {
            for (Enumeration<? extends ZipEntry> e = in.entries(); e.hasMoreElements(); ) {
                ZipEntry entry = e.nextElement();
                ZipEntry fixed = new ZipEntry(entry.getName());
                fixed.setTimeLocal(local);
                if (entry.getName().equals(CORE) || stored) {
                    byte[] bytes = in.getInputStream(entry).readAllBytes();
                    if (entry.getName().equals(CORE)) {
                        String xml = new String(bytes, StandardCharsets.UTF_8);
                        bytes = CREATED.matcher(xml).replaceAll(m -> Matcher.quoteReplacement(m.group(1) + created
                                + m.group(4))).getBytes(StandardCharsets.UTF_8);
                    }
                    if (stored) {
                        java.util.zip.CRC32 crc = new java.util.zip.CRC32();
                        crc.update(bytes);
                        fixed.setMethod(ZipEntry.STORED);
                        fixed.setSize(bytes.length);
                        fixed.setCompressedSize(bytes.length);
                        fixed.setCrc(crc.getValue());
                    }
                    out.putNextEntry(fixed);
                    out.write(bytes);
                } else {
                    out.putNextEntry(fixed);
                    in.getInputStream(entry).transferTo(out);
                }
                out.closeEntry();
            }
        }
        Files.move(copy, file, StandardCopyOption.REPLACE_EXISTING);
    }
}
