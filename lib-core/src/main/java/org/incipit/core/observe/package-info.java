/**
 * Observations: immutable, validated data sets in flat primitive arrays, the input of every
 * estimator and the output of the simulator.
 *
 * <ul>
 *   <li>{@link org.incipit.core.observe.AmbiguousStartCases}: cases with one end time and one or
 *       more candidate start times (e.g. onset of a secondary case and the onsets of its possible
 *       infectors);</li>
 *   <li>{@link org.incipit.core.observe.DelayPairs}: primary and secondary event times, with
 *       right censoring and truncation at a cut-off and day-level interval censoring;</li>
 *   <li>{@link org.incipit.core.observe.ExposureWindows}: an exposure window and an onset per
 *       case;</li>
 *   <li>{@link org.incipit.core.observe.DailyCounts}: cases (and optionally deaths, recoveries,
 *       imported cases) per consecutive day.</li>
 * </ul>
 *
 * <p>Times are in days, as {@code double} (day numbers in {@code DailyCounts} are {@code int}).
 * Each type is built by its {@code Builder}; a builder checks every row as it is added and
 * rejects a bad one with an {@link org.incipit.core.observe.ObservationException} whose message
 * states the reason and whose {@link org.incipit.core.observe.ObservationException#field()}
 * names the offending field, so a file reader can prefix the message with the file, line and
 * column. A builder that threw keeps its earlier rows and can go on. Observations know nothing
 * about estimators, text formats or output.
 */
package org.incipit.core.observe;
