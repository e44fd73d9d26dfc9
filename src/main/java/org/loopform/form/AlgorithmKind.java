package org.loopform.form;

/** Whether the target computes the output itself (positional) or its change each scan (velocity, incremental). */
public enum AlgorithmKind {
    POSITIONAL,
    VELOCITY
}
