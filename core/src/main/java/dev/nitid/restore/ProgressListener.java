package dev.nitid.restore;

/**
 * Receives one call per completed iteration, on the restoring thread. Must be quick; must not modify
 * the images being restored.
 */
@FunctionalInterface
public interface ProgressListener {
    /** A listener that ignores every call. */
    ProgressListener NONE = r -> { };

    /**
     * Called after each iteration.
     *
     * @param record the iteration's figures
     */
    void onIteration(IterationRecord record);
}
