package org.incipit.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Every command's help is printed cleanly and fits 80 columns. */
class HelpTest {

    @ParameterizedTest
    @ValueSource(strings = {"check", "simulate", "growth", "reproduction", "intervals", "delays", "incubation",
        "fatality", "demo", "analyse"})
    void helpFits80ColumnsWithoutWarnings(String command) {
        CliRun r = CliRun.of("help", command);
        assertEquals(0, r.code());
        assertEquals("", r.err(), "no picocli warnings");
        assertTrue(r.out().startsWith("Usage: incipit " + command + " "), r.out());
        assertTrue(r.out().contains("--json"), r.out());
        for (String line : r.out().split(CliRun.NL)) {
            assertTrue(line.length() <= 80, command + " help fits 80 columns: " + line);
        }
    }
}
