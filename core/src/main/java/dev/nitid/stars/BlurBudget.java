package dev.nitid.stars;

import dev.nitid.image.Image;
import dev.nitid.psf.AnalyticPsf;
import dev.nitid.psf.ConvolvedPsf;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.PsfFigures;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.Seeing;
import java.util.ArrayList;
import java.util.List;

/**
 * Splits a measured PSF into optics, sky and tracking. Given the optics as a PSF model (usually a
 * {@link dev.nitid.psf.PupilPsf} from the aperture, obstruction, focal length, pixel size and band), it
 * finds the seeing FWHM and the tracking blur for which
 * {@code optics ⊛ seeing ⊛ tracking}, rendered on the detector and measured exactly like the stars, has the
 * stars' major and minor FWHM.
 *
 * <p>Model (project choice, stated so it can be judged): seeing is a round Moffat with β = 4.765, the
 * Kolmogorov value of Trujillo et al. 2001 (MNRAS 328, 977); tracking (drift, guiding, wind shake) is a
 * one-dimensional Gaussian along the stars' major axis, since seeing and round optics add no elongation.
 * The minor FWHM therefore fixes the seeing, the major FWHM the tracking. Each is found by bisection
 * (monotone in its unknown), alternated twice because the two couple weakly.
 *
 * <p>Shares: with {@code F_o}, {@code F_s}, {@code F_t} the FWHM of each part alone, the budget is
 * {@code F_o² + F_s² + F_t²} and each share its term over the sum. Widths of Gaussians add exactly this
 * way (variances add under convolution); for Airy and Moffat parts it is an approximation, used only to
 * apportion, never to compute the model.
 */
public final class BlurBudget {
    /**
     * Bisection steps: the bracket shrinks by 2^-12 ≈ 2.4e-4 of its width (about 0.001″ of seeing for a
     * 4″ bracket), far below the measurement error of a FWHM.
     */
    private static final int STEPS = 12;
    /**
     * Width across the tracking trail, in sub-pixels of the render (0.1–0.3 px): it widens the minor axis by
     * a few tenths of a percent, which the fitted seeing absorbs.
     */
    private static final double LINE_WIDTH_SUBPIXELS = 1.5;
    /** Sub-pixels per pixel for the optics' own FWHM ({@link PsfFigures} on the fine grid). */
    private static final int OPTICS_OVERSAMPLE = 8;
    /** Finest sub-pixel rendering used for short trails (cost grows with its square). */
    private static final int MAX_OVERSAMPLE = 15;

    private BlurBudget() {
    }

    /**
     * @param measured         the stars' summary (its major/minor FWHM and angle are matched)
     * @param optics           the optics alone (rendered pixel-integrated on the detector's pixels)
     * @param plateScaleArcsec arcsec per pixel of the detector, &gt; 0
     * @param sampling         the sampling the stars were fitted with (the model is fitted the same way)
     * @param radius           model images are (2·radius+1)² pixels; ≥ 3, about 3× the FWHM or more
     * @return the split
     */
    public static BlurSplit split(ProfileSummary measured, PsfModel optics, double plateScaleArcsec,
                                  PixelSampling sampling, int radius) {
        if (measured == null || !(measured.fwhmMajor() > 0) || !(measured.fwhmMinor() > 0)) {
            throw new IllegalArgumentException("no measured FWHM to split: measure stars first");
        }
        if (!(plateScaleArcsec > 0) || !Double.isFinite(plateScaleArcsec)) {
            throw new IllegalArgumentException("plate scale " + plateScaleArcsec
                    + " arcsec/px: the split needs the focal length and pixel size");
        }
        if (radius < 3) {
            throw new IllegalArgumentException("radius is " + radius + ": use at least 3");
        }
        Fitter f = new Fitter(optics, plateScaleArcsec, measured.shape(), sampling, 2 * radius + 1,
                measured.angle());
        double major = measured.fwhmMajor();
        double minor = Math.min(measured.fwhmMinor(), major);
        double[] opt = f.measure(0, 0);
        // The optics' own FWHM before the pixels (its fit on an under-sampled detector is ill-determined):
        // measured on a fine sub-pixel rendering.
        Image fine = optics.renderOversampled(2 * radius + 1, OPTICS_OVERSAMPLE, 0, 0);
        double opticsFwhm = PsfFigures.of(fine).fwhmPx() / OPTICS_OVERSAMPLE;
        String note = "";
        double s = 0;
        double t = 0;
        if (minor <= opt[1]) {
            note = String.format(java.util.Locale.ROOT, "the optics alone give a minor FWHM of %.2f px, not less than "
                    + "the stars' %.2f px: no seeing is needed (check the optics given, or the focus)", opt[1], minor);
        }
        for (int round = 0; round < 2; round++) {
            if (minor > opt[1]) {
                double tt = t;
                s = bisect(0, 1.5 * minor * plateScaleArcsec, x -> f.measure(x, tt)[1] - minor);
            }
            double ss = s;
            if (major > f.measure(s, 0)[0]) {
                t = bisect(0, 2 * major, x -> f.measure(ss, x)[0] - major);
            } else {
                t = 0;
            }
        }
        double[] fin = f.measure(s, t);
        double sPx = s / plateScaleArcsec;
        double total = opticsFwhm * opticsFwhm + sPx * sPx + t * t;
        return new BlurSplit(opticsFwhm, s, sPx, t, measured.angle(), opticsFwhm * opticsFwhm / total,
                sPx * sPx / total, t * t / total, fin[0], fin[1], note);
    }

    private interface Fn {
        double at(double x);
    }

    /** Root of a function increasing in x on [lo, hi]; the nearer end if it has no sign change. */
    private static double bisect(double lo, double hi, Fn fn) {
        double flo = fn.at(lo);
        if (flo >= 0) {
            return lo;
        }
        if (fn.at(hi) <= 0) {
            return hi;
        }
        for (int i = 0; i < STEPS; i++) {
            double mid = 0.5 * (lo + hi);
            if (fn.at(mid) < 0) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    /** Renders optics ⊛ seeing ⊛ tracking and fits it like a star. */
    private static final class Fitter {
        private final PsfModel optics;
        private final double scale;
        private final ProfileShape shape;
        private final ProfileFitSettings settings;
        private final int size;
        private final double angleDeg;

        Fitter(PsfModel optics, double scale, ProfileShape shape, PixelSampling sampling, int size, double angle) {
            this.optics = optics;
            this.scale = scale;
            this.shape = shape;
            this.settings = ProfileFitSettings.defaults().withSampling(sampling);
            this.size = size;
            this.angleDeg = Math.toDegrees(angle);
        }

        /** @return {major, minor} FWHM in px for seeing s (arcsec) and tracking t (px) */
        double[] measure(double seeingArcsec, double trackingPx) {
            // Kernels are point-sampled on the render's sub-pixel grid: keep ~3 samples per tracking FWHM so
            // that a short trail is not sampled as a point, and give the trail a width of 1.5 sub-pixels
            // across, or a rotated line would fall between the grid points and vanish.
            int over = PsfModel.DEFAULT_OVERSAMPLE;
            if (trackingPx > 0) {
                over = (int) Math.max(over, Math.min(MAX_OVERSAMPLE, Math.ceil(3 / trackingPx)));
            }
            double width = LINE_WIDTH_SUBPIXELS / over;
            List<AnalyticPsf> kernels = new ArrayList<>();
            if (seeingArcsec > 0) {
                kernels.add(Seeing.moffat(seeingArcsec).kernel(scale));
            }
            if (trackingPx > width) {
                kernels.add(new GaussianPsf(trackingPx, width, angleDeg));
            }
            PsfModel m = kernels.isEmpty() ? optics : new ConvolvedPsf(optics, kernels, List.of(), scale);
            Image img = m.render(size, over, 0, 0);
            StarProfile p = StarProfileFit.fit(img.plane(0), null, size, size, shape, settings);
            return new double[] {p.fwhmMajor(), p.fwhmMinor()};
        }
    }
}
