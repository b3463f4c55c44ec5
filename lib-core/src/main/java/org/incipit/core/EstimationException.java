package org.incipit.core;

/**
 * Thrown when no estimate can be produced: the fit did not converge, the data do not identify
 * the parameters, or a required quantity is infinite. The message says what failed and, for
 * iterative methods, after how many iterations.
 */
public class EstimationException extends RuntimeException {

    private static final long serialVersionUID = 1L;

    /** @param message what failed and why */
    public EstimationException(String message) {
        super(message);
    }

    /**
     * @param message what failed and why
     * @param cause   underlying failure
     */
    public EstimationException(String message, Throwable cause) {
        super(message, cause);
    }
}
