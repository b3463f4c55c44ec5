#!/bin/sh
# Java vs scipy on the open ambiguous-start gamma fit, same data files, same start
# (shape 1, rate 1, p 0.3). Run from the repository root:
#     sh benchmarks/compare_scipy.sh            # builds the benchmarks jar if missing
# Steps: (1) scipy_ambiguous_gamma.py generate writes n = 1e4 and 1e5 files with the seeds the
# script's 'time' mode uses (20261201 + n), so both sides fit identical data; (2) the scipy warm
# timings ('time' mode, 5 repeats after a warm-up); (3) the Java maxima and argmax
# (ScipyComparison main, Newton and BFGS); (4) Java warm times by JMH (ScipyComparisonBenchmarks,
# -f 1 -wi 3 -i 5); (5) the ratio scipy median / Java average, and both maxima; (6) the whole
# commands on the same n = 1e5 file, each run as a user runs it, a new process per run:
#     ./incipit intervals --input F --family gamma --method likelihood --exposure-history open --json
#     python3 benchmarks/scipy_ambiguous_gamma.py whole F OUT.json
# (read, fit, intervals, JSON), WHOLE_RUNS runs each (default 7), alternating, wall time by
# date +%s.%N around each run; medians, their ratio, and the two log-likelihoods. The launcher
# is run once first: it builds the jar if needed, and that first run after a build writes the
# list of the classes it loads and, after the command, dumps from it the static class-data-sharing
# archive (lib-examples/target/incipit-app-static.jsa) that later runs start with, so it is
# slower and not timed.
# WHOLE_ONLY=1 runs step (6) alone (after step (1)).
# The machine is shared: numbers are taken under contention; report them as such (uptime is
# printed before and after the whole-command runs).
set -e
root=$(cd "$(dirname "$0")/.." && pwd)
cd "$root"
dir=benchmarks/target/scipy-data
mkdir -p "$dir"
jar=benchmarks/target/benchmarks.jar
if [ -z "$WHOLE_ONLY" ] && [ ! -f "$jar" ]; then
    mvn -o -q -B -DskipTests package -pl benchmarks -am
fi
for n in 10000 100000; do
    f="$dir/ambiguous-gamma-$n.csv"
    [ -f "$f" ] || python3 benchmarks/scipy_ambiguous_gamma.py generate "$n" "$f" $((20261201 + n))
done
if [ -z "$WHOLE_ONLY" ]; then
python3 benchmarks/scipy_ambiguous_gamma.py time 5 | tee "$dir/scipy.txt"
java -cp "$jar" org.incipit.benchmarks.ScipyComparison "$dir/ambiguous-gamma-10000.csv" \
    "$dir/ambiguous-gamma-100000.csv" | tee "$dir/java.txt"
java -Dincipit.scipy.dir="$dir" -jar "$jar" ScipyComparisonBenchmarks -f 1 -wi 3 -i 5 -w 1s -r 1s \
    -jvmArgs "-Dincipit.scipy.dir=$dir" -rf csv -rff "$dir/jmh.csv" | tail -n 8
python3 - "$dir" <<'PY'
import csv, re, sys
d = sys.argv[1]
scipy = {}
for line in open(d + "/scipy.txt"):
    m = dict(re.findall(r"(\w+)=(\S+)", line))
    if line.startswith("RESULT"):
        scipy[int(m["n"])] = m
java = {}
for line in open(d + "/java.txt"):
    m = dict(re.findall(r"(\w+)=(\S+)", line))
    java[(int(m["n"]), m["method"])] = m
jmh = {}
for row in csv.DictReader(open(d + "/jmh.csv")):
    method = "newton" if "newton" in row["Benchmark"] else "bfgs"
    jmh[(int(row["Param: cases"]), method)] = float(row["Score"]) / 1000.0  # ms -> s
for n in sorted(scipy):
    s = scipy[n]
    print("n=%d scipy: median %.4f s, loglik %s (shape %s rate %s p %s, %s iterations)"
          % (n, float(s["median_s"]), s["loglik"], s["shape"], s["rate"], s["p"], s["iterations"]))
    for method in ("newton", "bfgs"):
        j, t = java[(n, method)], jmh[(n, method)]
        print("   java %-6s: %.4f s, loglik %s (shape %s rate %s p %s, %s iterations); scipy/java time ratio %.1f;"
              " loglik difference %.2e"
              % (method, t, j["loglik"], j["shape"], j["rate"], j["p"], j["iterations"],
                 float(s["median_s"]) / t, float(j["loglik"]) - float(s["loglik"])))
PY
fi

# (6) whole commands
f="$dir/ambiguous-gamma-100000.csv"
runs=${WHOLE_RUNS:-7}
./incipit intervals --input "$f" --family gamma --method likelihood --exposure-history open --json \
    > "$dir/whole-java.json"  # warm-up: builds if needed; the first run after a build makes the archive
uptime
: > "$dir/whole-times.txt"
i=0
while [ "$i" -lt "$runs" ]; do
    t0=$(date +%s.%N)
    ./incipit intervals --input "$f" --family gamma --method likelihood --exposure-history open --json \
        > "$dir/whole-java.json"
    t1=$(date +%s.%N)
    python3 benchmarks/scipy_ambiguous_gamma.py whole "$f" "$dir/whole-scipy.json" > "$dir/whole-scipy.txt"
    t2=$(date +%s.%N)
    echo "$t0 $t1 $t2" >> "$dir/whole-times.txt"
    i=$((i + 1))
done
uptime
python3 - "$dir" <<'PY'
import json, statistics, sys
d = sys.argv[1]
java, scipy = [], []
for line in open(d + "/whole-times.txt"):
    t0, t1, t2 = map(float, line.split())
    java.append(t1 - t0)
    scipy.append(t2 - t1)
jl = json.load(open(d + "/whole-java.json"))["logLikelihood"]
sl = json.load(open(d + "/whole-scipy.json"))["logLikelihood"]
mj, ms = statistics.median(java), statistics.median(scipy)
print("whole command, n=100000, %d runs each: java median %.3f s (min %.3f, max %.3f), "
      "scipy median %.3f s (min %.3f, max %.3f); scipy/java %.2f; loglik java %r scipy %r"
      % (len(java), mj, min(java), max(java), ms, min(scipy), max(scipy), ms / mj, jl, sl))
PY
