package dev.nitid.fft;

/** Whether a {@link Convolver} transforms the whole padded image at once or works in overlap-save tiles. */
public enum Tiling {
    /**
     * Choose by the measured rule documented on {@link Convolver}: tiles when the whole-plane grid has at
     * least 768² pixels, the whole plane otherwise. The default.
     */
    AUTO,
    /**
     * One FFT of the whole image padded to fast sizes. Fewest redundant pixels; working memory about two
     * padded planes (spectrum and transfer function).
     */
    WHOLE_PLANE,
    /**
     * Overlap-save: the output is cut into tiles, each convolved with one small power-of-two FFT over the
     * tile plus a halo of PSF size − 1, tiles in parallel. Cache-friendly and memory-bounded (a few tiles per thread);
     * equals the whole-plane result within float round-off (Oppenheim &amp; Schafer, <i>Discrete-Time
     * Signal Processing</i>, 3rd ed. 2010, §8.7.3).
     */
    TILED
}
