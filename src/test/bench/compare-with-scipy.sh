#!/usr/bin/env bash
# Benchmarks side by side with the reference, in one run, on the same data:
#   1. builds (test classes, the fat jar, target/cp.txt with the test classpath);
#   2. BenchData writes the shared data once: a seeded float64 signal and the eight sections;
#   3. JMH runs the Java benchmarks (org.roseate.bench) on that data, results to target/jmh.json;
#   4. CpuTimeProbe gives the thread CPU time of the cascade and chain bodies (load-independent), and
#      compare_with_scipy.py times scipy.signal.sosfilt / welch on the same files and prints ratios;
#   5. hyperfine times `java -jar target/roseate.jar analyze presets/bench-pink.json` end to end;
#   6. /usr/bin/time -v compares peak RSS of a 10 s and a 600 s render.
# usage: src/test/bench/compare-with-scipy.sh [extra JMH options, e.g. -f 1 -wi 2 -i 3]
set -euo pipefail
cd "$(dirname "$0")/../../.."

echo "== machine"
lscpu | grep -E '^(Model name|CPU\(s\)|Thread\(s\) per core|L2 cache|L3 cache):' || true
java -version 2>&1 | head -n 1

echo "== build"
mvn -q -B package -DskipTests
CP="$(cat target/cp.txt):target/classes:target/test-classes"
DATA=target/bench-data

echo "== shared data"
java -cp "$CP" org.roseate.bench.BenchData "$DATA"

echo "== JMH (load: $(cut -d' ' -f1-3 /proc/loadavg))"
java -cp "$CP" org.openjdk.jmh.Main 'org.roseate.bench.*' -p dataDir="$DATA" -rf json -rff target/jmh.json "$@" \
  > target/jmh.log 2>&1 || { tail -n 40 target/jmh.log; exit 1; }
grep -E '^(Benchmark|[A-Za-z]+Bench\.)' target/jmh.log || true

echo "== thread CPU time of the same bodies (CpuTimeProbe, one JVM each; load: $(cut -d' ' -f1-3 /proc/loadavg))"
: > target/cpu-probe.txt
for b in cascade chain live; do
  java -cp "$CP" org.roseate.bench.CpuTimeProbe "$DATA" "$b" | tee -a target/cpu-probe.txt
done

echo "== scipy on the same data (OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE unset for this command only)"
env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE python3 src/test/bench/compare_with_scipy.py "$DATA" target/jmh.json target/cpu-probe.txt

echo "== CLI analyze end to end (JVM start included)"
if command -v hyperfine >/dev/null; then
  hyperfine -N --warmup 2 --runs 10 'java -jar target/roseate.jar analyze presets/bench-pink.json' --export-json target/hyperfine.json \
    | grep -E 'Time|Range'
else
  for i in 1 2 3 4 5; do /usr/bin/time -f '%e s' java -jar target/roseate.jar analyze presets/bench-pink.json > /dev/null; done
fi

echo "== memory: peak RSS of a 10 s and a 600 s render (48 kHz mono, 24-bit)"
for s in 10 600; do
  out="target/bench-render-$s.wav"
  rm -f "$out"
  /usr/bin/time -v java -jar target/roseate.jar render presets/bench-pink.json -o "$out" --seconds "$s" \
    > /dev/null 2> "target/time-$s.txt"
  rss=$(grep 'Maximum resident set size' "target/time-$s.txt" | awk '{print $NF}')
  wall=$(grep 'Elapsed (wall clock)' "target/time-$s.txt" | awk '{print $NF}')
  echo "render --seconds $s: peak RSS ${rss} kB, wall ${wall}, file $(stat -c %s "$out") bytes"
  rm -f "$out"
done
