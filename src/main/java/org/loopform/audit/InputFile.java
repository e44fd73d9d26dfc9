package org.loopform.audit;

import java.util.regex.Pattern;

/**
 * One file an audit read, named as the user gave it, with what it was for ({@code loop list},
 * {@code form}, {@code policy}, {@code sign-off}) and the SHA-256 of its bytes as read (lower-case hex),
 * so that a signed report can later be matched to its inputs. An input that is not a regular file
 * (a pipe, which can be read only once) has an empty {@code sha256}: it cannot be fingerprinted.
 */
public record InputFile(String role, String name, String sha256) {

    private static final Pattern HEX = Pattern.compile("[0-9a-f]{64}");

    public InputFile {
        if (role == null || role.isBlank() || name == null || name.isBlank()) {
            throw new IllegalArgumentException("an input file needs a role and a name");
        }
        sha256 = sha256 == null ? "" : sha256;
        if (!sha256.isEmpty() && !HEX.matcher(sha256).matches()) {
            throw new IllegalArgumentException("sha256 of " + name + " must be 64 lower-case hex digits (got "
                    + sha256 + ")");
        }
    }

    /** Whether the bytes were fingerprinted (false for a pipe). */
    public boolean fingerprinted() {
        return !sha256.isEmpty();
    }
}
