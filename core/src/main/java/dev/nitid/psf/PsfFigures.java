package dev.nitid.psf;

import dev.nitid.image.Image;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;

/**
 * Figures derived from a rendered (or measured) PSF image, plane 0.
 *
 * <h2>How each figure is measured</h2>
 * <ul>
 * <li><b>FWHM</b>: the logarithm of the image (floored at 10⁻⁴ of the peak) is interpolated by Keys'
 *   cubic convolution (Keys 1981, IEEE Trans. ASSP 29, 1153; a = −½, which reproduces quadratics, hence a
 *   sampled Gaussian exactly) on a grid {@code u} times finer around the peak; the region at or above half the
 *   interpolated maximum is treated as an ellipse: for a uniform ellipse of semi-axes a, b the second
 *   moments along its axes are a²/4 and b²/4, so FWHM<sub>major</sub> = 4√λ₁ and FWHM<sub>minor</sub> =
 *   4√λ₂ from the eigenvalues of the region's second-moment matrix, and the angle is that of the first
 *   eigenvector. {@code fwhmPx} is their geometric mean, the diameter of the circle of the same area.
 *   This is the FWHM of the pixel-integrated PSF as rendered, not of the optics alone.</li>
 * <li><b>Encircled energy</b>: the fraction of the image's total flux within radius r of the flux
 *   centroid, with each pixel split into 8 × 8 parts to follow the circle; radii every ½ pixel up to the
 *   largest circle inside the image.</li>
 * <li><b>Strehl, plate scale, sampling</b>: from the model when one is given ({@link PsfModel#strehl()},
 *   {@link PsfModel#plateScaleArcsec()}, {@link PsfModel#pixelOverNyquist()}); the Nyquist pixel is
 *   λ/(2D), from the incoherent cut-off D/λ of a circular pupil (Goodman, Introduction to Fourier Optics,
 *   ch. 6).</li>
 * </ul>
 *
 * @param fwhmPx           geometric mean of the major and minor FWHM, pixels
 * @param fwhmMajorPx      FWHM along the major axis, pixels
 * @param fwhmMinorPx      FWHM along the minor axis, pixels
 * @param angleDeg         major-axis angle from +x towards +y, degrees in (−90, 90]
 * @param peak             largest pixel value
 * @param centroidX        flux centroid x, pixels (0 = first column)
 * @param centroidY        flux centroid y, pixels
 * @param eeRadiusPx       radii of the encircled-energy curve, pixels
 * @param encircledEnergy  fraction of the total flux within each radius
 * @param r50Px            radius holding half the flux, pixels
 * @param r80Px            radius holding 80 % of the flux, pixels (NaN if beyond the image)
 * @param strehl           Strehl ratio, when the model has one
 * @param plateScaleArcsec arcsec per pixel, when known
 * @param pixelOverNyquist pixel over λ/(2D) at the shortest wavelength, when known
 * @param undersampled     true when {@code pixelOverNyquist > 1}
 * @param warnings         plain sentences (under-sampling, PSF touching the edge)
 */
public record PsfFigures(double fwhmPx, double fwhmMajorPx, double fwhmMinorPx, double angleDeg, double peak,
                         double centroidX, double centroidY, double[] eeRadiusPx, double[] encircledEnergy,
                         double r50Px, double r80Px, OptionalDouble strehl, OptionalDouble plateScaleArcsec,
                         OptionalDouble pixelOverNyquist, boolean undersampled, List<String> warnings) {

    /** Sub-pixel split per axis for the encircled energy. */
    static final int EE_SPLIT = 8;
    /** Radial step of the encircled-energy curve, pixels. */
    public static final double EE_STEP_PX = 0.5;

    /** Copies the warning list. */
    public PsfFigures {
        warnings = List.copyOf(warnings);
    }

    /** @return the FWHM in arcsec when the plate scale is known */
    public OptionalDouble fwhmArcsec() {
        return plateScaleArcsec.isPresent() ? OptionalDouble.of(fwhmPx * plateScaleArcsec.getAsDouble())
                : OptionalDouble.empty();
    }

    /**
     * Figures of a PSF image alone (no optics known).
     *
     * @param psf the PSF, plane 0 used (input, not modified)
     * @return the figures
     */
    public static PsfFigures of(Image psf) {
        return compute(psf, OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
    }

    /**
     * Figures of a PSF image rendered from {@code model}, with the optics figures the model knows.
     *
     * @param psf   the PSF, plane 0 used (input, not modified)
     * @param model the model it was rendered from
     * @return the figures
     */
    public static PsfFigures of(Image psf, PsfModel model) {
        return compute(psf, model.strehl(), model.plateScaleArcsec(), model.pixelOverNyquist());
    }

    private static PsfFigures compute(Image psf, OptionalDouble strehl, OptionalDouble scale, OptionalDouble nyq) {
        int w = psf.width();
        int h = psf.height();
        float[] a = psf.plane(0);
        List<String> warnings = new ArrayList<>();
        double sum = 0;
        double sx = 0;
        double sy = 0;
        int peakIndex = 0;
        for (int i = 0; i < a.length; i++) {
            if (!Float.isFinite(a[i])) {
                throw new IllegalArgumentException("PSF pixel (" + (i % w) + ", " + (i / w) + ") is " + a[i]
                        + ": prepare the PSF with Psfs.fromImage first");
            }
            sum += a[i];
            sx += a[i] * (double) (i % w);
            sy += a[i] * (double) (i / w);
            if (a[i] > a[peakIndex]) {
                peakIndex = i;
            }
        }
        if (!(sum > 0)) {
            throw new IllegalArgumentException("PSF sums to " + sum + ": a PSF needs a positive total");
        }
        double cx = sx / sum;
        double cy = sy / sum;
        double[] fwhm = FwhmMeasure.measure(a, w, h, peakIndex % w, peakIndex / w);
        if (Double.isNaN(fwhm[0])) {
            warnings.add("the half-maximum region touches the image edge: FWHM not measured (use a larger stamp)");
        }
        double[][] ee = encircledEnergy(a, w, h, cx, cy, sum);
        boolean under = nyq.isPresent() && nyq.getAsDouble() > 1;
        if (under) {
            warnings.add(String.format(Locale.ROOT,
                    "the pixel is %.2f times the Nyquist pixel lambda/(2D): the detector under-samples the optics",
                    nyq.getAsDouble()));
        }
        return new PsfFigures(Math.sqrt(fwhm[0] * fwhm[1]), fwhm[0], fwhm[1], fwhm[2], a[peakIndex], cx, cy,
                ee[0], ee[1], radiusAt(ee, 0.5), radiusAt(ee, 0.8), strehl, scale, nyq, under, warnings);
    }

    private static double radiusAt(double[][] ee, double level) {
        double[] r = ee[0];
        double[] e = ee[1];
        if (e.length == 0 || e[0] >= level) {
            return e.length == 0 ? Double.NaN : r[0] * level / e[0];
        }
        for (int i = 1; i < e.length; i++) {
            if (e[i] >= level) {
                return r[i - 1] + (r[i] - r[i - 1]) * (level - e[i - 1]) / (e[i] - e[i - 1]);
            }
        }
        return Double.NaN;
    }

    /** {radii, EE}: fine radial histogram of 8×8 sub-pixel parts, accumulated, read every ½ pixel. */
    static double[][] encircledEnergy(float[] a, int w, int h, double cx, double cy, double total) {
        double rMax = Math.min(Math.min(cx + 0.5, w - 0.5 - cx), Math.min(cy + 0.5, h - 0.5 - cy));
        int steps = (int) Math.floor(rMax / EE_STEP_PX);
        double binWidth = EE_STEP_PX / 20;
        int nb = (int) Math.ceil(rMax / binWidth) + 2;
        double[] hist = new double[nb];
        double part = 1.0 / (EE_SPLIT * EE_SPLIT);
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double v = a[y * w + x] * part;
                if (v == 0) {
                    continue;
                }
                for (int j = 0; j < EE_SPLIT; j++) {
                    double dy = y - 0.5 + (j + 0.5) / EE_SPLIT - cy;
                    for (int i = 0; i < EE_SPLIT; i++) {
                        double dx = x - 0.5 + (i + 0.5) / EE_SPLIT - cx;
                        int b = (int) (Math.sqrt(dx * dx + dy * dy) / binWidth);
                        if (b < nb) {
                            hist[b] += v;
                        }
                    }
                }
            }
        }
        double[] r = new double[steps];
        double[] e = new double[steps];
        double cum = 0;
        int b = 0;
        for (int k = 0; k < steps; k++) {
            r[k] = (k + 1) * EE_STEP_PX;
            int end = (int) Math.round(r[k] / binWidth);
            while (b < end && b < nb) {
                cum += hist[b++];
            }
            e[k] = cum / total;
        }
        return new double[][] {r, e};
    }
}
