package org.loopform.io;

import java.io.IOException;
import java.util.Locale;

/**
 * Bytes that are not UTF-8, located by line. An {@link IOException} so that it passes through the
 * CSV parser's own reading unchanged; the readers turn it into an {@link InputException}.
 */
final class NotUtf8Exception extends IOException {

    NotUtf8Exception(String shownName, int line, int badByte, long byteOffset) {
        super(shownName + ":" + line + ": not UTF-8 text (byte 0x" + String.format(Locale.ROOT, "%02X", badByte)
                + " at byte " + byteOffset + ")" + hint(badByte, byteOffset) + "; save the file as UTF-8 (in a"
                + " spreadsheet: Save As, CSV UTF-8; in an editor: encoding UTF-8)");
    }

    private static String hint(int badByte, long byteOffset) {
        if (byteOffset <= 1 && (badByte == 0xFF || badByte == 0xFE)) {
            return ", the file looks like UTF-16";
        }
        return badByte >= 0x80 && badByte <= 0xFF ? ", perhaps Windows-1252 or Latin-1" : "";
    }

    InputException toInput() {
        return new InputException(getMessage());
    }
}
