package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.ArrayList;
import java.util.List;

/**
 * Factories and helpers for PSFs: blur any model with seeing and jitter, and prepare a PSF from pixels.
 */
public final class Psfs {
    /**
     * Negative pixels down to this fraction of the peak are clipped to 0 with a warning; a pixel below it
     * means the background was not subtracted and the PSF is refused (project choice: noise in a
     * well-made PSF stamp stays within about 1 % of the peak).
     */
    public static final double DEFAULT_NEGATIVE_TOLERANCE = 0.02;

    private Psfs() {
    }

    /**
     * Convolves seeing and tracking jitter onto a model.
     *
     * @param base             the model (input)
     * @param seeing           seeing, or null for none
     * @param jitterSigmaPx    Gaussian σ of the tracking jitter in pixels, 0 for none
     * @param plateScaleArcsec arcsec per pixel, needed when seeing is given; NaN if unknown
     * @return {@code base} itself when there is no blur, otherwise a {@link ConvolvedPsf}
     * @throws IllegalArgumentException if seeing is given without a plate scale, or jitter is negative
     */
    public static PsfModel withSeeingAndJitter(PsfModel base, Seeing seeing, double jitterSigmaPx,
                                               double plateScaleArcsec) {
        if (!(jitterSigmaPx >= 0) || !Double.isFinite(jitterSigmaPx)) {
            throw new IllegalArgumentException("jitter " + jitterSigmaPx + " px must be ≥ 0 (0 for none)");
        }
        List<AnalyticPsf> kernels = new ArrayList<>();
        List<PsfParameter> params = new ArrayList<>();
        if (seeing != null) {
            if (!(plateScaleArcsec > 0) || !Double.isFinite(plateScaleArcsec)) {
                throw new IllegalArgumentException("seeing is given in arcsec but the plate scale is unknown: "
                        + "give the focal length (mm) and pixel size (µm)");
            }
            kernels.add(seeing.kernel(plateScaleArcsec));
            params.add(PsfParameter.of("SEEING", seeing.fwhmArcsec(), "[arcsec] seeing FWHM convolved on"));
            params.add(PsfParameter.of("SEEPROF", seeing.profile().name().toLowerCase(java.util.Locale.ROOT),
                    "seeing profile"));
            if (seeing.profile() == Seeing.Profile.MOFFAT) {
                params.add(PsfParameter.of("SEEBETA", seeing.beta(), "seeing Moffat beta"));
            }
        }
        if (jitterSigmaPx > 0) {
            kernels.add(GaussianPsf.ofSigma(jitterSigmaPx));
            params.add(PsfParameter.of("JITTER", jitterSigmaPx, "[px] tracking jitter Gaussian sigma"));
        }
        if (kernels.isEmpty()) {
            return base;
        }
        return new ConvolvedPsf(base, kernels, params, plateScaleArcsec);
    }

    /**
     * Plate scale of a detector behind a focal length: {@code 206.264806·p[µm]/f[mm]} arcsec per pixel.
     *
     * @param pixelSizeUm   pixel pitch, µm
     * @param focalLengthMm focal length, mm
     * @return arcsec per pixel
     */
    public static double plateScaleArcsec(double pixelSizeUm, double focalLengthMm) {
        Grids.positive("pixel size", pixelSizeUm, "µm");
        Grids.positive("focal length", focalLengthMm, "mm");
        return PupilPsf.plateScaleArcsec(pixelSizeUm, focalLengthMm);
    }

    /** {@link #fromImage(Image, double)} with {@link #DEFAULT_NEGATIVE_TOLERANCE}. */
    public static PreparedPsf fromImage(Image raw) {
        return fromImage(raw, DEFAULT_NEGATIVE_TOLERANCE);
    }

    /**
     * Prepares a PSF from raw pixels (e.g. read from a FITS file), plane by plane: checks every pixel is
     * finite, clips negatives no deeper than {@code negativeTolerance × peak} to 0 (with a warning), checks
     * the sum is positive, moves the flux centroid to the centre pixel by a whole-pixel shift (padding with
     * zeros, never cropping, so no flux is lost), makes both sides odd, and normalises each plane to sum 1.
     * All planes of a cube share one output size.
     *
     * @param raw               the pixels (input, not modified)
     * @param negativeTolerance deepest negative accepted, as a fraction of the plane's peak, ≥ 0
     * @return the prepared PSF with what was changed
     * @throws IllegalArgumentException naming the plane and pixel when a pixel is not finite, a negative is
     *                                  deeper than the tolerance, or a plane's sum is not positive
     */
    public static PreparedPsf fromImage(Image raw, double negativeTolerance) {
        if (!(negativeTolerance >= 0)) {
            throw new IllegalArgumentException("negative tolerance " + negativeTolerance + " must be ≥ 0");
        }
        int w = raw.width();
        int h = raw.height();
        int planes = raw.planes();
        List<String> warnings = new ArrayList<>();
        long clipped = 0;
        double[][] clean = new double[planes][];
        int[] cx = new int[planes];
        int[] cy = new int[planes];
        double[] rx = new double[planes];
        double[] ry = new double[planes];
        int halfW = 0;
        int halfH = 0;
        for (int p = 0; p < planes; p++) {
            float[] a = raw.plane(p);
            double peak = 0;
            for (int i = 0; i < a.length; i++) {
                if (!Float.isFinite(a[i])) {
                    throw new IllegalArgumentException("PSF plane " + p + " pixel (" + (i % w) + ", " + (i / w)
                            + ") is " + a[i] + ": a PSF must be finite everywhere (replace blank pixels by 0)");
                }
                peak = Math.max(peak, a[i]);
            }
            double[] v = new double[a.length];
            long neg = 0;
            double deepest = 0;
            double sum = 0;
            double sx = 0;
            double sy = 0;
            for (int i = 0; i < a.length; i++) {
                double x = a[i];
                if (x < 0) {
                    if (-x > negativeTolerance * peak) {
                        throw new IllegalArgumentException("PSF plane " + p + " pixel (" + (i % w) + ", " + (i / w)
                                + ") is " + x + ", below −" + negativeTolerance + " × the peak " + peak
                                + ": subtract the background so the wings are close to 0");
                    }
                    neg++;
                    deepest = Math.min(deepest, x);
                    x = 0;
                }
                v[i] = x;
                sum += x;
                sx += x * (i % w);
                sy += x * (i / w);
            }
            if (!(sum > 0)) {
                throw new IllegalArgumentException("PSF plane " + p + " sums to " + sum
                        + ": a PSF needs a positive total (is it inverted or empty?)");
            }
            if (neg > 0) {
                clipped += neg;
                warnings.add("PSF plane " + p + ": " + neg + " negative pixel(s) set to 0 (deepest "
                        + String.format(java.util.Locale.ROOT, "%.3g", deepest / peak) + " of the peak)");
            }
            double mx = sx / sum;
            double my = sy / sum;
            cx[p] = (int) Math.round(mx);
            cy[p] = (int) Math.round(my);
            rx[p] = mx - cx[p];
            ry[p] = my - cy[p];
            halfW = Math.max(halfW, Math.max(cx[p], w - 1 - cx[p]));
            halfH = Math.max(halfH, Math.max(cy[p], h - 1 - cy[p]));
            clean[p] = v;
        }
        int ow = 2 * halfW + 1;
        int oh = 2 * halfH + 1;
        Image out = Image.create(ow, oh, planes);
        for (int p = 0; p < planes; p++) {
            double[] acc = new double[ow * oh];
            int ox = halfW - cx[p];
            int oy = halfH - cy[p];
            for (int y = 0; y < h; y++) {
                for (int x = 0; x < w; x++) {
                    acc[(y + oy) * ow + x + ox] = clean[p][y * w + x];
                }
            }
            Image plane = Grids.normalise(acc, ow, oh);
            System.arraycopy(plane.plane(0), 0, out.plane(p), 0, ow * oh);
            if (ox != (ow - w) / 2 || oy != (oh - h) / 2 || ow != w || oh != h) {
                warnings.add("PSF plane " + p + ": centroid (" + fmt(cx[p] + rx[p]) + ", " + fmt(cy[p] + ry[p])
                        + ") moved to the centre of a " + ow + "x" + oh + " stamp");
            }
        }
        return new PreparedPsf(out, clipped, rx, ry, warnings);
    }

    /**
     * A number for people: 4 significant digits, no trailing zeros ({@code 200}, {@code 0.33}, {@code 3.76}).
     *
     * @param v the number
     * @return its text
     */
    public static String num(double v) {
        if (!Double.isFinite(v)) {
            return Double.toString(v);
        }
        return new java.math.BigDecimal(v).round(new java.math.MathContext(4)).stripTrailingZeros().toPlainString();
    }

    private static String fmt(double v) {
        return String.format(java.util.Locale.ROOT, "%.2f", v);
    }
}
