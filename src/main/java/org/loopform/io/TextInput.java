package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.io.StringWriter;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;

/**
 * Opens a user's input file as UTF-8 text, once: a pipe or {@code /dev/stdin} is read exactly like a
 * file and never re-opened. A missing file, a folder, an unreadable file and bytes that are not
 * UTF-8 are each an {@link InputException} that names the file (and the line) and says what to do.
 */
final class TextInput {

    private TextInput() {
    }

    /** A strict UTF-8 reader of {@code path}. */
    static Utf8Reader open(Path path, String shownName) {
        check(path, shownName);
        try {
            InputStream in = Files.newInputStream(path);
            return new Utf8Reader(in, shownName);
        } catch (IOException e) {
            throw unreadable(e, shownName);
        }
    }

    /** The whole text of {@code path}; {@code maxChars} bounds it, with {@code tooLarge} as the message. */
    static String readAll(Path path, String shownName, long maxChars, String tooLarge) {
        try (Utf8Reader r = open(path, shownName)) {
            StringWriter w = new StringWriter();
            char[] buffer = new char[1 << 14];
            long total = 0;
            for (int n; (n = r.read(buffer)) != -1; ) { // a Reader gives -1 at the end, never another negative
                total += n;
                if (total > maxChars) {
                    throw new InputException(tooLarge);
                }
                w.write(buffer, 0, n);
            }
            return w.toString();
        } catch (NotUtf8Exception e) {
            throw e.toInput();
        } catch (IOException e) {
            throw unreadable(e, shownName);
        }
    }

    /** Fails with a clear message when {@code path} is not a readable file (a folder, say). */
    static void check(Path path, String shownName) {
        if (Files.isDirectory(path)) {
            throw new InputException(shownName + ": is a folder, not a file; give the path of the file itself");
        }
        if (!Files.exists(path)) {
            throw new InputException(shownName + ": no such file; check the path");
        }
    }

    static InputException unreadable(IOException e, String shownName) {
        if (e instanceof NoSuchFileException) {
            return new InputException(shownName + ": no such file; check the path");
        }
        if (e instanceof AccessDeniedException) {
            return new InputException(shownName + ": permission denied; make the file readable, or copy it"
                    + " somewhere you can read it");
        }
        return new InputException(shownName + ": cannot be read (" + e.getMessage() + ")");
    }
}
