package dev.nitid.stars;

/**
 * One accepted star, in image pixel coordinates (pixel (i, j) centred at x = i, y = j).
 *
 * @param x        centre x of the best profile
 * @param y        centre y of the best profile
 * @param snr      peak amplitude over the local background σ
 * @param gaussian Gaussian + constant fit (stamp coordinates shifted to image coordinates)
 * @param moffat   Moffat + constant fit, or {@code null} if it did not converge
 * @param region   index of its field-grid region, row-major
 */
public record MeasuredStar(double x, double y, double snr, StarProfile gaussian, StarProfile moffat, int region) {

    /** @return the fit of the given shape, or {@code null} if that fit failed */
    public StarProfile profile(ProfileShape shape) {
        return shape == ProfileShape.GAUSSIAN ? gaussian : moffat;
    }
}
