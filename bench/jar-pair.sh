#!/usr/bin/env bash
# Two builds of loopform side by side on one generated list: interleaved runs of
# `audit --to ideal-pb-repeats --no-report` under the launcher's JVM options, each run's wall and CPU
# (user + sys), then the medians and the CPU ratio. For measuring one speed lever against the commit
# before it; the machine is shared, so compare only runs made together.
# Usage: bench/jar-pair.sh BEFORE.jar AFTER.jar [LOOPS] [RUNS]   (defaults 3000, 3)
set -euo pipefail
cd "$(dirname "$0")/.."
before=${1:?usage: bench/jar-pair.sh BEFORE.jar AFTER.jar [LOOPS] [RUNS]}
after=${2:?usage: bench/jar-pair.sh BEFORE.jar AFTER.jar [LOOPS] [RUNS]}
loops=${3:-3000}
runs=${4:-3}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
python3 bench/make_loops.py "$loops" > "$work/loops.csv"
opts=${LOOPFORM_JAVA_OPTS--XX:TieredStopAtLevel=1 -XX:+UseSerialGC}
for ((i = 1; i <= runs; i++)); do
  for side in before after; do
    jar=$before; [ $side = after ] && jar=$after
    # shellcheck disable=SC2086
    /usr/bin/time -f "%e %U %S" -o "$work/t" java $opts -jar "$jar" audit "$work/loops.csv" --to ideal-pb-repeats \
        --no-report --out "$work/out-$side" --force >/dev/null 2>"$work/err" || {
      rc=$?; [ "$rc" -eq 1 ] || { cat "$work/err" >&2; exit "$rc"; }; }
    read -r wall user sys < <(tail -1 "$work/t")
    cpu=$(echo "$user + $sys" | bc -l)
    echo "$side $wall $cpu" >> "$work/times"
    printf '%-6s run %d  wall %6.2f s  cpu %6.2f s  (load %s)\n' "$side" "$i" "$wall" "$cpu" \
        "$(cut -d' ' -f1 /proc/loadavg)"
  done
done
python3 - "$work/times" <<'PY'
import statistics, sys
rows = [l.split() for l in open(sys.argv[1])]
med = {s: (statistics.median(float(r[1]) for r in rows if r[0] == s),
           statistics.median(float(r[2]) for r in rows if r[0] == s)) for s in ("before", "after")}
for s, (w, c) in med.items():
    print("median %-6s wall %6.2f s  cpu %6.2f s" % (s, w, c))
print("cpu after/before %.3f" % (med["after"][1] / med["before"][1]))
PY
