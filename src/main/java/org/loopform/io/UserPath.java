package org.loopform.io;

import java.nio.file.InvalidPathException;
import java.nio.file.Path;

/**
 * A path the user wrote (an option, a cell, a YAML value). Text that no path can hold (a NUL
 * character, for instance) is bad input, not an {@link InvalidPathException} escaping as a bug.
 */
final class UserPath {
    private UserPath() {
    }

    /**
     * {@code text} as a path; {@code field} names the user's key in the message, {@code meant}
     * what a good value is ("a catalog id or the path of a form file").
     */
    static Path of(String text, String field, String meant) {
        try {
            return Path.of(text);
        } catch (InvalidPathException e) {
            throw new InputException(field + ": '" + visible(text) + "' is not " + meant + " (" + e.getReason()
                    + "); retype the value, without control characters");
        }
    }

    /** {@code text} with control characters written as {@code \\uXXXX}, so a message shows them. */
    static String visible(String text) {
        StringBuilder b = new StringBuilder(text.length());
        text.codePoints().forEach(c -> {
            if (Character.isISOControl(c)) {
                b.append(String.format("\\u%04x", c));
            } else {
                b.appendCodePoint(c);
            }
        });
        return b.toString();
    }
}
