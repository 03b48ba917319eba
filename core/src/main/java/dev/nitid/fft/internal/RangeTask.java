package dev.nitid.fft.internal;

/** A piece of work over the index range {@code [from, to)}, run by worker {@code worker}. */
@FunctionalInterface
public interface RangeTask {
    /**
     * Runs the work for one contiguous range.
     *
     * @param worker index of the worker running it, {@code 0 ≤ worker < threads}; selects its scratch
     * @param from   first index, inclusive
     * @param to     last index, exclusive
     */
    void run(int worker, int from, int to);
}
