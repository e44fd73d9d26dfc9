#!/usr/bin/env bash
# Side-by-side benchmark: loopform's audit against the scripted alternative (bench/reference_audit.py,
# numpy/scipy: exact ZOH plant, discrete PID, margins on a grid, linear step responses) on the same
# invented loop list (bench/make_loops.py). Runs are interleaved; prints each run's wall time, CPU
# (user + sys) and peak RSS, the medians and the ratios.
# Usage: bench/side-by-side.sh [LOOPS] [RUNS] [PYTHON_JOBS]   (defaults 10000, 3, 1)
#   LOOPFORM_JAVA_OPTS  JVM options for loopform (default: the launcher's, see ./loopform)
#   LOOPFORM_CMD        how to run loopform (default: ./loopform, the launcher)
# The Python side runs on the machine's python3 (numpy and scipy required); no virtual environment
# is made because the package index may be out of reach. Its BLAS runs on one thread: on a busy
# machine a threaded BLAS spins on these 2x2 to 3x3 matrices (expm measured 0.3-1.4 ms a call
# instead of 16 us), which would flatter loopform.
set -euo pipefail
cd "$(dirname "$0")/.."
loops=${1:-10000}
runs=${2:-3}
jobs=${3:-1}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
./loopform --version >/dev/null   # builds the jar (and its class-data archive) when needed
python3 bench/make_loops.py "$loops" > "$work/loops.csv"
cmd=${LOOPFORM_CMD:-./loopform}

measure() { # name, command...: appends "name wall cpu rss_kb" to $work/times
  local name=$1; shift
  /usr/bin/time -f "%e %U %S %M" -o "$work/t" "$@" >/dev/null 2>"$work/err" || {
    rc=$?; [ "$rc" -eq 1 ] || { cat "$work/err" >&2; exit "$rc"; }; }
  read -r wall user sys rss < <(tail -1 "$work/t")
  echo "$name $wall $(echo "$user + $sys" | bc -l) $rss" >> "$work/times"
  printf '%-9s wall %7.2f s  cpu %7.2f s  peak rss %6.0f MB\n' "$name" "$wall" "$(echo "$user + $sys" | bc -l)" \
    "$(echo "$rss / 1024" | bc -l)"
}

for r in $(seq 1 "$runs"); do
  rm -rf "$work/out"
  measure loopform $cmd audit "$work/loops.csv" --to ideal-pb-repeats --out "$work/out" --no-report
  measure python env OPENBLAS_NUM_THREADS=1 OMP_NUM_THREADS=1 MKL_NUM_THREADS=1 \
    python3 bench/reference_audit.py "$work/loops.csv" "$work/ref.csv" --jobs "$jobs"
done

med() { awk -v n="$1" -v c="$2" '$1 == n {print $c}' "$work/times" | sort -g |
  awk '{a[NR]=$1} END {print (NR % 2 ? a[(NR+1)/2] : (a[NR/2] + a[NR/2+1]) / 2)}'; }
lw=$(med loopform 2); lc=$(med loopform 3); lr=$(med loopform 4)
pw=$(med python 2); pc=$(med python 3); pr=$(med python 4)
printf '\n%d loops, medians of %d interleaved runs, %s cores, python jobs %s\n' "$loops" "$runs" "$(nproc)" "$jobs"
printf 'loopform: wall %.2f s, cpu %.2f s, peak rss %.0f MB\n' "$lw" "$lc" "$(echo "$lr / 1024" | bc -l)"
printf 'python:   wall %.2f s, cpu %.2f s, peak rss %.0f MB\n' "$pw" "$pc" "$(echo "$pr / 1024" | bc -l)"
printf 'ratio python/loopform: wall %.2fx, cpu %.2fx\n' "$(echo "$pw / $lw" | bc -l)" "$(echo "$pc / $lc" | bc -l)"
