package org.loopform.io;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.DirectoryStream;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.attribute.BasicFileAttributes;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

/**
 * What makes a folder loopform's own: the marker file {@value #MARKER} that loopform writes into
 * every output folder, listing each file it wrote with its size and modification time. A folder is
 * replaced only when it holds that marker and nothing but the files it lists, unchanged; anything
 * else in it is the user's, and loopform then refuses rather than delete it.
 *
 * <p>Temporary folders ({@code .NAME.loopform-tmp-N}) hold the marker too, with the id of the
 * process writing them, so that one left by a killed run can be recognised and swept. Paths are
 * compared after following links ({@link #real}), so that no link leads a replacement to an input.
 */
final class OutputFolder {

    /** The marker's file name. */
    static final String MARKER = ".loopform-output";

    private static final String FIRST_LINE = "loopform output folder";
    private static final Pattern FILE_LINE = Pattern.compile("^file: (\\d+) (-?\\d+) (.+)$");
    private static final Pattern PID_LINE = Pattern.compile("^writing-pid: (\\d+)$");
    /** Temporary and replaced folders beside a target: {@code .NAME.loopform-tmp-N}, {@code .NAME.loopform-old-N}. */
    private static final Pattern SCRATCH_NAME = Pattern.compile("^\\..+\\.loopform-(tmp|old)-\\d+$");

    private OutputFolder() {
    }

    /** The name of a temporary folder for {@code target}. */
    static String scratchName(Path target, String kind) {
        return "." + target.getFileName() + ".loopform-" + kind + "-" + Math.abs(System.nanoTime());
    }

    /** Writes the marker of a folder being written by this process. */
    static void markWriting(Path dir) throws IOException {
        Files.writeString(dir.resolve(MARKER), header() + "writing-pid: " + ProcessHandle.current().pid() + "\n",
                StandardCharsets.UTF_8);
    }

    /** Writes the marker of a finished folder, listing every file in it (all written by loopform). */
    static void markFinished(Path dir) throws IOException {
        StringBuilder b = new StringBuilder(header());
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            for (Path p : s) {
                String name = p.getFileName().toString();
                if (name.equals(MARKER)) {
                    continue;
                }
                BasicFileAttributes a = Files.readAttributes(p, BasicFileAttributes.class, LinkOption.NOFOLLOW_LINKS);
                b.append("file: ").append(a.size()).append(' ').append(a.lastModifiedTime().toMillis()).append(' ')
                        .append(name).append('\n');
            }
        }
        Path tmp = dir.resolve(MARKER + ".part");
        Files.writeString(tmp, b.toString(), StandardCharsets.UTF_8);
        Files.move(tmp, dir.resolve(MARKER), java.nio.file.StandardCopyOption.REPLACE_EXISTING);
    }

    private static String header() {
        return FIRST_LINE + "\n"
                + "loopform wrote this folder and may replace it (audit --force, demo --out) as long as it holds\n"
                + "nothing but the files listed here, unchanged. Delete this file to keep loopform from ever\n"
                + "replacing the folder.\n";
    }

    /**
     * What in {@code dir} loopform did not write: empty when the folder is loopform's own (its marker is
     * there and every other entry is a file the marker lists, of the size and time it lists).
     * {@link Optional#empty()} when there is no marker at all.
     */
    static Optional<List<String>> foreignEntries(Path dir) throws IOException {
        Path marker = dir.resolve(MARKER);
        if (!Files.isRegularFile(marker, LinkOption.NOFOLLOW_LINKS)) {
            return Optional.empty();
        }
        List<String> lines = Files.readAllLines(marker, StandardCharsets.UTF_8);
        if (lines.isEmpty() || !lines.get(0).equals(FIRST_LINE)) {
            return Optional.empty();
        }
        Map<String, long[]> listed = new LinkedHashMap<>();
        for (String line : lines) {
            Matcher m = FILE_LINE.matcher(line);
            if (m.matches()) {
                listed.put(m.group(3), new long[] {Long.parseLong(m.group(1)), Long.parseLong(m.group(2))});
            }
        }
        List<String> foreign = new ArrayList<>();
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            for (Path p : s) {
                String name = p.getFileName().toString();
                if (name.equals(MARKER)) {
                    continue;
                }
                long[] expected = listed.get(name);
                BasicFileAttributes a = Files.readAttributes(p, BasicFileAttributes.class, LinkOption.NOFOLLOW_LINKS);
                if (expected == null || !a.isRegularFile() || a.size() != expected[0]
                        || a.lastModifiedTime().toMillis() != expected[1]) {
                    foreign.add(name);
                }
            }
        }
        return Optional.of(foreign);
    }

    /**
     * Removes {@code dir} if it is loopform's own (see {@link #foreignEntries}), file by file, and
     * returns whether it is gone. Leaves it, and anything in it, when it holds anything else.
     */
    static boolean removeOwn(Path dir) throws IOException {
        Optional<List<String>> foreign = foreignEntries(dir);
        if (foreign.isEmpty() || !foreign.get().isEmpty()) {
            return false;
        }
        removeFiles(dir);
        return true;
    }

    /** Deletes the plain files directly in {@code dir} (never following links), then {@code dir}; nothing if it is gone. */
    static void removeFiles(Path dir) throws IOException {
        if (!Files.exists(dir, LinkOption.NOFOLLOW_LINKS)) {
            return; // moved into place, or removed already
        }
        try (DirectoryStream<Path> s = Files.newDirectoryStream(dir)) {
            for (Path p : s) {
                if (Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS) || Files.isSymbolicLink(p)) {
                    Files.deleteIfExists(p);
                }
            }
        }
        Files.deleteIfExists(dir);
    }

    /**
     * Removes temporary and replaced folders that earlier runs left in {@code parent} (killed before
     * they could clean up): those named like loopform's scratch folders whose marker names a process
     * that no longer runs. Best effort: a folder that cannot be removed is left as it is.
     */
    static void sweepStale(Path parent) {
        try (DirectoryStream<Path> s = Files.newDirectoryStream(parent)) {
            for (Path p : s) {
                if (SCRATCH_NAME.matcher(p.getFileName().toString()).matches()
                        && Files.isDirectory(p, LinkOption.NOFOLLOW_LINKS) && isStale(p)) {
                    try {
                        removeFiles(p);
                    } catch (IOException e) {
                        // another run may be sweeping it too, or it holds something else: leave it
                    }
                }
            }
        } catch (IOException | UncheckedIOException e) {
            // sweeping is a courtesy; the run goes on without it
        }
    }

    private static boolean isStale(Path scratch) throws IOException {
        Path marker = scratch.resolve(MARKER);
        if (!Files.isRegularFile(marker, LinkOption.NOFOLLOW_LINKS)) {
            return false;
        }
        List<String> lines = Files.readAllLines(marker, StandardCharsets.UTF_8);
        if (lines.isEmpty() || !lines.get(0).equals(FIRST_LINE)) {
            return false;
        }
        for (String line : lines) {
            Matcher m = PID_LINE.matcher(line);
            if (m.matches()) {
                long pid = Long.parseLong(m.group(1));
                return ProcessHandle.of(pid).map(h -> !h.isAlive()).orElse(true);
            }
        }
        // a finished folder renamed aside to be replaced, whose run died before deleting it
        return scratch.getFileName().toString().contains(".loopform-old-");
    }

    /**
     * {@code p} with every link resolved: its real path when it exists, else its nearest existing
     * ancestor's real path with the rest appended. A link to nothing is an error.
     */
    static Path real(Path p) {
        Path abs = p.toAbsolutePath().normalize();
        if (Files.isSymbolicLink(abs) && !Files.exists(abs)) {
            String to;
            try {
                to = Files.readSymbolicLink(abs).toString();
            } catch (IOException e) {
                to = "a path that cannot be read";
            }
            throw new InputException(p + ": is a link to " + to + ", which does not exist; create what it points to,"
                    + " or give another path");
        }
        Path existing = abs;
        Path rest = abs.getFileSystem().getPath("");
        while (existing != null && !Files.exists(existing)) {
            rest = existing.getFileName().resolve(rest);
            existing = existing.getParent();
        }
        if (existing == null) {
            return abs;
        }
        try {
            return existing.toRealPath().resolve(rest).normalize();
        } catch (IOException e) {
            return abs;
        }
    }

    static void checkReplaceable(Path out, Path target, boolean force, List<Path> inputs) {
        for (Path in : inputs) {
            if (in.equals(target)) {
                throw new InputException(out + ": is an input of this run; --out needs a new folder for the outputs"
                        + " (choose another --out)");
            }
            if (in.startsWith(target)) {
                throw new InputException(out + ": the output folder holds an input (" + in + "); choose another --out");
            }
        }
        if (Files.exists(target) && !Files.isDirectory(target)) {
            throw new InputException(out + ": is a file; --out needs a folder (choose another --out)");
        }
        if (!Files.isDirectory(target)) {
            return;
        }
        try {
            if (isEmpty(target)) {
                return;
            }
            Optional<List<String>> foreign = foreignEntries(target);
            if (foreign.isEmpty()) {
                throw new InputException(out + ": the folder exists and loopform did not write it (it has no "
                        + MARKER + " marker); loopform never replaces a folder it did not write: choose"
                        + " another --out, or empty the folder yourself");
            }
            if (!foreign.get().isEmpty()) {
                throw new InputException(out + ": the folder holds files loopform did not write or that were changed"
                        + " since (" + String.join(", ", foreign.get().subList(0, Math.min(5, foreign.get().size())))
                        + (foreign.get().size() > 5 ? ", ..." : "") + "); move them out, or choose another --out");
            }
            if (!force) {
                throw new InputException(out + ": the folder holds an earlier loopform output; add --force to replace"
                        + " it, or choose another --out");
            }
        } catch (IOException e) {
            throw new InputException(out + ": cannot be read (" + reason(e) + "); check its permissions,"
                    + " or choose another --out");
        }
    }

    /**
     * Puts the finished folder {@code temp} in the place of {@code target}: checks once more that
     * {@code target} may be replaced (it may have changed since the first look), moves an earlier
     * output aside, moves {@code temp} in (putting the earlier one back if that fails), and removes
     * the earlier one only if it is still loopform's own; otherwise it is kept and said so.
     * {@code shown} is the path as the user wrote it, for messages.
     */
    static void swapIn(Path shown, Path temp, Path target, boolean force, List<Path> inputs) throws IOException {
        checkReplaceable(shown, target, force, inputs);
        Path old = null;
        if (Files.isDirectory(target) && isEmpty(target)) {
            Files.delete(target); // an empty folder holds nothing to lose (and fails here if that changed)
        } else if (Files.exists(target)) {
            old = target.resolveSibling(scratchName(target, "old"));
            Files.move(target, old, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
        }
        try {
            Files.move(temp, target, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            if (old != null) {
                Files.move(old, target, java.nio.file.StandardCopyOption.ATOMIC_MOVE);
            }
            throw e;
        }
        try {
            // a temporary folder is private to its owner; the finished one reads like any other
            Files.setPosixFilePermissions(target, java.nio.file.attribute.PosixFilePermissions.fromString("rwxr-xr-x"));
        } catch (UnsupportedOperationException e) {
            // not a POSIX file system: leave the platform's default
        }
        if (old != null && !removeOwn(old)) {
            // checked above, so only a change in the last instant leads here: keep what is there
            throw new InputException(shown + ": written; the earlier output was kept in " + old + " because"
                    + " something in it changed while loopform replaced it");
        }
    }

    static boolean isEmpty(Path dir) throws IOException {
        try (Stream<Path> s = Files.list(dir)) {
            return s.findAny().isEmpty();
        }
    }

    /** The reason an I/O operation failed, without the (temporary) path it failed on. */
    static String reason(IOException e) {
        if (e instanceof NoSuchFileException) {
            return "a folder on the way does not exist";
        }
        if (e instanceof java.nio.file.AccessDeniedException) {
            return "permission denied";
        }
        if (e instanceof java.nio.file.FileAlreadyExistsException || e instanceof java.nio.file.NotDirectoryException) {
            return "a file is in the way of a folder";
        }
        if (e instanceof FileSystemException f && f.getReason() != null) {
            return f.getReason();
        }
        return e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
    }
}
