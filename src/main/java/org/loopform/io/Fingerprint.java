package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;

/** SHA-256 fingerprints of input files (FIPS 180-4), as lower-case hex, for the audit's provenance. */
public final class Fingerprint {
    private Fingerprint() {
    }

    /**
     * The SHA-256 of {@code path}'s bytes; a file that cannot be read is bad input naming it. Empty
     * for anything but a regular file: a pipe can be read only once, and its reader needs it.
     */
    public static String sha256(Path path, String shownName) {
        if (!Files.isRegularFile(path)) {
            return "";
        }
        MessageDigest md = digest();
        try (InputStream in = Files.newInputStream(path)) {
            byte[] buf = new byte[1 << 16];
            for (int n; (n = in.read(buf)) > 0; ) {
                md.update(buf, 0, n);
            }
        } catch (IOException e) {
            throw new InputException(shownName + ": cannot be read to fingerprint it (" + OutputFolder.reason(e)
                    + "); check it exists and is readable");
        }
        return HexFormat.of().formatHex(md.digest());
    }

    /** The SHA-256 of {@code bytes} (a bundled resource, say). */
    public static String sha256(byte[] bytes) {
        return HexFormat.of().formatHex(digest().digest(bytes));
    }

    private static MessageDigest digest() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
    }
}
