package org.loopform.findings;

import java.util.List;

/** A policy that breaks a rule of {@link CheckPolicy}; {@link #keys()} names the keys involved, the one to fix first. */
public final class PolicyException extends org.loopform.units.BadInput {

    private final transient List<PolicyKey> keys;

    public PolicyException(String message, PolicyKey... keys) {
        super(message);
        this.keys = List.of(keys);
    }

    /** The keys the message is about, the one to fix first. */
    public List<PolicyKey> keys() {
        return keys;
    }
}
