#!/usr/bin/env bash
# Accuracy gate for speed work: the candidate jar must give every loop the verdict (and the finding
# topics and severities) the baseline jar gives, on the demo, on the demo list without its source
# scans (so the design loop's continuous reference runs) and on 1,000 generated loops
# (bench/make_loops.py). Also prints how far the design and target figures moved (largest relative
# change per loops.csv column), for the record.
# Usage: bench/verdict-gate.sh BASELINE.jar [CANDIDATE.jar] [LOOPS]   (candidate: target/loopform.jar)
# Build the baseline from the commit before the change, e.g.
#   git stash; mvn -q -o -B -DskipTests package; cp target/loopform.jar /tmp/base.jar; git stash pop
set -euo pipefail
cd "$(dirname "$0")/.."
base=${1:?usage: bench/verdict-gate.sh BASELINE.jar [CANDIDATE.jar] [LOOPS]}
cand=${2:-target/loopform.jar}
n=${3:-1000}
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
python3 bench/make_loops.py "$n" 20261204 > "$work/generated.csv"
python3 - "$work/no-source-scan.csv" <<'PY'
import csv, sys
rows = list(csv.DictReader(open("examples/plant-k7-loops.csv", newline="")))
cols = [c for c in rows[0].keys() if c != "scan"]
with open(sys.argv[1], "w", newline="") as f:
    w = csv.DictWriter(f, cols, extrasaction="ignore")
    w.writeheader()
    for r in rows:
        r["target_scan"] = r["target_scan"] or r["scan"]   # keep the target's scan, drop the source's
        w.writerow(r)
PY
run() { # jar, name, args...
  local jar=$1 name=$2; shift 2
  java -XX:TieredStopAtLevel=1 -jar "$jar" "$@" --out "$work/$name" >/dev/null 2>"$work/$name.err" || {
    rc=$?; [ "$rc" -eq 1 ] || { cat "$work/$name.err" >&2; exit "$rc"; }; }
}
status=0
for side in base cand; do
  jar=$base; [ $side = cand ] && jar=$cand
  run "$jar" "demo-$side" demo
  run "$jar" "nosrc-$side" audit "$work/no-source-scan.csv" --to examples/plant-k7-target.yaml --no-report
  run "$jar" "gen-$side" audit "$work/generated.csv" --to ideal-pb-repeats --no-report
done
for set in demo nosrc gen; do
  python3 - "$work/$set-base" "$work/$set-cand" "$set" <<'PY' || status=1
import csv, json, math, sys
base, cand, name = sys.argv[1:4]
def load(d):
    loops = json.load(open(d + "/loops.json"))["loops"]
    return {l["tag"]: (l["verdict"], sorted((f.get("topic"), f.get("severity")) for f in l.get("findings", [])))
            for l in loops}
b, c = load(base), load(cand)
diff = [t for t in b if b[t] != c.get(t)] + [t for t in c if t not in b]
verdicts = [t for t in b if b[t][0] != c.get(t, (None,))[0]]
print("%-6s %5d loops: %d verdicts changed, %d finding lists changed" % (name, len(b), len(verdicts), len(diff)))
for t in diff[:10]:
    print("   ", t, b.get(t), "->", c.get(t))
rb = {r["tag"]: r for r in csv.DictReader(open(base + "/loops.csv", newline=""))}
rc = {r["tag"]: r for r in csv.DictReader(open(cand + "/loops.csv", newline=""))}
worst = {}
for t, r in rb.items():
    for k, v in r.items():
        if not (k.startswith("design_") or k.startswith("target_")) or t not in rc:
            continue
        try:
            x, y = float(v), float(rc[t][k])
        except ValueError:
            continue
        if math.isfinite(x) and math.isfinite(y):
            rel = abs(x - y) / max(abs(x), 1e-9)
            if rel > worst.get(k, (0, ""))[0]:
                worst[k] = (rel, t)
moved = sorted(((v[0], k, v[1]) for k, v in worst.items() if v[0] > 1e-6), reverse=True)[:8]
for rel, k, t in moved:
    print("    %-28s largest relative change %.2e (%s)" % (k, rel, t))
sys.exit(1 if verdicts else 0)
PY
done
[ $status -eq 0 ] && echo "gate: PASS (no verdict changed)" || echo "gate: FAIL (verdicts changed)"
exit $status
