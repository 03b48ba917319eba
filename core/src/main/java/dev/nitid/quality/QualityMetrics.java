package dev.nitid.quality;

import dev.nitid.image.Image;
import dev.nitid.quality.internal.Robust;
import dev.nitid.stars.StarProfile;
import dev.nitid.stars.StarProfileFit;
import java.util.List;

/**
 * The five restoration quality metrics. Each method's Javadoc is its definition; {@link QualityReference}
 * applies all five to a synthetic scene with known truth.
 *
 * <p>Stateless and thread-safe. Coordinates: pixel centres at integers; a pixel belongs to an annulus
 * {@code [r₁, r₂)} when the distance from its centre to the star's centre is in that interval.
 */
public final class QualityMetrics {

    private QualityMetrics() {
    }

    /**
     * Sky noise: {@code σ = 1.4826 · median(|v − median(v)|)} over the pixels of a star-free sky mask, the
     * robust σ of Gaussian data (Rousseeuw &amp; Croux 1993, JASA 88, 1273). Integer-valued data (16-bit
     * images) are dithered first so that the MAD is not stuck on whole numbers (see
     * {@code Robust.madSigmaDequantised}).
     *
     * @param image   plane 0 used (input, not modified)
     * @param skyMask true on star-free sky, row-major (input, not modified)
     * @return σ in the image's units; NaN if the mask is empty
     */
    public static double skyNoise(Image image, boolean[] skyMask) {
        checkMask(image, skyMask, "sky mask");
        float[] px = image.plane(0);
        double[] v = new double[px.length];
        int n = 0;
        for (int i = 0; i < px.length; i++) {
            if (skyMask[i] && Float.isFinite(px[i])) {
                v[n++] = px[i];
            }
        }
        return Robust.madSigmaDequantised(v, n);
    }

    /**
     * <b>Noise ratio</b>: {@link #skyNoise} of the output over that of the input, on the same sky mask.
     * 1 means the restorer left the sky noise as it was; above 1 it amplified it.
     *
     * @param input   the observed image (input, not modified)
     * @param output  the restored image (input, not modified)
     * @param skyMask star-free sky (input, not modified)
     * @return σ_out / σ_in
     */
    public static double noiseRatio(Image input, Image output, boolean[] skyMask) {
        return skyNoise(output, skyMask) / skyNoise(input, skyMask);
    }

    /**
     * <b>FWHM ratio</b>: for each star, fit a 2-D Gaussian plus a constant
     * ({@code A·exp(−Q/2) + B}, elliptical, by {@link StarProfileFit}) to the {@code stamp × stamp} pixels
     * centred on the pixel nearest its centre (15 × 15 by definition), in the input and in the output, and
     * take the geometric-mean FWHM {@code √(major · minor)}; the result is the median over stars of
     * FWHM_out / FWHM_in. Callers pass isolated unsaturated stars peaking above 30 input sky σ. Stars whose
     * fit fails to converge or gives a non-finite width in either image are skipped.
     *
     * @param input  the observed image (input, not modified)
     * @param output the restored image (input, not modified)
     * @param stars  star centres
     * @param stamp  stamp side, odd
     * @return the median ratio, the median FWHMs and the number of stars used
     */
    public static FwhmComparison fwhmRatio(Image input, Image output, List<StarSite> stars, int stamp) {
        double[] ratio = new double[stars.size()];
        double[] fin = new double[stars.size()];
        double[] fout = new double[stars.size()];
        int n = 0;
        for (StarSite s : stars) {
            double a = fitFwhm(input, s, stamp);
            double b = fitFwhm(output, s, stamp);
            if (Double.isFinite(a) && Double.isFinite(b) && a > 0 && b > 0) {
                fin[n] = a;
                fout[n] = b;
                ratio[n] = b / a;
                n++;
            }
        }
        return new FwhmComparison(Robust.median(ratio, n), Robust.median(fin, n), Robust.median(fout, n), n);
    }

    /**
     * Median FWHM of stars in one image, measured as in {@link #fwhmRatio}.
     *
     * @param image the image (input, not modified)
     * @param stars star centres
     * @param stamp stamp side
     * @return the median FWHM in pixels, NaN if no fit succeeded
     */
    public static double medianFwhm(Image image, List<StarSite> stars, int stamp) {
        double[] f = new double[stars.size()];
        int n = 0;
        for (StarSite s : stars) {
            double v = fitFwhm(image, s, stamp);
            if (Double.isFinite(v) && v > 0) {
                f[n++] = v;
            }
        }
        return Robust.median(f, n);
    }

    /**
     * Gaussian+constant FWHM of one star (see {@link #fwhmRatio}).
     *
     * @param image the image (input, not modified)
     * @param s     the star centre
     * @param stamp stamp side, odd
     * @return √(major·minor) in pixels, NaN if the stamp leaves the image or the fit does not converge
     */
    public static double fitFwhm(Image image, StarSite s, int stamp) {
        int half = stamp / 2;
        int cx = (int) Math.round(s.x());
        int cy = (int) Math.round(s.y());
        if (cx - half < 0 || cy - half < 0 || cx + half >= image.width() || cy + half >= image.height()) {
            return Double.NaN;
        }
        float[] px = image.plane(0);
        float[] st = new float[stamp * stamp];
        for (int j = 0; j < stamp; j++) {
            System.arraycopy(px, (cy - half + j) * image.width() + cx - half, st, j * stamp, stamp);
        }
        StarProfile p = StarProfileFit.fitGaussian(st, stamp, stamp);
        return p.converged() ? p.fwhm() : Double.NaN;
    }

    /**
     * <b>Ring depth</b>: around each star, the mean of the image in 1-px annuli
     * {@code [ringFrom + k, ringFrom + k + 1)} for every {@code ringFrom + k < ringTo} (1.5 to 12.5 px by
     * default), minus the median of the background annulus {@code [backgroundInner, backgroundOuter)} (20–30
     * px); the most negative of these values over all stars and annuli, divided by the input's sky σ and
     * reported with its sign flipped. 0 means no dark ring; 2 means a ring 2 σ below the local background.
     * Callers pass the brightest isolated unsaturated stars (twelve by definition); stars whose background
     * annulus leaves the image are skipped.
     *
     * @param image         the image to score (input, not modified)
     * @param stars         star centres
     * @param inputSkySigma σ of the input's sky ({@link #skyNoise}), the unit of the result
     * @param settings      the radii
     * @return the depth, where it is worst, and how many stars were used
     */
    public static RingDepth ringDepth(Image image, List<StarSite> stars, double inputSkySigma,
                                      QualitySettings settings) {
        float[] px = image.plane(0);
        int w = image.width();
        int h = image.height();
        int annuli = (int) Math.ceil(settings.ringTo() - settings.ringFrom());
        double worst = 0;
        StarSite worstStar = null;
        double worstRadius = Double.NaN;
        int used = 0;
        double rb = settings.backgroundOuter();
        double[] bg = new double[(int) (Math.PI * rb * rb * 1.2) + 16];
        double[] sum = new double[annuli];
        int[] cnt = new int[annuli];
        for (StarSite s : stars) {
            int x0 = (int) Math.floor(s.x() - rb);
            int x1 = (int) Math.ceil(s.x() + rb);
            int y0 = (int) Math.floor(s.y() - rb);
            int y1 = (int) Math.ceil(s.y() + rb);
            if (x0 < 0 || y0 < 0 || x1 >= w || y1 >= h) {
                continue;
            }
            java.util.Arrays.fill(sum, 0);
            java.util.Arrays.fill(cnt, 0);
            int nb = 0;
            for (int y = y0; y <= y1; y++) {
                for (int x = x0; x <= x1; x++) {
                    float v = px[y * w + x];
                    if (!Float.isFinite(v)) {
                        continue;
                    }
                    double r = Math.hypot(x - s.x(), y - s.y());
                    if (r >= settings.backgroundInner() && r < settings.backgroundOuter()) {
                        bg[nb++] = v;
                    }
                    double k = r - settings.ringFrom();
                    if (k >= 0 && k < annuli) {
                        sum[(int) k] += v;
                        cnt[(int) k]++;
                    }
                }
            }
            double background = Robust.median(bg, nb);
            used++;
            for (int k = 0; k < annuli; k++) {
                if (cnt[k] == 0) {
                    continue;
                }
                double d = sum[k] / cnt[k] - background;
                if (d < worst) {
                    worst = d;
                    worstStar = s;
                    worstRadius = settings.ringFrom() + k;
                }
            }
        }
        double depth = used == 0 ? Double.NaN : -worst / inputSkySigma;
        return new RingDepth(depth, used, worstStar, worstRadius);
    }

    /**
     * <b>Error vs truth</b> of one image: over the ladder's pixels (nebula pixels away from stars), fit
     * {@code image ≈ a · (truth ⊛ G_t) + b} by least squares, take
     * {@code E(t) = rms residual / (a · std(truth ⊛ G_t))} and minimise over the ladder's Gaussian FWHMs t
     * (0.5 to 8 px by default). The free t, a and b make the figure blind to the image's own resolution,
     * scale and pedestal: it measures noise and artefacts relative to the structure's contrast. The
     * <i>error ratio</i> of a restorer is this figure for its output over the figure for its input.
     *
     * @param image  the image to score (input, not modified)
     * @param ladder the smoothed truth on the compared pixels
     * @return the minimum figure, the t where it is reached, and the fitted gain a
     */
    public static TruthError truthError(Image image, TruthLadder ladder) {
        if (image.width() != ladder.width() || image.height() != ladder.height()) {
            throw new IllegalArgumentException("image is " + image.width() + "x" + image.height()
                    + " but the truth ladder was built for " + ladder.width() + "x" + ladder.height());
        }
        float[] px = image.plane(0);
        int[] idx = ladder.pixels();
        int n = idx.length;
        double[] fw = ladder.fwhms();
        double best = Double.POSITIVE_INFINITY;
        double bestT = Double.NaN;
        double bestA = Double.NaN;
        double my = 0;
        for (int i : idx) {
            my += px[i];
        }
        my /= n;
        for (int s = 0; s < fw.length; s++) {
            float[] t = ladder.smoothed(s);
            double mx = 0;
            for (int k = 0; k < n; k++) {
                mx += t[k];
            }
            mx /= n;
            double sxx = 0;
            double sxy = 0;
            double syy = 0;
            for (int k = 0; k < n; k++) {
                double dx = t[k] - mx;
                double dy = px[idx[k]] - my;
                sxx += dx * dx;
                sxy += dx * dy;
                syy += dy * dy;
            }
            if (!(sxx > 0)) {
                continue;
            }
            double a = sxy / sxx;
            double rss = Math.max(0, syy - a * sxy);
            double figure = Math.sqrt(rss / n) / (a * Math.sqrt(sxx / n));
            if (a > 0 && figure < best) {
                best = figure;
                bestT = fw[s];
                bestA = a;
            }
        }
        return new TruthError(best, bestT, bestA, n);
    }

    /**
     * <b>Flux ratio</b>: aperture photometry of each star in the input and in the output — the sum over
     * pixels within {@code radius} of the centre, minus that pixel count times the median of the sky annulus
     * {@code [radius + annulusGap, radius + annulusGap + annulusWidth)} — and the median over stars of output
     * flux / input flux. By definition {@code radius = max(2.5 · FWHM_in, 10 px)} with the median input FWHM.
     * Stars whose annulus leaves the image or whose input flux is not positive are skipped.
     *
     * @param input    the observed image (input, not modified)
     * @param output   the restored image (input, not modified)
     * @param stars    star centres (the isolated unsaturated stars of the FWHM metric)
     * @param radius   aperture radius in pixels
     * @param settings annulus gap and width
     * @return the median ratio and the number of stars used
     */
    public static FluxComparison fluxRatio(Image input, Image output, List<StarSite> stars, double radius,
                                           QualitySettings settings) {
        double[] ratios = new double[stars.size()];
        int n = 0;
        for (StarSite s : stars) {
            double fin = aperture(input, s, radius, settings);
            double fout = aperture(output, s, radius, settings);
            if (Double.isFinite(fin) && fin > 0 && Double.isFinite(fout)) {
                ratios[n++] = fout / fin;
            }
        }
        return new FluxComparison(Robust.median(ratios, n), radius, n);
    }

    /**
     * Sky-subtracted aperture sum (see {@link #fluxRatio}).
     *
     * @param image    the image (input, not modified)
     * @param s        the star centre
     * @param radius   aperture radius
     * @param settings annulus gap and width
     * @return the flux, NaN if the annulus leaves the image
     */
    public static double aperture(Image image, StarSite s, double radius, QualitySettings settings) {
        double r1 = radius + settings.annulusGap();
        double r2 = r1 + settings.annulusWidth();
        int w = image.width();
        int h = image.height();
        int x0 = (int) Math.floor(s.x() - r2);
        int x1 = (int) Math.ceil(s.x() + r2);
        int y0 = (int) Math.floor(s.y() - r2);
        int y1 = (int) Math.ceil(s.y() + r2);
        if (x0 < 0 || y0 < 0 || x1 >= w || y1 >= h) {
            return Double.NaN;
        }
        float[] px = image.plane(0);
        double[] ann = new double[(x1 - x0 + 1) * (y1 - y0 + 1)];
        int na = 0;
        double sum = 0;
        int np = 0;
        for (int y = y0; y <= y1; y++) {
            for (int x = x0; x <= x1; x++) {
                float v = px[y * w + x];
                double r = Math.hypot(x - s.x(), y - s.y());
                if (r < radius) {
                    if (!Float.isFinite(v)) {
                        return Double.NaN;
                    }
                    sum += v;
                    np++;
                } else if (r >= r1 && r < r2 && Float.isFinite(v)) {
                    ann[na++] = v;
                }
            }
        }
        return sum - np * Robust.median(ann, na);
    }

    static void checkMask(Image image, boolean[] mask, String what) {
        if (mask.length != image.width() * image.height()) {
            throw new IllegalArgumentException(what + " has " + mask.length + " pixels but the image is "
                    + image.width() + "x" + image.height() + ": build the mask on the image's grid");
        }
    }

    /**
     * @param ratio      median FWHM_out / FWHM_in
     * @param inputFwhm  median input FWHM of the stars used, pixels
     * @param outputFwhm median output FWHM, pixels
     * @param stars      stars used
     */
    public record FwhmComparison(double ratio, double inputFwhm, double outputFwhm, int stars) {
    }

    /**
     * @param depth       ring depth in input sky σ, ≥ 0 (NaN if no star could be used)
     * @param stars       stars used
     * @param worstStar   the star with the deepest ring (null if none dips)
     * @param worstRadius inner radius of the deepest annulus
     */
    public record RingDepth(double depth, int stars, StarSite worstStar, double worstRadius) {
    }

    /**
     * @param figure  min over t of rms residual / (a · std(truth ⊛ G_t))
     * @param bestFwhm the t reaching it
     * @param gain     the fitted a at that t
     * @param pixels  compared pixels
     */
    public record TruthError(double figure, double bestFwhm, double gain, int pixels) {
    }

    /**
     * @param ratio  median output/input aperture flux
     * @param radius aperture radius used
     * @param stars  stars used
     */
    public record FluxComparison(double ratio, double radius, int stars) {
    }
}
