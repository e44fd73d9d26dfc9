#!/usr/bin/env bash
# Fuzzes every reader of user input for a set time each, with Jazzer (coverage-guided, in process).
#
#   scripts/fuzz.sh [SECONDS] [TARGET...]
#
# SECONDS is the time per target (default 300). TARGET is Class#method (default: all eight below).
# Each target runs in its own JVM (`JAZZER_FUZZ=1`, Jazzer fuzzes one @FuzzTest per run). The
# contract under test: any bytes give a result or org.loopform.units.BadInput, never another
# exception, never an input that takes longer than the @Timeout on the target (10 s).
#
# What it leaves:
#   .cifuzz-corpus/<class>/<method>/   the corpus grown by fuzzing (not committed; reused next run)
#   src/test/resources/<package>/<Class>Inputs/<method>/crash-*   an input that broke the contract;
#       fix the bug and commit the file: `mvn verify` replays it from then on
#   target/fuzz/<method>.log            libFuzzer's log; the summary below reads its last lines
# Exit status: 0 when no target found anything, 1 otherwise.
set -euo pipefail
cd "$(dirname "$0")/.."

SECONDS_EACH=${1:-300}
shift || true
TARGETS=("$@")
if [ ${#TARGETS[@]} -eq 0 ]; then
  TARGETS=(
    org.loopform.io.ReaderFuzzTest#formFile
    org.loopform.io.ReaderFuzzTest#loopFile
    org.loopform.io.ReaderFuzzTest#csvLoopList
    org.loopform.io.ReaderFuzzTest#yamlLoopList
    org.loopform.io.ReaderFuzzTest#xlsxLoopList
    org.loopform.io.ReaderFuzzTest#xlsxSheetXml
    org.loopform.io.ReaderFuzzTest#policyFile
    org.loopform.cli.ConvertValuesFuzzTest#convertValues
  )
fi
MVN=(mvn -B ${MVN_FLAGS:--o})

mkdir -p target/fuzz
"${MVN[@]}" -q test-compile
status=0
total=0
printf '%-48s %12s %8s  %s\n' target executions exec/s result
for t in "${TARGETS[@]}"; do
  log="target/fuzz/${t##*#}.log"
  # JUnit's own timeout would stop the whole fuzzing run (one long invocation); Jazzer turns the
  # @Timeout into libFuzzer's per-input -timeout instead.
  if JAZZER_FUZZ=1 JAZZER_MAX_DURATION="${SECONDS_EACH}s" "${MVN[@]}" surefire:test -Dtest="$t" \
      -Dsurefire.failIfNoSpecifiedTests=false -DtrimStackTrace=false \
      -DargLine="-Xmx1g -Djunit.jupiter.execution.timeout.mode=disabled" >"$log" 2>&1; then
    result=ok
  else
    result="FOUND SOMETHING: see $log"
    status=1
  fi
  runs=$(grep -aoE '^(#[0-9]+)\s+(DONE|pulse|NEW|REDUCE|INITED)' "$log" | tail -1 | grep -oE '[0-9]+' | head -1 || true)
  done_line=$(grep -aoE 'Done [0-9]+ runs in [0-9]+ second' "$log" | tail -1 || true)
  if [ -n "$done_line" ]; then
    runs=$(echo "$done_line" | grep -oE '[0-9]+' | head -1)
  fi
  runs=${runs:-0}
  total=$((total + runs))
  printf '%-48s %12s %8s  %s\n' "$t" "$runs" "$((runs / SECONDS_EACH))" "$result"
done
printf '%-48s %12s\n' total "$total"
exit $status
