package dev.nitid.stars;

/**
 * How the measured blur splits between the optics, the sky (seeing) and the tracking
 * (see {@link BlurBudget#split}).
 *
 * @param opticsFwhmPx     FWHM of the optics alone (pupil diffraction) before pixel integration, px
 * @param seeingFwhmArcsec FWHM of the fitted seeing (round Moffat, β = 4.765), arcsec (0 if none needed)
 * @param seeingFwhmPx     the same in pixels
 * @param trackingFwhmPx   FWHM of the fitted tracking blur (a Gaussian along {@code trackingAngle}), px
 * @param trackingAngle    direction of the tracking blur, radians from +x towards +y (the measured major axis)
 * @param opticsShare      share of the blur budget {@code F²} due to the optics, 0…1
 * @param seeingShare      share due to seeing
 * @param trackingShare    share due to tracking
 * @param modelMajorPx     major FWHM of optics ⊛ seeing ⊛ tracking, measured like the stars, px
 * @param modelMinorPx     minor FWHM of that model, px
 * @param note             one sentence when the split is limited (optics alone wider than the stars, …), or ""
 */
public record BlurSplit(double opticsFwhmPx, double seeingFwhmArcsec, double seeingFwhmPx, double trackingFwhmPx,
                        double trackingAngle, double opticsShare, double seeingShare, double trackingShare,
                        double modelMajorPx, double modelMinorPx, String note) {
}
