package dev.nitid.stars;

import dev.nitid.stars.fit.FitResult;
import dev.nitid.stars.fit.LevenbergMarquardt;
import dev.nitid.stars.internal.EllipticalProfileModel;
import java.util.Arrays;

/**
 * Fits an elliptical 2-D Gaussian or Moffat profile plus a constant background to a star stamp by
 * {@link LevenbergMarquardt}, and derives the centre, FWHM along both axes, angle, β, flux and their
 * standard errors.
 *
 * <pre>{@code
 * StarProfile g = StarProfileFit.fit(stamp, 15, 15, ProfileShape.GAUSSIAN);
 * double fwhm = g.fwhm();               // √(major·minor), pixels
 * }</pre>
 *
 * <p>Profiles ({@link EllipticalProfileModel}): with {@code Q = a·dx² + 2b·dx·dy + c·dy²},
 * Gaussian {@code A·exp(−Q/2) + B} and Moffat {@code A·(1+Q)^(−β) + B}. If λ is an eigenvalue of
 * {@code [[a, b], [b, c]]}, the FWHM along its eigenvector is {@code 2√(2 ln 2/λ)} (Gaussian) or
 * {@code 2√((2^(1/β) − 1)/λ)} (Moffat; Trujillo et al. 2001, MNRAS 328, 977, eq. 2 for the round case).
 * Fluxes: {@code 2πA/√(ac − b²)} (Gaussian) and {@code πA/((β − 1)√(ac − b²))} (Moffat).
 *
 * <p>Start point: background = median of the finite border pixels; centre = intensity-weighted centroid of
 * the 3×3 pixels around the brightest pixel; width from the area above half maximum. The Moffat fit starts
 * from the Gaussian fit with β = 3. NaN pixels are ignored. Weights are uniform unless given, and the
 * covariance is then scaled by the reduced χ² (see {@link dev.nitid.stars.fit.FitSettings.CovarianceScaling}).
 *
 * <p>Stateless and thread-safe.
 */
public final class StarProfileFit {
    private static final double LN2 = Math.log(2);
    /** Moffat β at which the fit starts: a typical seeing-limited value (common practice, no source). */
    static final double START_BETA = 3.0;

    private StarProfileFit() {
    }

    /**
     * Fits a profile with default settings (point sampling at pixel centres).
     *
     * @param stamp  pixels, row-major {@code width × height}, NaN = ignore (input, not modified)
     * @param width  stamp width, ≥ 3
     * @param height stamp height, ≥ 3
     * @param shape  Gaussian or Moffat
     * @return the fitted profile
     */
    public static StarProfile fit(float[] stamp, int width, int height, ProfileShape shape) {
        return fit(stamp, null, width, height, shape, ProfileFitSettings.defaults());
    }

    /** Gaussian + constant with default settings; see {@link #fit(float[], int, int, ProfileShape)}. */
    public static StarProfile fitGaussian(float[] stamp, int width, int height) {
        return fit(stamp, width, height, ProfileShape.GAUSSIAN);
    }

    /** Moffat + constant with default settings; see {@link #fit(float[], int, int, ProfileShape)}. */
    public static StarProfile fitMoffat(float[] stamp, int width, int height) {
        return fit(stamp, width, height, ProfileShape.MOFFAT);
    }

    /**
     * Fits a profile.
     *
     * @param stamp    pixels, row-major {@code width × height}, NaN = ignore (input, not modified)
     * @param weights  per-pixel weights 1/σ², or {@code null} for uniform (input, not modified)
     * @param width    stamp width, ≥ 3
     * @param height   stamp height, ≥ 3
     * @param shape    Gaussian or Moffat
     * @param settings sampling and solver settings
     * @return the fitted profile; check {@link StarProfile#converged()}
     * @throws IllegalArgumentException if the sizes do not match or the stamp has too few finite pixels
     */
    public static StarProfile fit(float[] stamp, float[] weights, int width, int height, ProfileShape shape,
                                  ProfileFitSettings settings) {
        if (width < 3 || height < 3) {
            throw new IllegalArgumentException("stamp is " + width + "x" + height
                    + ": use at least 3x3 pixels (15x15 is typical for a 3-pixel FWHM)");
        }
        if (stamp == null || stamp.length != width * height) {
            throw new IllegalArgumentException("stamp has " + (stamp == null ? "no array" : stamp.length + " pixels")
                    + " but is declared " + width + "x" + height + ": pass width*height pixels");
        }
        if (weights != null && weights.length != stamp.length) {
            throw new IllegalArgumentException("weights has " + weights.length + " values for a " + width + "x"
                    + height + " stamp: pass one weight per pixel or null");
        }
        if (shape == null || settings == null) {
            throw new IllegalArgumentException("shape and settings must not be null: use ProfileShape.GAUSSIAN "
                    + "and ProfileFitSettings.defaults()");
        }
        double[] data = new double[stamp.length];
        int finite = 0;
        for (int i = 0; i < stamp.length; i++) {
            data[i] = stamp[i];
            if (Float.isFinite(stamp[i])) {
                finite++;
            }
        }
        if (finite < 9) {
            throw new IllegalArgumentException("stamp has only " + finite
                    + " finite pixels: a profile fit needs at least 9");
        }
        double[] w = null;
        if (weights != null) {
            w = new double[weights.length];
            for (int i = 0; i < w.length; i++) {
                w[i] = weights[i];
            }
        }
        boolean integrated = settings.sampling() == PixelSampling.INTEGRATED;
        EllipticalProfileModel gauss = new EllipticalProfileModel(false, integrated, width, height);
        double[] start = initialGaussian(stamp, width, height);
        FitResult g = LevenbergMarquardt.fit(gauss, start, data, w, settings.solver());
        if (shape == ProfileShape.GAUSSIAN) {
            return describe(ProfileShape.GAUSSIAN, g);
        }
        return describe(ProfileShape.MOFFAT, fitMoffatFrom(g, start, data, w, width, height, integrated, settings));
    }

    /**
     * Fits both profiles, the Moffat starting from the Gaussian (cheaper than two separate calls).
     *
     * @param stamp    pixels, row-major, NaN = ignore (input, not modified)
     * @param weights  per-pixel weights 1/σ², or {@code null} (input, not modified)
     * @param width    stamp width, ≥ 3
     * @param height   stamp height, ≥ 3
     * @param settings sampling and solver settings
     * @return the Gaussian and the Moffat fit
     */
    public static ProfilePair fitBoth(float[] stamp, float[] weights, int width, int height,
                                      ProfileFitSettings settings) {
        StarProfile g = fit(stamp, weights, width, height, ProfileShape.GAUSSIAN, settings);
        return new ProfilePair(g, fitMoffatFrom(g, stamp, weights, width, height, settings));
    }

    /**
     * Fits the Moffat profile starting from a Gaussian fit of the same stamp (its centre, amplitude and
     * background, its quadratic form rescaled so that the FWHM is kept at β = 3). Lets a caller look at the
     * Gaussian fit first and skip the costlier Moffat fit of a stamp it will reject anyway;
     * {@code fitBoth} is this after {@link #fit}.
     *
     * @param gaussian the Gaussian fit of this stamp with these settings
     * @param stamp    pixels, row-major, NaN = ignore (input, not modified)
     * @param weights  per-pixel weights 1/σ², or {@code null} (input, not modified)
     * @param width    stamp width, ≥ 3
     * @param height   stamp height, ≥ 3
     * @param settings sampling and solver settings
     * @return the Moffat + constant fit
     * @throws IllegalArgumentException if the gaussian is not a Gaussian fit or a size does not match
     */
    public static StarProfile fitMoffatFrom(StarProfile gaussian, float[] stamp, float[] weights, int width,
                                            int height, ProfileFitSettings settings) {
        if (gaussian == null || gaussian.shape() != ProfileShape.GAUSSIAN) {
            throw new IllegalArgumentException("the start must be a Gaussian fit of the stamp, not "
                    + (gaussian == null ? "null" : gaussian.shape()) + ": call fit(..., GAUSSIAN, ...) first");
        }
        if (stamp == null || stamp.length != width * height || (weights != null && weights.length != stamp.length)) {
            throw new IllegalArgumentException("stamp and weights must hold " + width + "x" + height
                    + " values: pass the stamp the Gaussian was fitted to");
        }
        double[] data = new double[stamp.length];
        for (int i = 0; i < stamp.length; i++) {
            data[i] = stamp[i];
        }
        double[] w = null;
        if (weights != null) {
            w = new double[weights.length];
            for (int i = 0; i < w.length; i++) {
                w[i] = weights[i];
            }
        }
        boolean integrated = settings.sampling() == PixelSampling.INTEGRATED;
        FitResult m = fitMoffatFrom(gaussian.fit(), initialGaussian(stamp, width, height), data, w, width, height,
                integrated, settings);
        return describe(ProfileShape.MOFFAT, m);
    }

    /**
     * A Gaussian and a Moffat fit of the same stamp.
     *
     * @param gaussian the Gaussian + constant fit
     * @param moffat   the Moffat + constant fit
     */
    public record ProfilePair(StarProfile gaussian, StarProfile moffat) {
    }

    private static FitResult fitMoffatFrom(FitResult g, double[] start, double[] data, double[] w, int width,
                                           int height, boolean integrated, ProfileFitSettings settings) {
        EllipticalProfileModel gauss = new EllipticalProfileModel(false, integrated, width, height);
        double[] gp = gauss.isValid(g.params()) ? g.params() : start;
        double k = (Math.pow(2, 1 / START_BETA) - 1) / (2 * LN2);
        double[] ms = {gp[0], gp[1], gp[2], gp[3] * k, gp[4] * k, gp[5] * k, START_BETA, gp[6]};
        EllipticalProfileModel moffat = new EllipticalProfileModel(true, integrated, width, height);
        return LevenbergMarquardt.fit(moffat, ms, data, w, settings.solver());
    }

    /** [A, x0, y0, a, b, c, B] from the stamp's simple statistics. */
    static double[] initialGaussian(float[] s, int w, int h) {
        float[] border = new float[2 * (w + h)];
        int nb = 0;
        for (int i = 0; i < w; i++) {
            nb = addFinite(border, nb, s[i]);
            nb = addFinite(border, nb, s[(h - 1) * w + i]);
        }
        for (int j = 1; j < h - 1; j++) {
            nb = addFinite(border, nb, s[j * w]);
            nb = addFinite(border, nb, s[j * w + w - 1]);
        }
        double bg;
        if (nb > 0) {
            Arrays.sort(border, 0, nb);
            bg = (nb & 1) == 1 ? border[nb / 2] : 0.5 * (border[nb / 2 - 1] + border[nb / 2]);
        } else {
            bg = 0;
        }
        int best = -1;
        double peak = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < s.length; i++) {
            if (Float.isFinite(s[i]) && s[i] > peak) {
                peak = s[i];
                best = i;
            }
        }
        int px = best % w;
        int py = best / w;
        double sw = 0;
        double sx = 0;
        double sy = 0;
        for (int dy = -1; dy <= 1; dy++) {
            for (int dx = -1; dx <= 1; dx++) {
                int x = px + dx;
                int y = py + dy;
                if (x < 0 || y < 0 || x >= w || y >= h || !Float.isFinite(s[y * w + x])) {
                    continue;
                }
                double v = Math.max(0, s[y * w + x] - bg);
                sw += v;
                sx += v * x;
                sy += v * y;
            }
        }
        double x0 = sw > 0 ? sx / sw : px;
        double y0 = sw > 0 ? sy / sw : py;
        double amp = Math.max(peak - bg, Double.MIN_NORMAL);
        int above = 0;
        for (float v : s) {
            if (Float.isFinite(v) && v - bg > 0.5 * amp) {
                above++;
            }
        }
        double fwhm = Math.max(1.0, 2 * Math.sqrt(Math.max(above, 1) / Math.PI));
        double sigma = fwhm / (2 * Math.sqrt(2 * LN2));
        double q = 1 / (sigma * sigma);
        return new double[] {amp, x0, y0, q, 0, q, bg};
    }

    private static int addFinite(float[] out, int n, float v) {
        if (Float.isFinite(v)) {
            out[n++] = v;
        }
        return n;
    }

    /** The derived quantities, in the order of {@link #derived}. */
    private static final int D_FWHM_MAJOR = 0;
    private static final int D_FWHM_MINOR = 1;
    private static final int D_ANGLE = 2;
    private static final int D_FLUX = 3;
    private static final int D_FWHM = 4;
    private static final int D_ELLIPTICITY = 5;

    /** fwhm major, minor, angle, flux, geometric FWHM, ellipticity from raw parameters. */
    static double[] derived(boolean moffat, double[] q) {
        double a = q[3];
        double b = q[4];
        double c = q[5];
        double half = 0.5 * (a + c);
        double r = Math.hypot(0.5 * (a - c), b);
        double lMin = half - r;
        double lMax = half + r;
        double beta = moffat ? q[6] : Double.NaN;
        double num = moffat ? Math.pow(2, 1 / beta) - 1 : 2 * LN2;
        double major = 2 * Math.sqrt(num / lMin);
        double minor = 2 * Math.sqrt(num / lMax);
        double angle = 0.5 * Math.atan2(2 * b, a - c) + 0.5 * Math.PI;
        angle = angle % Math.PI;
        if (angle < 0) {
            angle += Math.PI;
        }
        double det = Math.sqrt(a * c - b * b);
        double flux = moffat ? Math.PI * q[0] / ((beta - 1) * det) : 2 * Math.PI * q[0] / det;
        return new double[] {major, minor, angle, flux, Math.sqrt(major * minor), 1 - minor / major};
    }

    static StarProfile describe(ProfileShape shape, FitResult r) {
        boolean moffat = shape == ProfileShape.MOFFAT;
        double[] q = r.params();
        int p = q.length;
        double[] d = derived(moffat, q);
        double[] err = new double[d.length];
        // Delta method with central differences of the closed-form derived quantities.
        double[][] grad = new double[d.length][p];
        double[] qp = q.clone();
        for (int k = 0; k < p; k++) {
            double h = 1e-6 * Math.max(Math.abs(q[k]), k == 4 ? Math.sqrt(Math.abs(q[3] * q[5])) : 1e-3);
            qp[k] = q[k] + h;
            double[] up = derived(moffat, qp);
            qp[k] = q[k] - h;
            double[] dn = derived(moffat, qp);
            qp[k] = q[k];
            for (int m = 0; m < d.length; m++) {
                double diff = up[m] - dn[m];
                if (m == D_ANGLE) {
                    diff = Math.IEEEremainder(diff, Math.PI);
                }
                grad[m][k] = diff / (2 * h);
            }
        }
        for (int m = 0; m < d.length; m++) {
            double s = 0;
            for (int i = 0; i < p; i++) {
                for (int k = 0; k < p; k++) {
                    s += grad[m][i] * r.covariance(i, k) * grad[m][k];
                }
            }
            err[m] = Math.sqrt(s);
        }
        double[] sg = r.sigmas();
        StarProfile.Errors errors = new StarProfile.Errors(sg[1], sg[2], sg[0], sg[p - 1], err[D_FWHM_MAJOR],
                err[D_FWHM_MINOR], err[D_FWHM], err[D_ELLIPTICITY], err[D_ANGLE], moffat ? sg[6] : Double.NaN,
                err[D_FLUX]);
        return new StarProfile(shape, q[1], q[2], q[0], q[p - 1], d[D_FWHM_MAJOR], d[D_FWHM_MINOR], d[D_ANGLE],
                moffat ? q[6] : Double.NaN, d[D_FLUX], errors, r);
    }
}
