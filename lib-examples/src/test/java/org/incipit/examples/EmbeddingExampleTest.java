package org.incipit.examples;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/** The embedding tour runs, prints each estimate beside its truth, and is reproducible. */
class EmbeddingExampleTest {

    private static String run(long seed) {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        EmbeddingExample.run(new PrintStream(b, true, StandardCharsets.UTF_8), seed);
        return b.toString(StandardCharsets.UTF_8);
    }

    @Test
    void tourPrintsEstimatesWithTruthAndIsReproducible() {
        String text = run(20240501L);
        String[] lines = text.split("\\R");
        assertTrue(lines[0].startsWith("simulated "), text);
        assertTrue(text.contains("growth rate per day"), text);
        assertTrue(text.contains("reproduction number"), text);
        assertTrue(text.contains("incubation mean") && text.contains("naive (nearest)"), text);
        // true growth rate: gamma(a = 4, b = 2/3), r = b (1.8^(1/4) - 1) = 0.1055 (Euler-Lotka closed form)
        assertTrue(text.contains("true 0.1055"), text);
        assertEquals(text, run(20240501L), "same seed, same output");
    }

    @Test
    void mainRuns() {
        PrintStream old = System.out;
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        try {
            System.setOut(new PrintStream(b, true, StandardCharsets.UTF_8));
            EmbeddingExample.main(new String[0]);
        } finally {
            System.setOut(old);
        }
        assertEquals(run(20240501L), b.toString(StandardCharsets.UTF_8));
    }
}
