package org.incipit.core.study;

/**
 * Progress of a running study. Calls are serialised (never concurrent) and {@code completed}
 * increases by one per call, but they come from the worker threads: keep them short.
 */
@FunctionalInterface
public interface StudyListener {

    /** A listener that ignores progress. */
    StudyListener NONE = (completed, total, failed) -> { };

    /**
     * @param completed replicates finished so far, 1..total
     * @param total     replicates of the run
     * @param failed    target outcomes failed so far (over all estimators and targets)
     */
    void progress(int completed, int total, int failed);
}
