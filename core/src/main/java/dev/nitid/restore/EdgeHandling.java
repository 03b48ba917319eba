package dev.nitid.restore;

/** How a restorer treats the image edges, where the blur mixes in light from outside the frame. */
public enum EdgeHandling {
    /**
     * Outside the frame is dark (zero). Matches scikit-image's {@code mode='same'} convolution; darkens
     * the border of anything with sky. Use only for data that fall to zero at the edge.
     */
    ZERO,
    /**
     * The frame is mirrored at its edges (half-sample symmetric). No step at the edge and the sky level is
     * kept: the default.
     */
    REFLECT,
    /** The frame repeats (circular convolution): exact for the classic FFT formulas, seams where edges differ. */
    PERIODIC,
    /**
     * The object is restored on a domain larger than the frame by the PSF's half-size, and only the
     * observed pixels enter the likelihood; the update divides by {@code s = Kᵀ 1_frame}
     * (Bertero &amp; Boccacci 2005, A&amp;A 437, 369). The light that the edge pixels received from outside the
     * frame is explained by the extra object pixels instead of being forced onto the edge. For the frequency
     * filters this falls back to {@link #REFLECT}.
     */
    EXTENDED_DOMAIN
}
