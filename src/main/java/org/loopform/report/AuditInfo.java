package org.loopform.report;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;
import org.loopform.audit.InputFile;
import org.loopform.audit.SignOff;
import org.loopform.findings.CheckPolicy;

/**
 * What the report says about the audit itself, its provenance: a title, the loop list's name, when
 * it ran (date, time and zone), the settings used, who signs it, the loopform version, every input
 * file with its SHA-256, and the policy in force.
 */
public record AuditInfo(String title, String input, String generatedAt, String settings, SignOff signOff,
                        String version, List<InputFile> inputs, CheckPolicy policy) {

    /** Hex digits of {@link #fingerprint()} printed in page headers: enough to tell two runs' inputs apart. */
    static final int SHORT_FINGERPRINT = 12;

    public AuditInfo {
        signOff = signOff == null ? SignOff.BLANK : signOff;
        version = version == null || version.isBlank() ? "unknown" : version;
        inputs = List.copyOf(inputs == null ? List.of() : inputs);
        policy = policy == null ? CheckPolicy.DEFAULT : policy;
    }

    /** An audit with nothing signed, no input files listed and the default policy (tests, examples). */
    public AuditInfo(String title, String input, String generatedAt, String settings) {
        this(title, input, generatedAt, settings, SignOff.BLANK, null, List.of(), CheckPolicy.DEFAULT);
    }

    /**
     * One fingerprint of all the inputs: the SHA-256 of the lines {@code role name sha256}, one per
     * input file in the order listed, each ending in a line feed. Two runs on the same bytes with the
     * same names have the same fingerprint; a change in any input changes it.
     */
    public String fingerprint() {
        StringBuilder sb = new StringBuilder();
        for (InputFile f : inputs) {
            sb.append(f.role()).append(' ').append(f.name()).append(' ').append(f.sha256()).append('\n');
        }
        try {
            return HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256")
                    .digest(sb.toString().getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("every Java platform has SHA-256", e);
        }
    }

    /** The first {@value #SHORT_FINGERPRINT} hex digits of {@link #fingerprint()}, for page headers. */
    public String shortFingerprint() {
        return fingerprint().substring(0, SHORT_FINGERPRINT);
    }
}
