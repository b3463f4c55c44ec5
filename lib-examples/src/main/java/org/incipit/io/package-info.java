/**
 * Reading input files into {@link org.incipit.core.observe} observations, and writing results
 * as JSON and aligned text tables.
 *
 * <h2>Input files</h2>
 * CSV (RFC 4180, UTF-8) with a header line; lines starting with {@code #} are comments; blank
 * lines are ignored; values are trimmed; column names are matched case-insensitively; a column
 * not known to the file kind is an error (so that a misspelt optional column is not silently
 * ignored). The four kinds, read by {@link org.incipit.io.CsvInput}:
 * <ol>
 *   <li>intervals: {@code case,end,start[,kind][,exposures_total]}, one row per candidate
 *       start;</li>
 *   <li>delays: {@code case,primary,secondary[,daily]}; an empty secondary means "not yet
 *       observed at the cut-off" (right-censored; the cut-off is an argument);</li>
 *   <li>incubation: {@code case,exposure_from,exposure_to,onset};</li>
 *   <li>daily counts: {@code day,cases[,deaths][,recoveries][,imported]}.</li>
 * </ol>
 *
 * <h2>Times</h2>
 * A time column holds either day numbers (decimal numbers, e.g. {@code 12} or {@code 12.5}) or
 * ISO dates ({@code yyyy-MM-dd}), and all time columns of a file hold the same kind. Dates are
 * converted to day numbers relative to an <em>origin</em> date (day 0): the origin given in
 * {@link org.incipit.io.ReadOptions} or, by default, the earliest date in the file. The origin
 * used is returned in {@link org.incipit.io.ReadResult#origin()} so that outputs can map day
 * numbers back to dates. With day numbers, a given origin is simply reported as the date of
 * day 0.
 *
 * <h2>Errors</h2>
 * Bad input is never dropped silently: it raises an {@link org.incipit.io.InputException}
 * whose message names the file, line, column and fault ({@code file:line:column: reason}). With
 * {@link org.incipit.io.ReadOptions#skipBadRows()} a bad data row is instead skipped and listed
 * in {@link org.incipit.io.ReadResult#skipped()}; faults of the file as a whole (missing or
 * unknown column, empty file, no usable row, a column mixing numbers and dates) always raise.
 */
package org.incipit.io;
