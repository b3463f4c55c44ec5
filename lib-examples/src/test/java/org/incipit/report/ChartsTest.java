package org.incipit.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import java.util.Map;
import org.incipit.core.inference.Estimate;
import org.incipit.core.study.StudySummary;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ChartsTest {

    @TempDir
    Path dir;

    /** Decodes the PNG and checks its size and that it is not blank (more than one colour). */
    private static void decodable(Path png) throws IOException {
        BufferedImage img = ImageIO.read(png.toFile());
        assertNotNull(img, png + " is not a decodable image");
        assertEquals(Charts.WIDTH, img.getWidth());
        assertEquals(Charts.HEIGHT, img.getHeight());
        int first = img.getRGB(0, 0);
        boolean varied = false;
        for (int y = 0; y < img.getHeight() && !varied; y += 7) {
            for (int x = 0; x < img.getWidth() && !varied; x += 7) {
                varied = img.getRGB(x, y) != first;
            }
        }
        assertTrue(varied, png + " is blank");
    }

    @Test
    void histogramWithDensity() throws IOException {
        double[] values = {1, 2, 2, 3, 3, 3, 4, 4, 5, 7};
        double[] x = new double[50];
        double[] y = new double[50];
        for (int i = 0; i < 50; i++) {
            x[i] = 0.2 * i;
            y[i] = x[i] * Math.exp(-x[i] / 1.7) / (1.7 * 1.7); // gamma(2, scale 1.7) density
        }
        Path png = dir.resolve("sub/hist.png");
        Charts.histogram(png, "Serial interval", "days", values, 6, List.of(new Curve("gamma", x, y)));
        decodable(png);
    }

    @Test
    void histogramOfOneDistinctValue() throws IOException {
        Path png = dir.resolve("one.png");
        Charts.histogram(png, "t", "days", new double[] {3, 3}, 4, List.of());
        decodable(png);
    }

    @Test
    void logSeriesWithFittedLineAndZeros() throws IOException {
        double[] day = {0, 1, 2, 3, 4, 5};
        double[] cases = {1, 0, 2, 4, 0, 9};
        double[] fx = {0, 5};
        double[] fy = {1, Math.exp(0.45 * 5)};
        Path png = dir.resolve("growth.png");
        Charts.logSeries(png, "Cases", "day", "cases", day, cases, new Curve("exponential fit", fx, fy));
        decodable(png);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Charts.logSeries(png, "t", "d", "c", new double[] {0}, new double[] {0}, null));
        assertEquals("y has no positive value to draw on a log axis", e.getMessage());
    }

    @Test
    void band() throws IOException {
        double[] t = {0, 1, 2, 3};
        Path png = dir.resolve("band.png");
        Charts.band(png, "R over time", "day", "R", t, new double[] {2, 1.8, 1.5, 1.2},
                new double[] {1.5, 1.4, 1.1, 0.8}, new double[] {2.6, 2.3, 1.9, 1.7});
        decodable(png);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Charts.band(png, "t", "x", "y", new double[] {0}, new double[] {1}, new double[] {2},
                        new double[] {3}));
        assertEquals("at index 0 the interval [2.0, 3.0] does not contain the estimate 1.0", e.getMessage());
    }

    @Test
    void naiveVersusCorrected() throws IOException {
        Path png = dir.resolve("cmp.png");
        Charts.comparison(png, "Naive and corrected", "days", List.of(
                new Comparison("mean serial interval", new Estimate(4.1, 3.6, 4.6, 0.95, "wald"),
                        new Estimate(5.2, 4.4, 6.3, 0.95, "profile")),
                new Comparison("doubling time", new Estimate(3, 2, 5, 0.95, "wald"),
                        new Estimate(4, 2.5, Double.POSITIVE_INFINITY, 0.95, "profile"))));
        decodable(png);
    }

    @Test
    void curveSamplesAnEvenGridEndingExactlyAtTo() {
        Curve c = Curve.of("square", x -> x * x, 0, 0.3, 4);
        double[] x = c.x();
        double[] expected = {0, 0.1, 0.2, 0.3};
        for (int i = 0; i < 4; i++) {
            // 0.3 * i / 3 is one rounding step from the decimal value: 2 ulp
            assertEquals(expected[i], x[i], 2 * Math.ulp(expected[i]), "2 ulp");
        }
        assertEquals(0.3, x[3], 0.0, "last point is exactly 'to'");
        assertEquals(0.3 * 0.3, c.y()[3], 0.0);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Curve.of("log", Math::log, 0, 1, 3));
        assertEquals("curve 'log' y[0] must be finite, was -Infinity", e.getMessage());
    }

    @Test
    void rejectsNonFiniteData() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> Charts.histogram(dir.resolve("x.png"), "t", "x", new double[] {1, Double.NaN}, 3, List.of()));
        assertEquals("values[1] must be finite, was NaN", e.getMessage());
        e = assertThrows(IllegalArgumentException.class,
                () -> new Curve("c", new double[] {1, 2}, new double[] {1}));
        assertEquals("curve 'c' needs x and y of the same length >= 2, had 2 and 1", e.getMessage());
    }

    @Test
    void studySummaryByEstimatorAndSampleSize() throws IOException {
        double[] est = {1, 2, 3};
        double[] lo = {0, 1, 2};
        double[] hi = {2, 3, 4};
        List<StudySummary> rows = List.of(
                StudySummary.of("a", "mean", 5, 2, 0.95, est, lo, hi, Map.of()),
                StudySummary.of("a", "mean", 50, 2, 0.95, est, lo, hi, Map.of("boom", 1)),
                StudySummary.of("b", "mean", 5, 2, 0.95, new double[0], new double[0], new double[0],
                        Map.of("no fit", 3)),
                StudySummary.of("b", "mean", 50, 2, 0.95, est, lo, hi, Map.of()));
        Path png = dir.resolve("study/summary.png");
        Charts.studySummary(png, "Study", rows);
        decodable(png);
        // a truth of 0: the absolute bias is drawn
        Charts.studySummary(png, "Study", List.of(StudySummary.of("a", "r", 5, 0, 0.95, est, lo, hi, Map.of())));
        decodable(png);
        assertThrows(IllegalArgumentException.class, () -> Charts.studySummary(png, "t", List.of()));
    }
}
