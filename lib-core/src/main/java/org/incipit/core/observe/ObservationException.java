package org.incipit.core.observe;

/**
 * A row of observations was rejected. The message states the reason (naming the case or pair
 * and the values involved) without any file position; {@link #field()} names the field at fault
 * so that a reader can add the file, line and column.
 */
public class ObservationException extends IllegalArgumentException {

    private static final long serialVersionUID = 1L;

    /** Name of the field at fault. */
    private final String field;

    /**
     * @param field   name of the field at fault, e.g. {@code "start"}; not null
     * @param message the reason, naming the case and the values
     */
    public ObservationException(String field, String message) {
        super(message);
        if (field == null) {
            throw new IllegalArgumentException("field must not be null");
        }
        this.field = field;
    }

    /**
     * @return the name of the field at fault, as used by the builder methods' parameters (e.g.
     *     {@code "end"}, {@code "start"}, {@code "category"}, {@code "totalExposures"},
     *     {@code "primary"}, {@code "secondary"}, {@code "exposureFrom"}, {@code "exposureTo"},
     *     {@code "onset"}, {@code "day"}, {@code "cases"}, {@code "deaths"},
     *     {@code "recoveries"}, {@code "imported"}, {@code "id"})
     */
    public String field() {
        return field;
    }
}
