package org.incipit.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Base64;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class HtmlReportTest {

    @TempDir
    Path dir;

    private Path figure() throws IOException {
        Path png = dir.resolve("fig dir/hist.png");
        Charts.histogram(png, "h", "days", new double[] {1, 2, 3}, 3, List.of());
        return png;
    }

    @Test
    void containsCautionAssumptionsAndEscapedText() throws IOException {
        HtmlReport r = HtmlReport.titled("Report <A&B>");
        r.section("Serial interval", "Infectors are equally likely a priori.")
                .paragraph("Fitted \"gamma\" < weibull")
                .table(List.of("quantity", "estimate"), List.of(List.of("mean", "5.1")));
        Path out = dir.resolve("out/report.html");
        String html = r.write(out);
        assertEquals(html, Files.readString(out, StandardCharsets.UTF_8));
        assertTrue(html.contains("Model-based estimates from early, sparse data inform but do not replace the "
                + "judgement of the responsible public-health authority."));
        assertTrue(html.contains("<p class=\"assumptions\"><strong>Assumptions.</strong> "
                + "Infectors are equally likely a priori.</p>"));
        assertTrue(html.contains("<title>Report &lt;A&amp;B&gt;</title>"));
        assertTrue(html.contains("<p>Fitted &quot;gamma&quot; &lt; weibull</p>"));
        assertTrue(html.contains("<tr><td>mean</td><td>5.1</td></tr>"));
        assertFalse(html.contains("<script"));
    }

    @Test
    void embedsFiguresByDefault() throws IOException {
        Path png = figure();
        HtmlReport r = HtmlReport.titled("R");
        r.section("S", "A.").figure(png, "a histogram");
        String html = r.write(dir.resolve("report.html"));
        Matcher m = Pattern.compile("src=\"data:image/png;base64,([A-Za-z0-9+/=]+)\"").matcher(html);
        assertTrue(m.find());
        assertArrayEquals(Files.readAllBytes(png), Base64.getDecoder().decode(m.group(1)));
        assertTrue(html.contains("<figcaption>a histogram</figcaption>"));
    }

    @Test
    void linksFiguresWhenAsked() throws IOException {
        Path png = figure();
        HtmlReport r = HtmlReport.titled("R").embedFigures(false);
        r.section("S", "A.").figure(png, "a histogram");
        String html = r.write(dir.resolve("report.html"));
        assertTrue(html.contains("<img src=\"fig%20dir/hist.png\""), html);
    }

    @Test
    void rejectsMissingPartsAndFigures() {
        HtmlReport r = HtmlReport.titled("R");
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> r.section("S", " "));
        assertEquals("assumptions must not be blank", e.getMessage());
        r.section("S", "A.").figure(dir.resolve("none.png"), "missing");
        IOException io = assertThrows(IOException.class, () -> r.write(dir.resolve("r.html")));
        assertEquals("figure file " + dir.resolve("none.png") + " does not exist", io.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> HtmlReport.titled("R").section("S", "A.").table(List.of("a"), List.of(List.of("1", "2"))));
    }

    @Test
    void sameReportSameBytes() throws IOException {
        Path png = figure();
        HtmlReport a = HtmlReport.titled("R");
        a.section("S", "A.").figure(png, "f");
        HtmlReport b = HtmlReport.titled("R");
        b.section("S", "A.").figure(png, "f");
        assertEquals(a.write(dir.resolve("a.html")), b.write(dir.resolve("b.html")));
    }
}
