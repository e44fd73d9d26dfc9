package org.loopform.tuning;

import java.util.Locale;

/** The published tuning rules, by the id the command line uses, each with its source. */
public enum Rule {
    ZN_STEP("zn-step", "Ziegler & Nichols, \"Optimum settings for automatic controllers\", Trans. ASME 64 (1942)"
            + " 759-768, step-response (reaction curve) method"),
    ZN_ULTIMATE("zn-ultimate", "Ziegler & Nichols, \"Optimum settings for automatic controllers\", Trans. ASME 64"
            + " (1942) 759-768, ultimate-sensitivity method"),
    COHEN_COON("cohen-coon", "Cohen & Coon, \"Theoretical consideration of retarded control\", Trans. ASME 75 (1953)"
            + " 827-834"),
    SIMC("simc", "Skogestad, \"Simple analytic rules for model reduction and PID controller tuning\", J. Process"
            + " Control 13 (2003) 291-309"),
    LAMBDA("lambda", "Astrom & Hagglund, Advanced PID Control, ISA 2006, ch. 7 (lambda tuning)"),
    AMIGO("amigo", "Astrom & Hagglund, \"Revisiting the Ziegler-Nichols step response method for PID control\","
            + " J. Process Control 14 (2004) 635-650"),
    IMC("imc", "Rivera, Morari & Skogestad, \"Internal model control. 4. PID controller design\", Ind. Eng. Chem."
            + " Process Des. Dev. 25 (1986) 252-265, Table 1");

    private final String id;
    private final String source;

    Rule(String id, String source) {
        this.id = id;
        this.source = source;
    }

    public String id() {
        return id;
    }

    public String source() {
        return source;
    }

    /** The rule with this id; null when there is none. */
    public static Rule byId(String id) {
        String wanted = id.trim().toLowerCase(Locale.ROOT);
        for (Rule r : values()) {
            if (r.id.equals(wanted)) {
                return r;
            }
        }
        return null;
    }

    /** "zn-step, zn-ultimate, ...": for messages and help. */
    public static String ids() {
        StringBuilder sb = new StringBuilder();
        for (Rule r : values()) {
            sb.append(sb.length() == 0 ? "" : ", ").append(r.id);
        }
        return sb.toString();
    }
}
