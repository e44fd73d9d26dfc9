package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Collection;

/**
 * Writes output files whole or not at all: to a temporary file beside the target, then a rename.
 * Never replaces a file loopform did not write: an existing target is replaced only when its
 * beginning holds {@link #MARK}, which every file written here must carry too.
 */
public final class AtomicFiles {

    /** The words by which loopform recognises a single file it wrote (put in a comment near its top). */
    public static final String MARK = "written by loopform";

    /** How far into an existing file the mark is looked for. */
    private static final int MARK_WITHIN_BYTES = 1024;

    private AtomicFiles() {
    }

    /** {@code svg} with an XML comment carrying {@link #MARK} in front of its root element. */
    public static String markedSvg(String svg) {
        return "<!-- " + MARK + "; loopform may replace this file -->\n" + svg;
    }

    /**
     * Writes {@code text} (which must carry {@link #MARK} in its first kilobyte) to {@code target},
     * refusing to overwrite any of {@code inputs} or any file loopform did not write. Links are
     * followed: a link to a file writes that file, a link to nothing is an error.
     */
    public static void write(Path target, String text, Collection<Path> inputs) {
        if (!hasMark(text.getBytes(StandardCharsets.UTF_8))) {
            throw new IllegalArgumentException("an output file must carry the mark '" + MARK + "' near its top");
        }
        Path abs = target.toAbsolutePath().normalize();
        if (Files.isSymbolicLink(abs) && !Files.exists(abs)) {
            throw new InputException(target + ": is a link to nothing; give a path that exists or a new name");
        }
        try {
            if (Files.exists(abs)) {
                abs = abs.toRealPath();
            }
        } catch (IOException e) {
            // keep the path as given; the write below reports what is wrong with it
        }
        for (Path in : inputs) {
            if (in != null && sameFile(abs, in)) {
                throw new InputException(target + ": this is an input file; choose another output path");
            }
        }
        if (Files.isDirectory(abs)) {
            throw new InputException(target + ": is a folder; give a file name");
        }
        if (Files.exists(abs) && !writtenByLoopform(abs)) {
            throw new InputException(target + ": the file exists and loopform did not write it; loopform never"
                    + " replaces a file it did not write: choose another name, or remove the file yourself");
        }
        Path dir = abs.getParent();
        try {
            Files.createDirectories(dir);
            Path tmp = Files.createTempFile(dir, "." + abs.getFileName(), ".part");
            try {
                Files.writeString(tmp, text, StandardCharsets.UTF_8);
                try {
                    Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
                } catch (AtomicMoveNotSupportedException e) {
                    Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING);
                }
            } finally {
                Files.deleteIfExists(tmp);
            }
        } catch (IOException e) {
            throw new InputException(target + ": cannot be written (" + OutputFolder.reason(e) + "); check the folder"
                    + " exists, is writable and has free space");
        }
    }

    private static boolean writtenByLoopform(Path file) {
        if (!Files.isRegularFile(file, LinkOption.NOFOLLOW_LINKS)) {
            return false;
        }
        try (InputStream in = Files.newInputStream(file)) {
            return hasMark(in.readNBytes(MARK_WITHIN_BYTES));
        } catch (IOException e) {
            return false;
        }
    }

    private static boolean hasMark(byte[] bytes) {
        String head = new String(bytes, 0, Math.min(bytes.length, MARK_WITHIN_BYTES), StandardCharsets.UTF_8);
        return head.contains(MARK);
    }

    static boolean sameFile(Path a, Path b) {
        try {
            if (Files.exists(a) && Files.exists(b)) {
                return Files.isSameFile(a, b);
            }
        } catch (IOException e) {
            // fall through to the path comparison
        }
        return a.equals(b.toAbsolutePath().normalize());
    }
}
