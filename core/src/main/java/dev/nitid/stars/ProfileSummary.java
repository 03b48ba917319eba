package dev.nitid.stars;

/**
 * Robust aggregate of one profile shape over the accepted stars: weighted medians (each star weighted by
 * 1/σ² of its fitted FWHM, so faint stars count little; Edgeworth's weighted median), and unweighted
 * 1.4826·MAD spreads (Hampel 1974, JASA 69, 383). The angle is the weighted median after aligning axial
 * angles on their doubled-angle mean direction (Mardia &amp; Jupp, Directional Statistics, 2000, §9.3.1).
 *
 * @param shape          profile
 * @param count          stars whose fit of this shape converged
 * @param fwhm           weighted median geometric-mean FWHM √(major·minor), px
 * @param fwhmSpread     1.4826·MAD of the FWHM, px
 * @param fwhmMajor      major FWHM of the median shape, fwhm / √(1 − ellipticity), px
 * @param fwhmMinor      minor FWHM of the median shape, fwhm · √(1 − ellipticity), px
 * @param ellipticity    1 − minor/major of the median shape: |(median e cos 2θ, median e sin 2θ)|
 * @param ellipticitySpread 1.4826·MAD of the ellipticity
 * @param angle          major-axis angle of the median shape, radians in [0, π), from +x towards +y
 * @param beta           median Moffat β (NaN for a Gaussian)
 * @param betaSpread     1.4826·MAD of β (NaN for a Gaussian)
 * @param bic            Bayesian information criterion summed over the stars where both shapes converged,
 *                       {@code Σ χ²/σ² + k ln n} (Schwarz 1978, Ann. Stat. 6, 461); lower is better
 */
public record ProfileSummary(ProfileShape shape, int count, double fwhm, double fwhmSpread, double fwhmMajor,
                             double fwhmMinor, double ellipticity, double ellipticitySpread, double angle,
                             double beta, double betaSpread, double bic) {
}
