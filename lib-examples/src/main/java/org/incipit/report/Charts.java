package org.incipit.report;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Graphics2D;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Rectangle2D;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.AxisState;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberTick;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.SymbolAxis;
import org.jfree.chart.plot.CombinedDomainXYPlot;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.DeviationRenderer;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.renderer.xy.XYErrorRenderer;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.statistics.HistogramDataset;
import org.jfree.data.statistics.HistogramType;
import org.jfree.data.xy.XYSeries;
import org.jfree.data.xy.XYSeriesCollection;
import org.jfree.data.xy.YIntervalSeries;
import org.jfree.data.xy.YIntervalSeriesCollection;
import org.incipit.core.inference.Estimate;
import org.incipit.core.study.StudySummary;

/**
 * Standard figures as PNG files (JFreeChart, drawn headless). Every method validates its data
 * (finite numbers, matching lengths), creates missing parent directories, overwrites the file
 * and does not modify the arrays passed in. Figures are {@link #WIDTH} by {@link #HEIGHT}
 * pixels.
 */
public final class Charts {

    /** Width of a figure in pixels. */
    public static final int WIDTH = 800;
    /** Height of a figure in pixels. */
    public static final int HEIGHT = 500;

    private static final Color BARS = new Color(0x9ecae1);
    private static final Color[] LINES = {new Color(0xd62728), new Color(0x2ca02c), new Color(0x9467bd),
        new Color(0xff7f0e)};
    private static final Color NAIVE = new Color(0x7f7f7f);
    private static final Color CORRECTED = new Color(0x1f77b4);

    static {
        if (System.getProperty("java.awt.headless") == null) {
            System.setProperty("java.awt.headless", "true");
        }
    }

    private Charts() {
    }

    /**
     * Histogram of observed values on the density scale (bar areas sum to 1), with fitted
     * densities drawn over it.
     *
     * @param png       output file
     * @param title     figure title
     * @param xLabel    label of the value axis, e.g. "serial interval (days)"
     * @param values    observed values, finite, at least one
     * @param bins      number of equal-width bins, &ge; 1
     * @param densities curves drawn over the bars (may be empty)
     * @throws IllegalArgumentException if the data are invalid
     * @throws IOException              if the file cannot be written
     */
    public static void histogram(Path png, String title, String xLabel, double[] values, int bins,
                                 List<Curve> densities) throws IOException {
        requireFinite("values", values);
        if (values.length == 0) {
            throw new IllegalArgumentException("values must not be empty");
        }
        if (bins < 1) {
            throw new IllegalArgumentException("bins must be >= 1, was " + bins);
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double v : values) {
            lo = Math.min(lo, v);
            hi = Math.max(hi, v);
        }
        if (hi == lo) {
            lo -= 0.5;
            hi += 0.5;
        }
        HistogramDataset h = new HistogramDataset();
        h.setType(HistogramType.SCALE_AREA_TO_1);
        h.addSeries("observed (n = " + values.length + ")", values.clone(), bins, lo, hi);
        XYPlot plot = new XYPlot(h, new NumberAxis(xLabel), new NumberAxis("density"), null);
        XYBarRenderer bars = new XYBarRenderer();
        bars.setBarPainter(new StandardXYBarPainter());
        bars.setShadowVisible(false);
        bars.setSeriesPaint(0, BARS);
        bars.setDrawBarOutline(true);
        bars.setSeriesOutlinePaint(0, Color.WHITE);
        plot.setRenderer(0, bars);
        XYSeriesCollection curves = new XYSeriesCollection();
        for (Curve c : densities) {
            curves.addSeries(series(c));
        }
        plot.setDataset(1, curves);
        plot.setRenderer(1, lines(curves.getSeriesCount()));
        write(png, chart(title, plot));
    }

    /**
     * Counts over time on a logarithmic axis, with a fitted line (e.g. exponential growth). Counts
     * of zero cannot be drawn on a log axis: they are left out and their number is stated
     * under the title.
     *
     * @param png    output file
     * @param title  figure title
     * @param xLabel time axis label, e.g. "day"
     * @param yLabel count axis label, e.g. "cases per day"
     * @param x      times, finite
     * @param y      counts, finite and &ge; 0, same length as {@code x}
     * @param fitted fitted curve (positive values), or null
     * @throws IllegalArgumentException if the data are invalid or no count is positive
     * @throws IOException              if the file cannot be written
     */
    public static void logSeries(Path png, String title, String xLabel, String yLabel, double[] x, double[] y,
                                 Curve fitted) throws IOException {
        sameLength("x", x, "y", y);
        requireFinite("x", x);
        requireFinite("y", y);
        XYSeries s = new XYSeries("observed", false, true);
        int zeros = 0;
        for (int i = 0; i < x.length; i++) {
            if (y[i] < 0) {
                throw new IllegalArgumentException("y[" + i + "] must be >= 0, was " + y[i]);
            }
            if (y[i] == 0) {
                zeros++;
            } else {
                s.add(x[i], y[i]);
            }
        }
        if (s.getItemCount() == 0) {
            throw new IllegalArgumentException("y has no positive value to draw on a log axis");
        }
        XYSeriesCollection data = new XYSeriesCollection(s);
        LogAxis axis = new LogAxis(yLabel);
        axis.setSmallestValue(1e-3);
        XYPlot plot = new XYPlot(data, new NumberAxis(xLabel), axis, null);
        XYLineAndShapeRenderer points = new XYLineAndShapeRenderer(false, true);
        points.setSeriesPaint(0, Color.DARK_GRAY);
        plot.setRenderer(0, points);
        if (fitted != null) {
            for (double v : fitted.y()) {
                if (!(v > 0)) {
                    throw new IllegalArgumentException("fitted curve must be > 0 on a log axis, had " + v);
                }
            }
            XYSeriesCollection fit = new XYSeriesCollection(series(fitted));
            plot.setDataset(1, fit);
            plot.setRenderer(1, lines(1));
        }
        JFreeChart chart = chart(title, plot);
        if (zeros > 0) {
            chart.addSubtitle(new TextTitle(zeros + (zeros == 1 ? " day" : " days")
                    + " with a count of 0 not shown (log scale)"));
        }
        write(png, chart);
    }

    /**
     * An estimate with its interval over time, drawn as a line inside a shaded band.
     *
     * @param png      output file
     * @param title    figure title
     * @param xLabel   time axis label
     * @param yLabel   value axis label, e.g. "reproduction number"
     * @param x        times, finite
     * @param estimate estimates, finite, same length
     * @param lower    lower bounds, finite, &le; estimate
     * @param upper    upper bounds, finite, &ge; estimate
     * @throws IllegalArgumentException if the data are invalid
     * @throws IOException              if the file cannot be written
     */
    public static void band(Path png, String title, String xLabel, String yLabel, double[] x, double[] estimate,
                            double[] lower, double[] upper) throws IOException {
        sameLength("x", x, "estimate", estimate);
        sameLength("x", x, "lower", lower);
        sameLength("x", x, "upper", upper);
        requireFinite("x", x);
        requireFinite("estimate", estimate);
        requireFinite("lower", lower);
        requireFinite("upper", upper);
        YIntervalSeries s = new YIntervalSeries("estimate");
        for (int i = 0; i < x.length; i++) {
            if (lower[i] > estimate[i] || upper[i] < estimate[i]) {
                throw new IllegalArgumentException("at index " + i + " the interval [" + lower[i] + ", " + upper[i]
                        + "] does not contain the estimate " + estimate[i]);
            }
            s.add(x[i], estimate[i], lower[i], upper[i]);
        }
        YIntervalSeriesCollection data = new YIntervalSeriesCollection();
        data.addSeries(s);
        DeviationRenderer r = new DeviationRenderer(true, false);
        r.setSeriesPaint(0, CORRECTED);
        r.setSeriesFillPaint(0, CORRECTED);
        r.setAlpha(0.25f);
        r.setSeriesStroke(0, new BasicStroke(2f));
        NumberAxis yAxis = new NumberAxis(yLabel);
        yAxis.setAutoRangeIncludesZero(false);
        XYPlot plot = new XYPlot(data, new NumberAxis(xLabel), yAxis, r);
        write(png, chart(title, plot));
    }

    /**
     * Dot-and-whisker figure comparing naive and corrected estimates of several quantities. An
     * infinite bound is drawn to the edge of the plot, and a note under the title says so.
     *
     * @param png        output file
     * @param title      figure title
     * @param valueLabel label of the value axis
     * @param rows       the quantities, at least one
     * @throws IllegalArgumentException if {@code rows} is empty
     * @throws IOException              if the file cannot be written
     */
    public static void comparison(Path png, String title, String valueLabel, List<Comparison> rows)
            throws IOException {
        if (rows.isEmpty()) {
            throw new IllegalArgumentException("rows must not be empty");
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (Comparison c : rows) {
            for (Estimate e : List.of(c.naive(), c.corrected())) {
                for (double v : new double[] {e.lower(), e.estimate(), e.upper()}) {
                    if (Double.isFinite(v)) {
                        lo = Math.min(lo, v);
                        hi = Math.max(hi, v);
                    }
                }
            }
        }
        double margin = hi > lo ? 0.1 * (hi - lo) : Math.max(1, Math.abs(hi)) * 0.1;
        boolean clipped = false;
        YIntervalSeries naive = new YIntervalSeries("naive");
        YIntervalSeries corrected = new YIntervalSeries("corrected");
        String[] labels = new String[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            Comparison c = rows.get(i);
            labels[i] = c.label();
            clipped |= add(naive, i - 0.12, c.naive(), lo - margin, hi + margin);
            clipped |= add(corrected, i + 0.12, c.corrected(), lo - margin, hi + margin);
        }
        YIntervalSeriesCollection data = new YIntervalSeriesCollection();
        data.addSeries(naive);
        data.addSeries(corrected);
        XYErrorRenderer r = new XYErrorRenderer();
        r.setDrawXError(false);
        r.setDrawYError(true);
        r.setDefaultLinesVisible(false);
        r.setSeriesPaint(0, NAIVE);
        r.setSeriesPaint(1, CORRECTED);
        r.setErrorStroke(new BasicStroke(2f));
        SymbolAxis axis = new SymbolAxis(null, labels);
        axis.setRange(-0.6, rows.size() - 0.4);
        NumberAxis valueAxis = new NumberAxis(valueLabel);
        valueAxis.setAutoRangeIncludesZero(false);
        valueAxis.setRange(lo - margin, hi + margin);
        XYPlot plot = new XYPlot(data, axis, valueAxis, r);
        plot.setOrientation(PlotOrientation.HORIZONTAL);
        JFreeChart chart = chart(title, plot);
        if (clipped) {
            chart.addSubtitle(new TextTitle("whiskers reaching the edge of the plot are unbounded"));
        }
        write(png, chart);
    }

    /**
     * Simulation-study summary by sample size, one line per estimator and target: on top the
     * relative bias (bias / truth; the bias itself if a truth is 0) with a band of &plusmn;1.96
     * Monte Carlo SE, below the coverage with its Clopper&ndash;Pearson 95% band and a dashed line
     * at the nominal level. The sample-size axis is logarithmic. Points with no successful
     * replicate (or too few for an SE) are left out, and a note under the title says how many.
     *
     * @param png   output file
     * @param title figure title
     * @param rows  summaries (e.g. {@code StudyResult.summaries()}), at least one
     * @throws IllegalArgumentException if {@code rows} is empty
     * @throws IOException              if the file cannot be written
     */
    public static void studySummary(Path png, String title, List<StudySummary> rows) throws IOException {
        if (rows == null || rows.isEmpty()) {
            throw new IllegalArgumentException("rows must not be empty");
        }
        boolean relative = rows.stream().allMatch(s -> s.truth() != 0);
        Map<String, YIntervalSeries> bias = new LinkedHashMap<>();
        Map<String, YIntervalSeries> coverage = new LinkedHashMap<>();
        int left = 0;
        double level = rows.get(0).level();
        for (StudySummary s : rows) {
            String key = s.estimator() + " : " + s.target();
            YIntervalSeries b = bias.computeIfAbsent(key, k -> new YIntervalSeries(k, false, true));
            YIntervalSeries c = coverage.computeIfAbsent(key, k -> new YIntervalSeries(k, false, true));
            double scale = relative ? Math.abs(s.truth()) : 1;
            double v = relative ? s.relativeBias() : s.bias();
            double half = 1.959963984540054 * s.biasStandardError() / scale;
            if (Double.isFinite(v) && Double.isFinite(half)) {
                b.add(s.sampleSize(), v, v - half, v + half);
            } else {
                left++;
            }
            if (Double.isFinite(s.coverage())) {
                c.add(s.sampleSize(), s.coverage(), s.coverageLower(), s.coverageUpper());
            }
        }
        YIntervalSeriesCollection biasData = new YIntervalSeriesCollection();
        bias.values().forEach(biasData::addSeries);
        YIntervalSeriesCollection coverageData = new YIntervalSeriesCollection();
        coverage.values().forEach(coverageData::addSeries);
        NumberAxis biasAxis = new NumberAxis(relative ? "relative bias" : "bias");
        biasAxis.setAutoRangeIncludesZero(true);
        XYPlot top = new XYPlot(biasData, null, biasAxis, bands(bias.size()));
        top.addRangeMarker(new ValueMarker(0, Color.DARK_GRAY, new BasicStroke(1f)));
        NumberAxis coverageAxis = new NumberAxis("coverage");
        coverageAxis.setAutoRangeIncludesZero(false);
        XYPlot bottom = new XYPlot(coverageData, null, coverageAxis, bands(coverage.size()));
        bottom.addRangeMarker(new ValueMarker(level, Color.DARK_GRAY, new BasicStroke(1.5f, BasicStroke.CAP_BUTT,
                BasicStroke.JOIN_MITER, 10f, new float[] {6f, 4f}, 0f)));
        SampleSizeAxis n = new SampleSizeAxis(rows.stream().mapToInt(StudySummary::sampleSize).distinct().sorted()
                .toArray());
        CombinedDomainXYPlot plot = new CombinedDomainXYPlot(n);
        plot.setGap(10);
        for (XYPlot p : new XYPlot[] {top, bottom}) {
            p.setBackgroundPaint(Color.WHITE);
            p.setDomainGridlinePaint(Color.LIGHT_GRAY);
            p.setRangeGridlinePaint(Color.LIGHT_GRAY);
            plot.add(p, 1);
        }
        plot.setFixedLegendItems(top.getLegendItems()); // one legend entry per line, not per panel
        JFreeChart chart = chart(title, plot);
        chart.addSubtitle(new TextTitle("bands: bias \u00b1 1.96 Monte Carlo SE; coverage Clopper\u2013Pearson 95%;"
                + " dashed: nominal " + level));
        if (left > 0) {
            chart.addSubtitle(new TextTitle(left + (left == 1 ? " point" : " points")
                    + " without enough successful replicates not shown"));
        }
        write(png, chart);
    }

    private static DeviationRenderer bands(int n) {
        DeviationRenderer r = new DeviationRenderer(true, true);
        for (int i = 0; i < n; i++) {
            Color c = i == 0 ? CORRECTED : LINES[(i - 1) % LINES.length];
            r.setSeriesPaint(i, c);
            r.setSeriesFillPaint(i, c);
            r.setSeriesStroke(i, new BasicStroke(2f));
            r.setSeriesShape(i, new Ellipse2D.Double(-3.5, -3.5, 7, 7));
        }
        r.setAlpha(0.2f);
        return r;
    }

    /** Logarithmic axis with a labelled tick at each sample size of the study, and a margin. */
    private static final class SampleSizeAxis extends LogAxis {
        private static final long serialVersionUID = 1L;
        private final int[] sizes;

        SampleSizeAxis(int[] sizes) {
            super("sample size");
            this.sizes = sizes.clone();
            double lo = sizes[0];
            double hi = sizes[sizes.length - 1];
            setSmallestValue(1e-3);
            setRange(lo / 1.3, hi * 1.3);
        }

        @Override
        @SuppressWarnings({"rawtypes", "unchecked"}) // JFreeChart declares a raw List
        public List refreshTicks(Graphics2D g2, AxisState state, Rectangle2D dataArea, RectangleEdge edge) {
            List ticks = new ArrayList();
            for (int n : sizes) {
                ticks.add(new NumberTick((double) n, Integer.toString(n), TextAnchor.TOP_CENTER, TextAnchor.CENTER,
                        0.0));
            }
            return ticks;
        }
    }

    private static boolean add(YIntervalSeries s, double x, Estimate e, double min, double max) {
        double lower = Double.isFinite(e.lower()) ? e.lower() : min;
        double upper = Double.isFinite(e.upper()) ? e.upper() : max;
        s.add(x, e.estimate(), lower, upper);
        return !Double.isFinite(e.lower()) || !Double.isFinite(e.upper());
    }

    private static XYSeries series(Curve c) {
        XYSeries s = new XYSeries(c.name(), false, true);
        double[] x = c.x();
        double[] y = c.y();
        for (int i = 0; i < x.length; i++) {
            s.add(x[i], y[i]);
        }
        return s;
    }

    private static XYLineAndShapeRenderer lines(int n) {
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer(true, false);
        for (int i = 0; i < n; i++) {
            r.setSeriesPaint(i, LINES[i % LINES.length]);
            r.setSeriesStroke(i, new BasicStroke(2f));
        }
        return r;
    }

    private static JFreeChart chart(String title, XYPlot plot) {
        plot.setBackgroundPaint(Color.WHITE);
        plot.setDomainGridlinePaint(Color.LIGHT_GRAY);
        plot.setRangeGridlinePaint(Color.LIGHT_GRAY);
        JFreeChart chart = new JFreeChart(title, JFreeChart.DEFAULT_TITLE_FONT, plot, true);
        chart.setBackgroundPaint(Color.WHITE);
        return chart;
    }

    private static void write(Path png, JFreeChart chart) throws IOException {
        Path parent = png.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        ChartUtils.saveChartAsPNG(png.toFile(), chart, WIDTH, HEIGHT);
    }

    static void requireFinite(String name, double[] a) {
        if (a == null) {
            throw new IllegalArgumentException(name + " must not be null");
        }
        for (int i = 0; i < a.length; i++) {
            if (!Double.isFinite(a[i])) {
                throw new IllegalArgumentException(name + "[" + i + "] must be finite, was " + a[i]);
            }
        }
    }

    private static void sameLength(String an, double[] a, String bn, double[] b) {
        if (a == null || b == null || a.length != b.length || a.length == 0) {
            throw new IllegalArgumentException(an + " and " + bn + " must have the same length >= 1, had "
                    + (a == null ? "null" : a.length) + " and " + (b == null ? "null" : b.length));
        }
    }
}
