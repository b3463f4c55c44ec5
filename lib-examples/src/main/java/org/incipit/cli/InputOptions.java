package org.incipit.cli;

import java.time.LocalDate;
import java.time.format.DateTimeParseException;
import org.incipit.io.ReadOptions;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/** Options for reading input files, shared by every command that reads one ({@code @Mixin}). */
public final class InputOptions {

    @Option(names = "--origin", paramLabel = "DATE", converter = DateConverter.class,
            description = "Date of day 0 (yyyy-MM-dd) when times are dates; "
                    + "default: the earliest date in the file.")
    LocalDate origin;

    @Option(names = "--skip-bad-rows",
            description = "Skip bad data rows instead of stopping; each is listed on stderr "
                    + "(file:line: reason) with their count. Daily counts are never skipped.")
    boolean skipBadRows;

    /** Creates the options with their defaults. */
    public InputOptions() {
    }

    /** @return the reading options */
    public ReadOptions readOptions() {
        return new ReadOptions(origin, skipBadRows);
    }

    /** Converts {@code yyyy-MM-dd}. */
    static final class DateConverter implements CommandLine.ITypeConverter<LocalDate> {
        @Override
        public LocalDate convert(String value) {
            try {
                return LocalDate.parse(value.trim());
            } catch (DateTimeParseException e) {
                throw new CommandLine.TypeConversionException("'" + value + "' is not a date (yyyy-MM-dd)");
            }
        }
    }
}
