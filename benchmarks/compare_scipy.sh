#!/bin/sh
# Java vs scipy on the open ambiguous-start gamma fit, same data files, same start
# (shape 1, rate 1, p 0.3). Run from the repository root:
#     sh benchmarks/compare_scipy.sh            # builds the benchmarks jar if missing
# Steps: (1) scipy_ambiguous_gamma.py generate writes n = 1e4 and 1e5 files with the seeds the
# script's 'time' mode uses (20261201 + n), so both sides fit identical data; (2) the scipy warm
# timings ('time' mode, 5 repeats after a warm-up); (3) the Java maxima and argmax
# (ScipyComparison main, Newton and BFGS); (4) Java warm times by JMH (ScipyComparisonBenchmarks,
# -f 1 -wi 3 -i 5); (5) the ratio scipy median / Java average, and both maxima.
# Whole-command comparison (./incipit intervals ... --json vs the script's 'whole' mode): pending,
# the intervals command is not in the application yet.
# The machine is shared: numbers are taken under contention; report them as such.
set -e
root=$(cd "$(dirname "$0")/.." && pwd)
cd "$root"
dir=benchmarks/target/scipy-data
mkdir -p "$dir"
jar=benchmarks/target/benchmarks.jar
if [ ! -f "$jar" ]; then
    mvn -o -q -B -DskipTests package -pl benchmarks -am
fi
for n in 10000 100000; do
    f="$dir/ambiguous-gamma-$n.csv"
    [ -f "$f" ] || python3 benchmarks/scipy_ambiguous_gamma.py generate "$n" "$f" $((20261201 + n))
done
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
