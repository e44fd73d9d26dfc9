package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;

/**
 * What a loop list's first bytes say it is, whatever its name: an xlsx workbook is a zip archive
 * (it starts with {@code PK\3\4}, ECMA-376 Part 2, Open Packaging Conventions, which stores a
 * package as a ZIP file); an Excel 97-2003 {@code .xls} workbook, and an xlsx workbook encrypted
 * with a password, are OLE2 compound files (they start with {@code D0 CF 11 E0 A1 B1 1A E1},
 * [MS-CFB] section 2.2; an encrypted workbook holds a stream named {@code EncryptedPackage},
 * [MS-OFFCRYPTO] section 2.3.4.4). Anything else is taken as text.
 */
final class WorkbookBytes {

    enum Kind {
        /** No bytes at all. */
        EMPTY,
        /** A zip archive: an xlsx workbook (or another zip). */
        ZIP,
        /** An OLE2 compound file without an encrypted package: an old .xls workbook. */
        OLD_XLS,
        /** An OLE2 compound file with an encrypted package: a workbook protected by a password. */
        ENCRYPTED,
        /** Anything else, such as CSV text. */
        TEXT
    }

    private static final byte[] ZIP = {'P', 'K', 3, 4};
    private static final byte[] OLE2 = {(byte) 0xD0, (byte) 0xCF, 0x11, (byte) 0xE0, (byte) 0xA1, (byte) 0xB1, 0x1A,
            (byte) 0xE1};
    /** The name of the encrypted stream as an OLE2 directory entry writes it (UTF-16LE). */
    private static final byte[] ENCRYPTED_STREAM = "EncryptedPackage".getBytes(StandardCharsets.UTF_16LE);

    private WorkbookBytes() {
    }

    /** What {@code path} holds, by its bytes; a pipe or a missing file is {@link Kind#TEXT} (not looked into). */
    static Kind of(Path path, String shownName) {
        if (!Files.isRegularFile(path)) {
            return Kind.TEXT;
        }
        try (InputStream in = Files.newInputStream(path)) {
            byte[] head = in.readNBytes(OLE2.length);
            if (head.length == 0) {
                return Kind.EMPTY;
            }
            if (startsWith(head, ZIP)) {
                return Kind.ZIP;
            }
            if (startsWith(head, OLE2)) {
                return holds(in, ENCRYPTED_STREAM) ? Kind.ENCRYPTED : Kind.OLD_XLS;
            }
            return Kind.TEXT;
        } catch (IOException e) {
            throw TextInput.unreadable(e, shownName);
        }
    }

    /**
     * Refuses a workbook given where a CSV loop list was expected (an xlsx file named .csv, an .xls
     * file), saying what it is and what to do; text passes.
     */
    static void refuseWorkbookAsCsv(Path path, String shownName) {
        switch (of(path, shownName)) {
            case ZIP -> throw new InputException(shownName + ": is a zip archive, such as an xlsx workbook, not a CSV"
                    + " file; " + (shownName.toLowerCase(java.util.Locale.ROOT).endsWith(".xlsx")
                    ? "this command reads CSV or YAML loop lists: save the sheet as CSV"
                    : "name an xlsx workbook .xlsx to read it as a workbook, or save the sheet as CSV"));
            case OLD_XLS -> throw new InputException(shownName + ": is an Excel 97-2003 workbook (.xls), not a CSV"
                    + " file; save it as an Excel workbook (.xlsx) or as CSV and give that file");
            case ENCRYPTED -> throw new InputException(shownName + ": is a workbook protected by a password, not a"
                    + " CSV file; save a copy without the password as .xlsx or CSV and give that file");
            default -> {
                // text: the CSV reader says what is wrong with it, if anything
            }
        }
    }

    private static boolean startsWith(byte[] head, byte[] magic) {
        return head.length >= magic.length && Arrays.equals(head, 0, magic.length, magic, 0, magic.length);
    }

    /** Whether the rest of {@code in} contains {@code pattern}, read in blocks (a match may span two). */
    private static boolean holds(InputStream in, byte[] pattern) throws IOException {
        byte[] buf = new byte[(1 << 16) + pattern.length];
        int kept = 0;
        for (int n; (n = in.read(buf, kept, buf.length - kept)) > 0; ) {
            int end = kept + n;
            for (int i = 0; i + pattern.length <= end; i++) {
                if (Arrays.equals(buf, i, i + pattern.length, pattern, 0, pattern.length)) {
                    return true;
                }
            }
            kept = Math.min(pattern.length - 1, end);
            System.arraycopy(buf, end - kept, buf, 0, kept);
        }
        return false;
    }
}
