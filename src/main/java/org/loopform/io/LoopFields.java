package org.loopform.io;

import java.io.IOException;
import java.io.Reader;
import java.nio.file.Files;
import java.nio.file.Path;
import org.loopform.form.FormDefinition;
import org.loopform.units.Measure;
import org.loopform.units.Span;
import org.loopform.units.UnitException;

/**
 * The fields every loop reader shares (loop files, YAML loop lists, CSV loop lists): a form named
 * by catalog id or by a path beside the file, a range {@code LO..HI}, a positive duration; each
 * error is prefixed with where it was found ({@code file:line: } or {@code file:line: column: }).
 */
final class LoopFields {

    private LoopFields() {
    }

    /**
     * The form {@code idOrPath}: a bundled catalog id first, else a form file relative to
     * {@code folder} (the folder of the file that names it; may be null), else as given.
     */
    static FormDefinition form(String idOrPath, Path folder, String column) {
        String p = idOrPath;
        if (CatalogLoader.bundled().find(p.trim()).isEmpty() && folder != null) {
            Path given = UserPath.of(p, column, "a catalog id or the path of a form file");
            if (!given.isAbsolute()) {
                Path beside = folder.resolve(given);
                if (Files.isRegularFile(beside)) {
                    p = beside.toString();
                } else if (Files.isRegularFile(given)) {
                    // never the current folder instead: the same file would then mean different forms
                    // depending on where loopform is run, and a stray file of that name would be used silently
                    Path folderAbs = folder.toAbsolutePath().normalize();
                    String relative = folderAbs.relativize(given.toAbsolutePath().normalize()).toString();
                    throw new InputException(column + ": form file '" + UserPath.visible(idOrPath) + "' is not in "
                            + folderAbs + " (a path in a loop file or list is read from that file's folder, not from"
                            + " the current folder); write '" + relative + "' or an absolute path");
                }
            }
        }
        return CatalogLoader.resolve(p, column);
    }

    /** A range {@code LO..HI}; a bad one is an {@link InputException} starting with {@code prefix}. */
    static Span span(String text, String prefix) {
        try {
            return Span.parse(text);
        } catch (UnitException e) {
            throw new InputException(prefix + e.getMessage());
        }
    }

    /** A positive duration in seconds ({@code 0.5 s}, {@code 250ms}, bare seconds); errors as {@link #span}. */
    static double positiveSeconds(String text, String prefix) {
        try {
            return Measure.parsePositiveSeconds(text);
        } catch (UnitException e) {
            throw new InputException(prefix + e.getMessage());
        }
    }

    /** Closes a reader that is given up on, keeping the first error. */
    static void closeQuietly(Reader r) {
        try {
            r.close();
        } catch (IOException ignored) {
            // the file is given up on already
        }
    }
}
