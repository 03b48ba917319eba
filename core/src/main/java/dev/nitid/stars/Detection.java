package dev.nitid.stars;

/**
 * One local maximum found by the matched filter, and what became of it.
 *
 * @param x            x of the fitted centre when the star was fitted, else of the filtered maximum refined by
 *                     a parabola through its neighbours
 * @param y            y, likewise
 * @param significance filtered value over the filtered noise (≥ the detection threshold k)
 * @param accepted     true if the star was used for the measurement
 * @param rejected     why it was not used, or {@code null} (accepted, or not fitted because of
 *                     {@link MeasureSettings#maxStars()})
 */
public record Detection(double x, double y, double significance, boolean accepted, RejectReason rejected) {
}
