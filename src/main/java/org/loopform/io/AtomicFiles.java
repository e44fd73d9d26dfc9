package org.loopform.io;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.Collection;

/** Writes output files whole or not at all: to a temporary file beside the target, then a rename. */
public final class AtomicFiles {
    private AtomicFiles() {
    }

    /**
     * Writes {@code text} to {@code target}, refusing to overwrite any of {@code inputs}
     * (compared as real paths) so that an output can never destroy what it was made from.
     */
    public static void write(Path target, String text, Collection<Path> inputs) {
        Path abs = target.toAbsolutePath().normalize();
        for (Path in : inputs) {
            if (in != null && sameFile(abs, in)) {
                throw new InputException(target + ": this is an input file; choose another output path");
            }
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
            throw new InputException(target + ": cannot be written (" + e.getMessage() + "); check the folder exists"
                    + " and is writable");
        }
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
