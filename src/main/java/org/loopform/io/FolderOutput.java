package org.loopform.io;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Map;

/**
 * Writes a small output folder whole (a few rendered text files, held in memory) with the same
 * safety as the audit's ({@link AuditOutput}): into a temporary folder beside the target, marked
 * ({@value OutputFolder#MARKER}), then moved into place; an existing folder is replaced only when it
 * is empty, or loopform's own and unchanged (with {@code force}); never when an input lies inside it.
 * It writes what it is handed and renders nothing.
 */
public final class FolderOutput {

    private FolderOutput() {
    }

    /**
     * Writes {@code files} (name to text, UTF-8) as the folder {@code out}; {@code inputs} must not lie in it.
     * Returns the folder as written (absolute).
     */
    public static Path write(Path out, boolean force, Map<String, String> files, Collection<Path> inputs) {
        Path target = OutputFolder.real(out);
        List<Path> realInputs = new ArrayList<>();
        for (Path in : inputs) {
            if (in != null) {
                realInputs.add(OutputFolder.real(in));
            }
        }
        OutputFolder.checkReplaceable(out, target, force, realInputs);
        Path parent = target.getParent();
        try {
            Files.createDirectories(parent);
        } catch (IOException e) {
            throw new InputException(out + ": cannot be created (" + OutputFolder.reason(e) + "); check the folder"
                    + " above it exists and is writable, or choose another --out");
        }
        OutputFolder.sweepStale(parent);
        Path temp = null;
        try {
            temp = Files.createDirectory(parent.resolve(OutputFolder.scratchName(target, "tmp")));
            OutputFolder.markWriting(temp);
            for (Map.Entry<String, String> f : files.entrySet()) {
                Files.writeString(temp.resolve(f.getKey()), f.getValue(), StandardCharsets.UTF_8);
            }
            OutputFolder.markFinished(temp);
            // the folder may have changed since the first look: swapIn checks again just before replacing it
            OutputFolder.swapIn(out, temp, target, force, realInputs);
            temp = null;
            return target;
        } catch (IOException e) {
            throw new InputException(out + ": cannot be written (" + OutputFolder.reason(e) + "); check the folder"
                    + " above it is writable and has free space, or choose another --out");
        } finally {
            if (temp != null) {
                try {
                    OutputFolder.removeFiles(temp);
                } catch (IOException e) {
                    // the next run writing beside it sweeps it
                }
            }
        }
    }
}
