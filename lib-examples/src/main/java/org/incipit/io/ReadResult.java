package org.incipit.io;

import java.time.LocalDate;
import java.util.List;
import java.util.Optional;

/**
 * Observations read from a file, with what is needed to report on them.
 *
 * @param data     the observations
 * @param file     the file as named by the user
 * @param dataRows number of data rows in the file (used and skipped)
 * @param dates    true if the file's times were dates (converted to day numbers)
 * @param origin   the date of day 0: the given origin, else for dates the earliest date in the
 *                 file; null for day numbers without a given origin
 * @param skipped  rows left out (empty unless skipping was requested)
 * @param <T>      observation type
 */
public record ReadResult<T>(T data, String file, int dataRows, boolean dates, LocalDate origin,
                            List<SkippedRow> skipped) {

    /**
     * Copies the list of skipped rows.
     *
     * @param data     the observations
     * @param file     the file as named by the user
     * @param dataRows number of data rows in the file (used and skipped)
     * @param dates    true if the file's times were dates (converted to day numbers)
     * @param origin   the date of day 0: the given origin, else for dates the earliest date in the
     *                 file; null for day numbers without a given origin
     * @param skipped  rows left out (empty unless skipping was requested)
     */
    public ReadResult {
        skipped = List.copyOf(skipped);
    }

    /** @return the origin, if known */
    public Optional<LocalDate> originDate() {
        return Optional.ofNullable(origin);
    }

    /**
     * @param day a day number of these data
     * @return the date of that day (the fraction of a day is dropped: floor)
     * @throws IllegalStateException if there is no origin
     */
    public LocalDate dateOf(double day) {
        if (origin == null) {
            throw new IllegalStateException(file + ": times are day numbers without an origin date");
        }
        return origin.plusDays((long) Math.floor(day));
    }
}
