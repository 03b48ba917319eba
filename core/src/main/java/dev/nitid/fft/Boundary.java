package dev.nitid.fft;

/**
 * How an image is extended beyond its edges before it is convolved.
 *
 * <p>Each constant names the matching {@code scipy.ndimage.convolve} mode, so reference arrays can be
 * made with scipy (note that scipy's {@code 'reflect'} and {@code 'mirror'} differ: ours is
 * {@code 'reflect'}).
 */
public enum Boundary {
    /**
     * Pixels outside the image are 0 (scipy.ndimage mode {@code 'constant'}, cval 0). Darkens the border
     * of anything with a sky background; use it only for data that really fall to zero at the edge.
     */
    ZERO,
    /**
     * Half-sample symmetric extension {@code d c b a | a b c d | d c b a} (scipy.ndimage mode
     * {@code 'reflect'}). The default for astronomical images: no step at the edge, sky level preserved.
     */
    REFLECT,
    /**
     * The image repeats ({@code 'wrap'}). Exact for circulant models and the classic FFT formulas;
     * produces seams where opposite edges differ.
     */
    PERIODIC
}
