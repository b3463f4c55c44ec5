package org.incipit.benchmarks;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.TimeUnit;

import org.incipit.core.observe.AmbiguousStartCases;
import org.incipit.io.CsvInput;
import org.incipit.io.ReadOptions;
import org.incipit.io.ReadResult;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;

/**
 * Reading an intervals file ({@code case,end,start}, full-precision day numbers) into
 * {@link AmbiguousStartCases}: the read, scan, time-column parsing and per-row checks of the
 * {@code intervals} command, without the fit. The files are those of the scipy comparison
 * ({@code scipy_ambiguous_gamma.py generate N FILE 20261201+N}, made by
 * {@code benchmarks/compare_scipy.sh}), from the folder of system property
 * {@code incipit.scipy.dir} (default {@code benchmarks/target/scipy-data}). Warm (AverageTime)
 * by default; the first call in a fresh JVM, as a command meets it, with
 * {@code -bm ss -f 10 -wi 0 -i 1 -jvmArgs "-XX:+UseSerialGC -XX:TieredStopAtLevel=1 -Xmn384m"}.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class ReaderBenchmarks {

    @Param({"10000", "100000"})
    public int cases;

    private Path file;

    @Setup
    public void setUp() {
        Path dir = Path.of(System.getProperty("incipit.scipy.dir", "benchmarks/target/scipy-data"));
        file = dir.resolve("ambiguous-gamma-" + cases + ".csv");
        if (!Files.isRegularFile(file)) {
            throw new IllegalStateException("no file " + file + " (run benchmarks/compare_scipy.sh once to make it)");
        }
    }

    /** Reads the file (its candidates are counted, so the result is used). */
    @Benchmark
    public int readIntervals() {
        ReadResult<AmbiguousStartCases> r = CsvInput.intervals(file, ReadOptions.defaults());
        return r.data().candidateCount();
    }
}
