package dev.nitid.stars;

/** The analytic star profile fitted by {@link StarProfileFit}. */
public enum ProfileShape {
    /**
     * Elliptical Gaussian plus constant: {@code A·exp(−Q/2) + B}, {@code FWHM = 2√(2 ln 2)·σ} along each axis.
     * Narrow wings; the usual quick focus figure.
     */
    GAUSSIAN,
    /**
     * Elliptical Moffat plus constant: {@code A·(1 + Q)^(−β) + B}, {@code FWHM = 2α√(2^(1/β) − 1)} along each
     * axis (Moffat 1969, A&amp;A 3, 455; Trujillo et al. 2001, MNRAS 328, 977, eqs. 1–2). Its power-law
     * wings describe seeing-limited stars better; β ≈ 4.765 for pure Kolmogorov seeing (Trujillo et al. 2001).
     */
    MOFFAT
}
