package dev.nitid.restore;

import java.util.List;

/**
 * How the restoration of one plane went.
 *
 * @param iterations      iterations run (0 for single-pass filters)
 * @param stopReason      why it stopped
 * @param history         one record per iteration (unmodifiable)
 * @param noise           the noise model used (the estimate, if it was estimated)
 * @param maskedPixels    pixels that carried no weight (NaN, ±∞, saturated)
 * @param protectedStars  bright stars under the star protection
 * @param setupNanos      planning time: transfer function, masks, noise, floor
 * @param iterationNanos  time in the iterations (or the filter pass)
 */
public record PlaneReport(int iterations, StopReason stopReason, List<IterationRecord> history, NoiseModel noise,
                          long maskedPixels, int protectedStars, long setupNanos, long iterationNanos) {
    /** Copies the history into an unmodifiable list. */
    public PlaneReport {
        history = List.copyOf(history);
    }
}
