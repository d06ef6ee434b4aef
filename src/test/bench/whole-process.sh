#!/usr/bin/env bash
# Whole-process timings of issue 17, each Roseate command beside its reference in the same run
# (side_by_side.py: rounds that run every command once in turn; medians, CPU time, load average):
#   start-up  `java -version` | `java -jar target/roseate.jar analyze presets/bench-pink.json` | the
#             target/roseate launcher (the build's class-data-sharing archive)
#   render    600 s of 48 kHz 32-bit float noise through presets/bench-pink.json to a WAV, against
#             numpy + scipy doing the same job (whole_process_jobs.py render)
#   measure   third-octave bands of that 600 s WAV with 65536-point Welch segments, against
#             scipy.signal.welch and band sums (whole_process_jobs.py measure)
#   tools     fit --branches 4, tolerance --trials 100000, diagnose of a 60 s capture (no reference)
# usage: src/test/bench/whole-process.sh [startup|render|measure|tools ...]   (default: all)
#   ROUNDS=N sets the rounds per group (default 7 for start-up, 3 for the others)
set -euo pipefail
cd "$(dirname "$0")/../../.."
B=src/test/bench
W=target/whole-process
DATA=target/bench-data
mkdir -p "$W"
jobs=("$@")
[ ${#jobs[@]} -eq 0 ] && jobs=(startup render measure tools)

echo "== machine"
lscpu | grep -E '^(Model name|CPU\(s\)):' || true
java -version 2>&1 | head -n 1
python3 -c 'import numpy, scipy; print("numpy", numpy.__version__, "scipy", scipy.__version__)'

[ -f target/roseate.jar ] && [ -f target/cp.txt ] || mvn -q -B package -DskipTests
CP="$(cat target/cp.txt):target/classes:target/test-classes"
[ -f "$DATA/bench-pink-sos.txt" ] || java -cp "$CP" org.roseate.bench.BenchData "$DATA" > /dev/null
JAR="java -jar target/roseate.jar"
SEC=600

for job in "${jobs[@]}"; do
  case "$job" in
    startup)
      echo "== start-up (target: analyze within 4x java -version)"
      python3 $B/side_by_side.py -n "${ROUNDS:-7}" "java-version=java -version" \
        "java-jar=$JAR analyze presets/bench-pink.json" "launcher=target/roseate analyze presets/bench-pink.json"
      ;;
    render)
      echo "== render $SEC s, 48 kHz, 32-bit float (target: Roseate 1.5x faster than numpy+scipy)"
      python3 $B/side_by_side.py -n "${ROUNDS:-3}" --warmup 0 \
        "numpy+scipy=python3 $B/whole_process_jobs.py render $DATA $W/scipy.wav $SEC" \
        "roseate=$JAR render presets/bench-pink.json -o $W/roseate.wav --seconds $SEC --bits 32f --force"
      ;;
    measure)
      echo "== measure third-octave bands of a $SEC s 48 kHz float WAV, 65536-point segments (target: 4x scipy)"
      [ -f "$W/input.wav" ] || $JAR render presets/bench-pink.json -o "$W/input.wav" --seconds $SEC --bits 32f > /dev/null
      python3 $B/side_by_side.py -n "${ROUNDS:-3}" \
        "scipy=python3 $B/whole_process_jobs.py measure $W/input.wav 65536" \
        "roseate=$JAR measure $W/input.wav --segment 65536"
      ;;
    tools)
      echo "== design tools (targets: fit 4 branches < 10 s, tolerance 1e5 trials < 10 s, diagnose < 5 s)"
      [ -f "$W/capture60.wav" ] || java -cp "$CP" org.roseate.bench.DiagnoseBench "$W/capture60.wav"
      cmds=("java-version=java -version"
        "fit-4=$JAR fit --branches 4 --series E24 --starts 4 --threads 2 --seed 1"
        "tolerance-1e5=$JAR tolerance presets/bench-pink.json --trials 100000")
      [ -f "$W/capture60.wav" ] && cmds+=("diagnose=$JAR diagnose presets/passive-pink.json $W/capture60.wav --reference-channel 1")
      python3 $B/side_by_side.py -n "${ROUNDS:-3}" --warmup 0 "${cmds[@]}"
      ;;
    *) echo "unknown job $job" >&2; exit 2 ;;
  esac
done
