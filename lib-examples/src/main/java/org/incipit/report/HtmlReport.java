package org.incipit.report;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Base64;
import java.util.List;

/**
 * A report as one HTML page: a title, the caution paragraph {@link #CAUTION}, then sections,
 * each with its own assumptions paragraph, text, tables and figures (PNG files). Figures are
 * either embedded in the page (base64 data URIs, the default: one self-contained file) or
 * linked as files next to it. The page has no script, no external resource and no time stamp,
 * so the same report gives the same bytes. Not thread-safe while being built.
 *
 * <pre>{@code
 * HtmlReport report = HtmlReport.titled("Serial interval");
 * report.section("Fit", "Candidate infectors are equally likely a priori; ...")
 *       .paragraph("Gamma fitted by maximum likelihood.")
 *       .table(List.of("quantity", "estimate"), List.of(List.of("mean", "5.1")))
 *       .figure(Path.of("out/si.png"), "Observed serial intervals and fitted density");
 * report.write(Path.of("out/report.html"));
 * }</pre>
 */
public final class HtmlReport {

    /** The caution printed at the top of every report. */
    public static final String CAUTION = "Model-based estimates from early, sparse data inform but do not "
            + "replace the judgement of the responsible public-health authority.";

    private final String title;
    private final List<Section> sections = new ArrayList<>();
    private boolean embed = true;

    private HtmlReport(String title) {
        this.title = title;
    }

    /**
     * @param title page title, not blank
     * @return an empty report
     */
    public static HtmlReport titled(String title) {
        return new HtmlReport(nonBlank("title", title));
    }

    /**
     * @param embedFigures true (default) to embed PNG files in the page, false to link them
     *                     (they must then stay next to the page)
     * @return this report
     */
    public HtmlReport embedFigures(boolean embedFigures) {
        this.embed = embedFigures;
        return this;
    }

    /**
     * Adds a section.
     *
     * @param heading     section heading, not blank
     * @param assumptions what the section's estimates assume, not blank (printed as its own
     *                    paragraph)
     * @return the new section, to fill
     */
    public Section section(String heading, String assumptions) {
        Section s = new Section(nonBlank("heading", heading), nonBlank("assumptions", assumptions));
        sections.add(s);
        return s;
    }

    /** A section of the report. */
    public static final class Section {
        private final String heading;
        private final String assumptions;
        private final List<Object> items = new ArrayList<>();

        private Section(String heading, String assumptions) {
            this.heading = heading;
            this.assumptions = assumptions;
        }

        /**
         * @param text a paragraph of plain text (escaped)
         * @return this section
         */
        public Section paragraph(String text) {
            items.add(new Paragraph(nonBlank("text", text)));
            return this;
        }

        /**
         * @param header column headings
         * @param rows   rows of cells, each as long as the header
         * @return this section
         * @throws IllegalArgumentException if a row's length differs from the header's
         */
        public Section table(List<String> header, List<List<String>> rows) {
            for (List<String> r : rows) {
                if (r.size() != header.size()) {
                    throw new IllegalArgumentException("table row " + r + " has " + r.size() + " cells, the header has "
                            + header.size());
                }
            }
            List<List<String>> copy = new ArrayList<>();
            rows.forEach(r -> copy.add(List.copyOf(r)));
            items.add(new Table(List.copyOf(header), copy));
            return this;
        }

        /**
         * @param png     a PNG file (must exist when the report is written)
         * @param caption figure caption, not blank
         * @return this section
         */
        public Section figure(Path png, String caption) {
            items.add(new Figure(png, nonBlank("caption", caption)));
            return this;
        }
    }

    private record Paragraph(String text) {
    }

    private record Table(List<String> header, List<List<String>> rows) {
    }

    private record Figure(Path png, String caption) {
    }

    /**
     * Writes the page (UTF-8), creating missing parent directories.
     *
     * @param html the output file, e.g. {@code out/report.html}
     * @return the HTML text written
     * @throws IOException if a figure cannot be read or the page cannot be written
     */
    public String write(Path html) throws IOException {
        Path dir = html.toAbsolutePath().getParent();
        if (dir != null) {
            Files.createDirectories(dir);
        }
        String text = render(dir);
        Files.writeString(html, text, StandardCharsets.UTF_8);
        return text;
    }

    private String render(Path dir) throws IOException {
        StringBuilder sb = new StringBuilder();
        sb.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>")
                .append(escape(title)).append("</title>\n<style>\n")
                .append("body{font-family:sans-serif;max-width:60em;margin:2em auto;padding:0 1em;color:#222}\n")
                .append(".caution{border-left:4px solid #d62728;background:#fdf0f0;padding:.6em 1em}\n")
                .append(".assumptions{border-left:4px solid #1f77b4;background:#f0f5fb;padding:.6em 1em}\n")
                .append("table{border-collapse:collapse}td,th{border:1px solid #ccc;padding:.2em .6em}\n")
                .append("td{text-align:right}td:first-child{text-align:left}img{max-width:100%}\n")
                .append("</style>\n</head>\n<body>\n<h1>").append(escape(title)).append("</h1>\n")
                .append("<p class=\"caution\"><strong>Caution.</strong> ").append(escape(CAUTION)).append("</p>\n");
        for (Section s : sections) {
            sb.append("<section>\n<h2>").append(escape(s.heading)).append("</h2>\n")
                    .append("<p class=\"assumptions\"><strong>Assumptions.</strong> ")
                    .append(escape(s.assumptions)).append("</p>\n");
            for (Object item : s.items) {
                if (item instanceof Paragraph p) {
                    sb.append("<p>").append(escape(p.text())).append("</p>\n");
                } else if (item instanceof Table t) {
                    sb.append("<table>\n<tr>");
                    t.header().forEach(h -> sb.append("<th>").append(escape(h)).append("</th>"));
                    sb.append("</tr>\n");
                    for (List<String> r : t.rows()) {
                        sb.append("<tr>");
                        r.forEach(c -> sb.append("<td>").append(escape(c)).append("</td>"));
                        sb.append("</tr>\n");
                    }
                    sb.append("</table>\n");
                } else if (item instanceof Figure f) {
                    sb.append("<figure>\n<img src=\"").append(source(f.png(), dir)).append("\" alt=\"")
                            .append(escape(f.caption())).append("\">\n<figcaption>").append(escape(f.caption()))
                            .append("</figcaption>\n</figure>\n");
                }
            }
            sb.append("</section>\n");
        }
        sb.append("</body>\n</html>\n");
        return sb.toString();
    }

    private String source(Path png, Path dir) throws IOException {
        if (!Files.isRegularFile(png)) {
            throw new IOException("figure file " + png + " does not exist");
        }
        if (embed) {
            return "data:image/png;base64," + Base64.getEncoder().encodeToString(Files.readAllBytes(png));
        }
        Path abs = png.toAbsolutePath();
        String rel = dir == null ? abs.toString() : dir.relativize(abs).toString();
        try {
            return escape(new java.net.URI(null, null, rel.replace('\\', '/'), null).toASCIIString());
        } catch (java.net.URISyntaxException e) {
            throw new IOException("figure path " + rel + " cannot be written as a link", e);
        }
    }

    /**
     * @param text plain text
     * @return the text with {@code & < > " '} escaped for HTML
     */
    static String escape(String text) {
        StringBuilder sb = new StringBuilder(text.length());
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            switch (c) {
                case '&' -> sb.append("&amp;");
                case '<' -> sb.append("&lt;");
                case '>' -> sb.append("&gt;");
                case '"' -> sb.append("&quot;");
                case '\'' -> sb.append("&#39;");
                default -> sb.append(c);
            }
        }
        return sb.toString();
    }

    private static String nonBlank(String name, String value) {
        if (value == null || value.isBlank()) {
            throw new IllegalArgumentException(name + " must not be blank");
        }
        return value;
    }
}
