#!/usr/bin/env bash
# Issue 17 target 6: the window's first curve after launch and edit -> redrawn for a 40-part,
# 3-op-amp circuit with the volts budget on (org.roseate.app.WindowTimingProbe), ROUNDS times, each
# in a fresh JVM on the Monocle headless platform with JavaFX's software renderer (no GPU, as on
# these machines). Prints the machine, the load average and each round's figures.
# usage: src/test/bench/window-timings.sh   (ROUNDS=N, default 3; EDITS=N per round, default 60)
set -euo pipefail
cd "$(dirname "$0")/../../.."
[ -f target/cp.txt ] && [ -d target/test-classes/org/roseate/app ] || mvn -q -B package -DskipTests
CP="$(cat target/cp.txt):target/classes:target/test-classes"
echo "== machine"
lscpu | grep -E '^(Model name|CPU\(s\)):' || true
java -version 2>&1 | head -n 1
for r in $(seq "${ROUNDS:-3}"); do
    echo "== round $r, load average $(cut -d' ' -f1-3 /proc/loadavg)"
    java -cp "$CP" org.roseate.app.WindowTimingProbe "${EDITS:-60}" 2>/dev/null | grep -v '^all edits'
done
