#!/usr/bin/env bash
# Builds the JMH benchmarks (Maven profile 'bench') and runs the full loop check on one thread,
# then prints the median of the measured iterations in checks per second.
# Usage: bench/check-bench.sh [extra JMH options], e.g. bench/check-bench.sh -i 10
# Defaults suit a small shared machine: 1 fork, 3 warm-up and 5 measured iterations of 2 s.
set -euo pipefail
cd "$(dirname "$0")/.."

mvn -q -B -Pbench test-compile
mvn -q -B -Pbench dependency:build-classpath -Dmdep.includeScope=test -Dmdep.outputFile=target/bench.classpath

log=target/check-bench.log
java -cp "target/test-classes:target/classes:$(cat target/bench.classpath)" org.openjdk.jmh.Main \
    'LoopCheckBench' -f 1 -t 1 -wi 3 -w 2s -i 5 -r 2s "$@" | tee "$log"

# JMH prints one 'Iteration   N: <score> ops/s' line per measured iteration (warm-ups say 'Warmup').
grep -E '^Iteration +[0-9]+:' "$log" | awk '{print $3}' | sort -g | awk '
    { v[NR] = $1 }
    END {
        if (NR == 0) { print "no measured iterations found" > "/dev/stderr"; exit 1 }
        m = (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2
        printf "median: %.0f checks/s over %d iterations (min %.0f, max %.0f)\n", m, NR, v[1], v[NR]
    }'
