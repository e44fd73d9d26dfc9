package org.loopform.report;

import java.util.OptionalDouble;
import org.loopform.units.Numbers;

/** Escaping, anchors and figure formatting shared by the parts of the HTML report. */
final class Html {
    private Html() {
    }

    /** {@code s} safe as HTML text and as a double- or single-quoted attribute value. */
    static String esc(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder sb = new StringBuilder(s.length() + 16);
        for (int k = 0; k < s.length(); k++) {
            char c = s.charAt(k);
            switch (c) {
                case '&' -> sb.append("&amp;");
                case '<' -> sb.append("&lt;");
                case '>' -> sb.append("&gt;");
                case '"' -> sb.append("&quot;");
                case '\'' -> sb.append("&#39;");
                default -> sb.append(c);
            }
        }
        return sb.toString();
    }

    /**
     * The anchor id of a checked loop's section. Letters, digits and '-' stay; every other
     * character becomes {@code _hex_}, so two different tags never share an id.
     */
    static String loopAnchor(String tag) {
        StringBuilder sb = new StringBuilder("loop-");
        for (int k = 0; k < tag.length(); k++) {
            char c = tag.charAt(k);
            if (c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '-') {
                sb.append(c);
            } else {
                sb.append('_').append(Integer.toHexString(c)).append('_');
            }
        }
        return sb.toString();
    }

    /** The anchor id of a row that could not be checked (its tag may be missing or repeated). */
    static String rowAnchor(int index) {
        return "row-" + (index + 1);
    }

    static String fig(double v, int digits) {
        return Numbers.significant(v, digits);
    }

    /** A figure that may not exist (no crossover in the band, say): "none" then. */
    static String fig(OptionalDouble v, int digits) {
        return v.isPresent() ? Numbers.significant(v.getAsDouble(), digits) : "none";
    }
}
