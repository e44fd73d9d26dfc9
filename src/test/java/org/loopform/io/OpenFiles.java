// plumbing: no published source needed (counts this process's open descriptors of a file, Linux /proc)
package org.loopform.io;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.stream.Stream;

/** How many descriptors this process holds open on one file, read from {@code /proc/self/fd} (Linux). */
final class OpenFiles {

    private static final Path DESCRIPTORS = Path.of("/proc/self/fd");

    private OpenFiles() {
    }

    /** Whether this system lists open descriptors where {@link #on} looks. */
    static boolean countable() {
        return Files.isDirectory(DESCRIPTORS);
    }

    /** The descriptors open on {@code file}. */
    static long on(Path file) throws IOException {
        Path real = file.toRealPath();
        try (Stream<Path> fds = Files.list(DESCRIPTORS)) {
            return fds.filter(fd -> {
                try {
                    return Files.readSymbolicLink(fd).equals(real);
                } catch (IOException | UnsupportedOperationException e) {
                    return false; // closed since it was listed, or not a link
                }
            }).count();
        }
    }
}
