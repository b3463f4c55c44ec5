package org.incipit.io;

import java.time.LocalDate;
import java.util.Optional;

/**
 * How to read an input file.
 *
 * @param origin      the date of day 0, or null to use the earliest date in the file
 * @param skipBadRows if true, a bad data row is skipped and listed instead of raising an
 *                    {@link InputException} (faults of the whole file still raise)
 */
public record ReadOptions(LocalDate origin, boolean skipBadRows) {

    /** @return strict reading, origin = earliest date in the file */
    public static ReadOptions defaults() {
        return new ReadOptions(null, false);
    }

    /** @return the origin, if one was given */
    public Optional<LocalDate> originDate() {
        return Optional.ofNullable(origin);
    }
}
