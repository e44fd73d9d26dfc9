#!/usr/bin/env bash
# Times a 10,000-loop CSV audit (FOPDT models, CSV and JSON outputs, no HTML), JVM start included.
# Usage: bench/audit-10k.sh [LOOPS] [RUNS]   (defaults 10000 and 5). Prints each run and the median.
# Runs the launcher ./loopform with its JVM options (LOOPFORM_JAVA_OPTS overrides them).
set -euo pipefail
cd "$(dirname "$0")/.."
loops=${1:-10000}
runs=${2:-5}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
[ -f target/loopform.jar ] || mvn -q -B -DskipTests package
# An invented plant: flows, temperatures and pressures with first-order-plus-dead-time models.
awk -v n="$loops" 'BEGIN {
  srand(20261201);
  print "tag,form,pb,ti,td,scan,pv_range,output_range,model,process_gain,time_constant,dead_time";
  for (i = 1; i <= n; i++) {
    k = i % 3;
    if (k == 0) { printf "FIC-%05d,series-pb-min,%.0f,%.3f,0,1 s,0..50,0..100,fopdt,%.2f,%.1f s,%.1f s\n", i, 150 + 100 * rand(), 0.1 + 0.2 * rand(), 0.8 + 0.5 * rand(), 3 + 4 * rand(), 0.5 + rand() }
    else if (k == 1) { printf "TIC-%05d,series-pb-min,%.0f,%.2f,%.2f,1 s,0..150,0..100,fopdt,%.2f,%.0f s,%.0f s\n", i, 40 + 40 * rand(), 3 + 4 * rand(), 0.2 + 0.3 * rand(), 1 + rand(), 200 + 200 * rand(), 20 + 20 * rand() }
    else { printf "PIC-%05d,series-pb-min,%.0f,%.2f,0,1 s,0..10,0..100,fopdt,%.2f,%.0f s,%.1f s\n", i, 80 + 80 * rand(), 0.4 + 0.6 * rand(), 0.7 + 0.5 * rand(), 15 + 15 * rand(), 1 + 2 * rand() }
  }
}' > "$work/loops.csv"
times=()
for r in $(seq 1 "$runs"); do
  rm -rf "$work/out"
  start=$(date +%s.%N)
  ./loopform audit "$work/loops.csv" --to ideal-pb-repeats --scan 0.5s --out "$work/out" \
    --no-report >/dev/null || [ $? -eq 1 ]
  end=$(date +%s.%N)
  t=$(echo "$end - $start" | bc -l)
  times+=("$t")
  printf 'run %d: %.3f s\n' "$r" "$t"
done
median=$(printf '%s\n' "${times[@]}" | sort -n | awk '{a[NR]=$1} END {print (NR % 2 ? a[(NR+1)/2] : (a[NR/2] + a[NR/2+1]) / 2)}')
printf 'median of %d runs, %d loops, wall time with JVM start: %.3f s (%s cores)\n' "$runs" "$loops" "$median" "$(nproc)"
