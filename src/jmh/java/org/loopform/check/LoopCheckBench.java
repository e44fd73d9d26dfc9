package org.loopform.check;

import java.util.concurrent.TimeUnit;
import org.loopform.findings.CheckPolicy;
import org.loopform.io.LoopFileReader;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * One full check of a first-order-plus-dead-time loop (gain 2, T 60 s, L 10 s) tuned as an ideal
 * PID and carried to ideal-pb-repeats at a 0.5 s scan: conversion, design and target margins on
 * the analysis grid, both loops' setpoint and load steps, metrics and findings. The horizon is
 * held at {@value #HORIZON_SECONDS} s so that the target loop runs {@value #TARGET_STEPS} scans
 * (the design loop runs its fine-step reference over the same horizon). Run it with
 * {@code bench/check-bench.sh}.
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
public class LoopCheckBench {

    static final double SCAN_SECONDS = 0.5;
    static final int TARGET_STEPS = 2000;
    static final double HORIZON_SECONDS = TARGET_STEPS * SCAN_SECONDS;

    private static final String LOOP = String.join("\n",
            "tag: BENCH-1",
            "process: {model: fopdt, gain: 2.0, time_constant: 60 s, dead_time: 10 s}",
            "tuning: {form: ideal, kc: 1.2, ti: 60, td: 4, n: 10}",
            "target: {form: ideal-pb-repeats, scan: 0.5 s}",
            "");

    private LoopSpec loop;

    @Setup(Level.Trial)
    public void readLoop() {
        loop = LoopFileReader.parseAll(LOOP, "bench.yaml").get(0);
        CheckResult r = LoopCheck.run(loop, CheckPolicy.DEFAULT, HORIZON_SECONDS);
        // the PV is recorded between scans too: count scans by the run's length, not by its samples
        var sp = r.targetRun().setpoint();
        int steps = (int) Math.round(sp.timeSeconds(sp.size() - 1) / SCAN_SECONDS);
        if (steps != TARGET_STEPS) {
            throw new IllegalStateException("target loop runs " + steps + " scans, expected " + TARGET_STEPS);
        }
    }

    @Benchmark
    public CheckResult check() {
        return LoopCheck.run(loop, CheckPolicy.DEFAULT, HORIZON_SECONDS);
    }
}
