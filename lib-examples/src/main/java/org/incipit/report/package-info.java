/**
 * Reports: figures drawn with JFreeChart into PNG files ({@link org.incipit.report.Charts})
 * and a self-contained HTML report ({@link org.incipit.report.HtmlReport}) that always carries
 * a caution paragraph and, per section, a paragraph stating the assumptions of its estimates.
 * Figures are drawn headless (no display needed); {@link org.incipit.cli.Main} sets
 * {@code java.awt.headless=true} and so does {@link org.incipit.report.Charts} when it is first
 * used, unless the property was set otherwise.
 */
package org.incipit.report;
