package dev.nitid.quality;

import dev.nitid.image.Image;
import dev.nitid.quality.internal.GaussianSmoothing;
import dev.nitid.quality.internal.Robust;
import dev.nitid.stars.BackgroundMap;
import dev.nitid.stars.BackgroundSettings;
import dev.nitid.stars.Detection;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.MeasuredStar;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import dev.nitid.stars.internal.Parallel;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * The quality metrics on real data, where there is no truth: FWHM ratio, ring depth, flux ratio and noise
 * ratio of a restoration against its input, from the stars measured in the input (what {@code nitid
 * sharpen}'s summary prints). Built once per input; immutable and thread-safe.
 *
 * <h2>Differences from {@link QualityReference}</h2>
 * <ul>
 *   <li>Stars: the accepted stars of a {@link StarMeasurement} (unblended, star-like, no pixel of the fit
 *       stamp at or above the saturation level when it is known) whose
 *       peak is at least {@code minPeakSigma} local background σ, isolated among <i>all</i> detections with the
 *       detection significance standing in for the flux, brightest (largest Gaussian flux) first.</li>
 *   <li>Sky noise: 1.4826·MAD of the image minus the input's mesh background map (so that a smooth nebula or
 *       gradient does not count as noise), over pixels farther than {@code max(8, 3·FWHM)} pixels from every
 *       detection whose background-subtracted input lies within ±5 σ of zero and, smoothed by a Gaussian of
 *       FWHM 4 px, stays within ±0.5 σ (faint wings, filaments and background-map misfits are not sky). The
 *       output uses the same pixels and the same background map. Whole-number data (16-bit images) are
 *       dithered before the MAD, as in {@link QualityMetrics#skyNoise}.</li>
 *   <li>No error-vs-truth: the report's truth figures are NaN.</li>
 * </ul>
 */
public final class ObservedQuality {
    /** Seed of the dither applied to whole-number data before the MAD (reproducible). */
    static final long DITHER_SEED = 0x5EEDL;
    /** Pixels of the background-subtracted input beyond this many σ are not sky (undetected structure). */
    static final double SKY_CLIP_SIGMA = 5.0;
    /** FWHM in pixels of the smoothing that reveals faint structure for the sky mask. */
    static final double STRUCTURE_FWHM = 4.0;
    /** Smoothed background-subtracted input above this many (unsmoothed) σ is structure, not sky. */
    static final double STRUCTURE_SIGMA = 0.5;
    /** Sky pixels keep at least this many pixels, and 3 FWHM, from every detection. */
    static final double MIN_CLEAR_RADIUS = 8.0;
    /**
     * Pixels per parallel chunk of the full-frame passes. Chunks are fixed by the image size alone, and each
     * writes only its own slots, so the figures are identical for any thread count.
     */
    static final int CHUNK = 1 << 16;

    private final Image input;
    private final QualitySettings settings;
    private final BackgroundMap map;
    private final float[] background;
    private final boolean[] skyMask;
    private final List<StarSite> fwhmStars;
    private final List<StarSite> ringStars;
    private final double inputSigma;
    private final double inputFwhm;
    private final double apertureRadius;
    private final int threads;
    /** Input FWHM of each FWHM star (NaN where the fit failed): the input side, fitted once. */
    private final double[] inputFwhms;
    /** Input aperture flux of each FWHM star (NaN where the annulus leaves the image). */
    private final double[] inputFluxes;

    private ObservedQuality(Image input, QualitySettings settings, BackgroundMap map, float[] background,
                            boolean[] skyMask, List<StarSite> fwhmStars, List<StarSite> ringStars, int threads) {
        this.input = input;
        this.settings = settings;
        this.map = map;
        this.background = background;
        this.skyMask = skyMask;
        this.threads = threads;
        this.fwhmStars = List.copyOf(fwhmStars);
        this.ringStars = List.copyOf(ringStars);
        this.inputSigma = skyNoise(input);
        this.inputFwhms = fitAll(input, this.fwhmStars, settings.fitStamp(), threads);
        this.inputFwhm = QualityMetrics.medianFwhm(inputFwhms);
        this.apertureRadius = Math.max(settings.apertureFwhm() * inputFwhm, settings.apertureMin());
        this.inputFluxes = new double[this.fwhmStars.size()];
        Parallel.forEach(inputFluxes.length, threads, (i, worker) ->
                inputFluxes[i] = QualityMetrics.aperture(input, this.fwhmStars.get(i), apertureRadius, settings));
    }

    private static double[] fitAll(Image img, List<StarSite> stars, int stamp, int threads) {
        double[] f = new double[stars.size()];
        Parallel.forEach(f.length, threads, (i, worker) -> f[i] = QualityMetrics.fitFwhm(img, stars.get(i), stamp));
        return f;
    }

    /**
     * Measures the input's stars with the stars package's defaults, then builds the reference.
     *
     * @param input      the observed image, plane 0 (input, not modified)
     * @param saturation level at or above which a pixel is saturated (header SATURATE, the data type's
     *                   ceiling), or NaN if unknown
     * @param settings   the metric constants
     * @param threads    worker threads for the measurement, ≥ 1 (the result does not depend on it)
     * @return the reference
     * @throws IllegalArgumentException if no usable star or too little sky is found
     */
    public static ObservedQuality measure(Image input, double saturation, QualitySettings settings, int threads) {
        StarMeasurement m = StarMeasurer.measure(input.planeImage(0),
                MeasureSettings.defaults().withThreads(threads).withSaturation(saturation));
        return of(input, m, saturation, settings, threads);
    }

    /**
     * Builds the reference from a star measurement of the input (for example the one that gave the PSF).
     * The measurement's background map is reused when it was estimated with
     * {@link BackgroundSettings#defaults()} (the measurement's default), else the map is estimated here.
     *
     * @param input       the observed image, plane 0 (input, not modified)
     * @param measurement stars measured on that plane
     * @param saturation  level at or above which a pixel is saturated, or NaN if unknown; stars with a
     *                    pixel at or above it within the fit stamp are left out
     * @param settings    the metric constants
     * @param threads     worker threads, ≥ 1 (the result does not depend on it)
     * @return the reference
     * @throws IllegalArgumentException if no usable star or too little sky is found
     */
    public static ObservedQuality of(Image input, StarMeasurement measurement, double saturation,
                                     QualitySettings settings, int threads) {
        checkSize(input, measurement);
        BackgroundMap held = measurement.backgroundMap();
        BackgroundMap map = held != null && held.settings().equals(BackgroundSettings.defaults())
                ? held
                : BackgroundMap.estimate(input.plane(0), input.width(), input.height(), BackgroundSettings.defaults(),
                        threads);
        return of(input, measurement, map, saturation, settings, threads);
    }

    /**
     * {@link #of(Image, StarMeasurement, double, QualitySettings, int)} with the input's mesh background map
     * already estimated (on a 24-megapixel frame the map is most of the cost of building the reference, so
     * a caller holding it should not pay twice). For the figures to mean what the class comment says, the
     * map must be {@code BackgroundMap.estimate(plane 0 of input, …, BackgroundSettings.defaults(), …)}.
     *
     * @param input       the observed image, plane 0 (input, not modified)
     * @param measurement stars measured on that plane
     * @param background  the mesh background map of plane 0 with {@link BackgroundSettings#defaults()}
     * @param saturation  level at or above which a pixel is saturated, or NaN if unknown
     * @param settings    the metric constants
     * @param threads     worker threads, ≥ 1 (the result does not depend on it)
     * @return the reference
     * @throws IllegalArgumentException if the sizes differ, or no usable star or too little sky is found
     */
    public static ObservedQuality of(Image input, StarMeasurement measurement, BackgroundMap background,
                                     double saturation, QualitySettings settings, int threads) {
        checkSize(input, measurement);
        int w = input.width();
        int h = input.height();
        if (background.width() != w || background.height() != h) {
            throw new IllegalArgumentException("the background map is for a " + background.width() + "x"
                    + background.height() + " image but the input is " + w + "x" + h + ": estimate it on this image");
        }
        BackgroundMap map = background;
        float[] px = input.plane(0);
        float[] bg = new float[px.length];
        map.subtract(null, bg, threads);

        List<Detection> det = measurement.detections();
        List<MeasuredStar> all = measurement.stars();
        DetectionGrid grid = new DetectionGrid(det, w, h,
                Math.max(1.0, Math.max(settings.isolationRadius(), settings.brighterRadius())));
        boolean[] keep = new boolean[all.size()];
        Parallel.forEach(all.size(), threads, (i, worker) -> {
            MeasuredStar s = all.get(i);
            keep[i] = s.snr() >= settings.minPeakSigma() && isolated(s, grid, settings)
                    && !saturated(input, s.x(), s.y(), settings.fitStamp() / 2, saturation);
        });
        List<MeasuredStar> chosen = new ArrayList<>();
        for (int i = 0; i < keep.length; i++) {
            if (keep[i]) {
                chosen.add(all.get(i));
            }
        }
        chosen.sort(Comparator.comparingDouble((MeasuredStar s) -> s.gaussian().flux()).reversed());
        int half = settings.fitStamp() / 2 + 1;
        List<StarSite> fwhmStars = new ArrayList<>();
        List<StarSite> ringStars = new ArrayList<>();
        for (MeasuredStar s : chosen) {
            if (inside(s.x(), s.y(), half, w, h)) {
                fwhmStars.add(new StarSite(s.x(), s.y()));
                if (ringStars.size() < settings.ringStars() && inside(s.x(), s.y(), settings.backgroundOuter() + 1, w, h)) {
                    ringStars.add(new StarSite(s.x(), s.y()));
                }
            }
        }
        if (fwhmStars.isEmpty()) {
            throw new IllegalArgumentException("no isolated star peaks above " + settings.minPeakSigma()
                    + " sky σ in the input: the star figures cannot be measured on this image");
        }
        double fwhm = measurement.gaussian().fwhm();
        double clear = Math.max(MIN_CLEAR_RADIUS, 3 * (Double.isFinite(fwhm) ? fwhm : 3));
        boolean[] sky = new boolean[px.length];
        java.util.Arrays.fill(sky, true);
        int r = (int) Math.ceil(clear);
        for (Detection d : det) {
            int cx = (int) Math.round(d.x());
            int cy = (int) Math.round(d.y());
            for (int y = Math.max(0, cy - r); y <= Math.min(h - 1, cy + r); y++) {
                for (int x = Math.max(0, cx - r); x <= Math.min(w - 1, cx + r); x++) {
                    if (Math.hypot(x - d.x(), y - d.y()) <= clear) {
                        sky[y * w + x] = false;
                    }
                }
            }
        }
        double sigma = measurement.backgroundNoise();
        float[] resid = new float[px.length];
        int chunks = (px.length + CHUNK - 1) / CHUNK;
        Parallel.forEach(chunks, threads, (c, worker) -> {
            for (int i = c * CHUNK, end = Math.min(px.length, i + CHUNK); i < end; i++) {
                resid[i] = Float.isFinite(px[i]) ? px[i] - bg[i] : 0f;
            }
        });
        // Star wings, filaments and faint galaxies hide below the per-pixel noise but not below the noise of
        // a smoothed image: smoothing by a Gaussian of FWHM 4 px cuts white noise about 6-fold (common
        // practice, no source), so a 0.5 σ cut on the smoothed residual sits ~3 of its own σ above zero.
        // The smoothed residual is only compared, row by row, as it is made (no full-frame buffer).
        int[] count = new int[h];
        GaussianSmoothing.smooth(resid, w, h, STRUCTURE_FWHM, threads, (y, row) -> {
            int k = 0;
            for (int x = 0, i = y * w; x < w; x++, i++) {
                if (sky[i] && (!(Math.abs(resid[i]) <= SKY_CLIP_SIGMA * sigma)
                        || Math.abs((float) row[x]) > STRUCTURE_SIGMA * sigma)) {
                    sky[i] = false;
                }
                k += sky[i] ? 1 : 0;
            }
            count[y] = k;
        });
        int n = 0;
        for (int k : count) {
            n += k;
        }
        if (n < 1000) {
            throw new IllegalArgumentException("only " + n + " star-free sky pixels in the input: the noise "
                    + "figures need at least 1000");
        }
        return new ObservedQuality(input, settings, map, bg, sky, fwhmStars, ringStars, threads);
    }

    private static void checkSize(Image input, StarMeasurement measurement) {
        if (measurement.width() != input.width() || measurement.height() != input.height()) {
            throw new IllegalArgumentException("the star measurement is for a " + measurement.width() + "x"
                    + measurement.height() + " image but the input is " + input.width() + "x" + input.height()
                    + ": measure this image");
        }
    }

    private static boolean saturated(Image img, double x, double y, int half, double level) {
        if (Double.isNaN(level)) {
            return false;
        }
        int cx = (int) Math.round(x);
        int cy = (int) Math.round(y);
        for (int j = Math.max(0, cy - half); j <= Math.min(img.height() - 1, cy + half); j++) {
            for (int i = Math.max(0, cx - half); i <= Math.min(img.width() - 1, cx + half); i++) {
                if (img.get(i, j) >= level) {
                    return true;
                }
            }
        }
        return false;
    }

    private static boolean inside(double x, double y, double border, int w, int h) {
        return x >= border && y >= border && x <= w - 1 - border && y <= h - 1 - border;
    }

    /**
     * Detections bucketed on a grid of cells at least as large as both isolation radii, so a star's tests look at
     * the 3×3 cells around it instead of every detection of the frame (3 000 detections × 1 000 stars at 24 MP).
     */
    private static final class DetectionGrid {
        private final List<Detection> det;
        private final double cell;
        private final int cols;
        private final int rows;
        private final int[][] buckets;

        DetectionGrid(List<Detection> det, int w, int h, double cell) {
            this.det = det;
            this.cell = cell;
            this.cols = Math.max(1, (int) Math.ceil(w / cell) + 1);
            this.rows = Math.max(1, (int) Math.ceil(h / cell) + 1);
            int[] count = new int[cols * rows];
            int[] where = new int[det.size()];
            for (int k = 0; k < det.size(); k++) {
                where[k] = bucket(det.get(k).x(), det.get(k).y());
                count[where[k]]++;
            }
            buckets = new int[cols * rows][];
            for (int b = 0; b < buckets.length; b++) {
                buckets[b] = new int[count[b]];
                count[b] = 0;
            }
            // In list order within each bucket.
            for (int k = 0; k < det.size(); k++) {
                buckets[where[k]][count[where[k]]++] = k;
            }
        }

        private int bucket(double x, double y) {
            int i = Math.min(cols - 1, Math.max(0, (int) Math.floor(x / cell)));
            int j = Math.min(rows - 1, Math.max(0, (int) Math.floor(y / cell)));
            return j * cols + i;
        }
    }

    /**
     * No detection within {@code isolationRadius} brighter than {@code isolationFraction} of the star's own
     * detection, and none brighter within {@code brighterRadius}. The star's own detection is the nearest one;
     * only detections closer than the larger radius can fail the test, so looking within it gives the same answer
     * as looking at all (ties in distance go to the first detection in list order, as in a full scan).
     */
    private static boolean isolated(MeasuredStar s, DetectionGrid g, QualitySettings q) {
        int ci = Math.min(g.cols - 1, Math.max(0, (int) Math.floor(s.x() / g.cell)));
        int cj = Math.min(g.rows - 1, Math.max(0, (int) Math.floor(s.y() / g.cell)));
        int selfIndex = -1;
        double best = Double.POSITIVE_INFINITY;
        for (int j = Math.max(0, cj - 1); j <= Math.min(g.rows - 1, cj + 1); j++) {
            for (int i = Math.max(0, ci - 1); i <= Math.min(g.cols - 1, ci + 1); i++) {
                for (int k : g.buckets[j * g.cols + i]) {
                    Detection d = g.det.get(k);
                    double dist = Math.hypot(d.x() - s.x(), d.y() - s.y());
                    if (dist < best || (dist == best && k < selfIndex)) {
                        best = dist;
                        selfIndex = k;
                    }
                }
            }
        }
        if (selfIndex < 0) {
            return true;
        }
        Detection self = g.det.get(selfIndex);
        for (int j = Math.max(0, cj - 1); j <= Math.min(g.rows - 1, cj + 1); j++) {
            for (int i = Math.max(0, ci - 1); i <= Math.min(g.cols - 1, ci + 1); i++) {
                for (int k : g.buckets[j * g.cols + i]) {
                    if (k == selfIndex) {
                        continue;
                    }
                    Detection d = g.det.get(k);
                    double dist = Math.hypot(d.x() - s.x(), d.y() - s.y());
                    if (dist < q.isolationRadius() && d.significance() > q.isolationFraction() * self.significance()) {
                        return false;
                    }
                    if (dist < q.brighterRadius() && d.significance() > self.significance()) {
                        return false;
                    }
                }
            }
        }
        return true;
    }

    private double skyNoise(Image img) {
        float[] px = img.plane(0);
        int chunks = (px.length + CHUNK - 1) / CHUNK;
        // Pass 1: how many samples each chunk gives, and whether they are all whole numbers.
        int[] start = new int[chunks + 1];
        boolean[] whole = new boolean[chunks];
        Parallel.forEach(chunks, threads, (c, worker) -> {
            int k = 0;
            boolean integral = true;
            for (int i = c * CHUNK, end = Math.min(px.length, i + CHUNK); i < end; i++) {
                if (skyMask[i] && Float.isFinite(px[i])) {
                    integral &= px[i] == Math.rint(px[i]);
                    k++;
                }
            }
            start[c + 1] = k;
            whole[c] = integral;
        });
        boolean integral = true;
        for (int c = 0; c < chunks; c++) {
            start[c + 1] += start[c];
            integral &= whole[c];
        }
        int n = start[chunks];
        // Pass 2: the samples in raster order, each chunk into its own slots.
        double[] v = new double[n];
        Parallel.forEach(chunks, threads, (c, worker) -> {
            int k = start[c];
            for (int i = c * CHUNK, end = Math.min(px.length, i + CHUNK); i < end; i++) {
                if (skyMask[i] && Float.isFinite(px[i])) {
                    v[k++] = px[i];
                }
            }
        });
        // Quantised data: dither the raw whole numbers (see Robust.madSigmaDequantised), then subtract the
        // background; the dither's 1/12 variance is removed in quadrature. The dither is one seeded sequence
        // in raster order, drawn on one thread, so it does not depend on the thread count.
        if (integral && n > 0) {
            java.util.SplittableRandom rnd = new java.util.SplittableRandom(DITHER_SEED);
            for (int i = 0; i < n; i++) {
                v[i] += rnd.nextDouble() - 0.5;
            }
        }
        Parallel.forEach(chunks, threads, (c, worker) -> {
            int k = start[c];
            for (int i = c * CHUNK, end = Math.min(px.length, i + CHUNK); i < end; i++) {
                if (skyMask[i] && Float.isFinite(px[i])) {
                    v[k++] -= background[i];
                }
            }
        });
        // Median and MAD of all n samples, exact, by histogram-located selection (no sort, no subsample).
        double s = Robust.madSigmaParallel(v, n, threads);
        return integral ? Math.sqrt(Math.max(0, s * s - 1.0 / 12)) : s;
    }

    /**
     * Scores one restoration of the input; the truth figures of the report are NaN.
     *
     * @param output the restored image, same size (input, not modified)
     * @return the report
     */
    public QualityReport evaluate(Image output) {
        if (output.width() != input.width() || output.height() != input.height()) {
            throw new IllegalArgumentException("output is " + output.width() + "x" + output.height()
                    + " but the input is " + input.width() + "x" + input.height() + ": score a same-size restoration");
        }
        // The input side (FWHMs, aperture fluxes, sky σ) was measured once in the constructor.
        double[] outFwhms = fitAll(output, fwhmStars, settings.fitStamp(), threads);
        double[] outFluxes = new double[fwhmStars.size()];
        Parallel.forEach(outFluxes.length, threads, (i, worker) ->
                outFluxes[i] = QualityMetrics.aperture(output, fwhmStars.get(i), apertureRadius, settings));
        QualityMetrics.FwhmComparison fwhm = QualityMetrics.fwhmRatio(inputFwhms, outFwhms);
        QualityMetrics.RingDepth ring = QualityMetrics.ringDepth(output, ringStars, inputSigma, settings);
        QualityMetrics.FluxComparison flux = QualityMetrics.fluxRatio(inputFluxes, outFluxes, apertureRadius);
        double noiseOut = skyNoise(output);
        QualityMetrics.TruthError none = new QualityMetrics.TruthError(Double.NaN, Double.NaN, Double.NaN, 0);
        return new QualityReport(fwhm, ring, none, none, Double.NaN, flux, inputSigma, noiseOut, noiseOut / inputSigma);
    }

    /**
     * A place to look at faint extended light: see {@link #faintRegion(BackgroundMap, double, int)}, on the
     * input's background map.
     *
     * @param sigmaAbove how many sky σ above the sky the wanted light is, ≥ 0
     * @param margin     keep the site at least this many pixels from the edges where the image allows, ≥ 0
     * @return the centre of the chosen mesh point
     */
    public StarSite faintRegion(double sigmaAbove, int margin) {
        return faintRegion(map, sigmaAbove, margin);
    }

    /**
     * The mesh point (cell corner on a {@code meshSize} grid) whose smooth background is closest to
     * {@code globalLevel + sigmaAbove·globalNoise}: faint extended light (nebulosity, a galaxy's outskirts,
     * a gradient) if the frame has any, else plain sky. Points are scanned row by row from
     * {@code min(margin, size/2)} to {@code size − margin} and the first closest wins; the frame centre when no
     * point fits. The mesh map already ignores stars (clipped cell medians, median-filtered), so a bright star
     * cannot be chosen. This is the preview's faint-region crop (common practice, no source).
     *
     * @param background the frame's background map (input, not modified)
     * @param sigmaAbove how many sky σ above the sky the wanted light is, ≥ 0
     * @param margin     keep the site at least this many pixels from the edges where the image allows, ≥ 0
     * @return the chosen point, whole pixels
     * @throws IllegalArgumentException if sigmaAbove or margin is negative
     */
    public static StarSite faintRegion(BackgroundMap background, double sigmaAbove, int margin) {
        if (!(sigmaAbove >= 0) || margin < 0) {
            throw new IllegalArgumentException("sigmaAbove is " + sigmaAbove + " and margin " + margin
                    + ": both must be ≥ 0 (e.g. 4 σ and half a crop)");
        }
        int w = background.width();
        int h = background.height();
        double target = background.globalLevel() + sigmaAbove * background.globalNoise();
        int step = Math.max(1, background.meshSize());
        int bx = w / 2;
        int by = h / 2;
        double closest = Double.POSITIVE_INFINITY;
        for (int y = Math.min(margin, h / 2); y < h - margin; y += step) {
            for (int x = Math.min(margin, w / 2); x < w - margin; x += step) {
                double miss = Math.abs(background.levelAt(x, y) - target);
                if (miss < closest) {
                    closest = miss;
                    bx = x;
                    by = y;
                }
            }
        }
        return new StarSite(bx, by);
    }

    /** @return the input's sky σ (background-subtracted, see the class comment) */
    public double inputSigma() {
        return inputSigma;
    }

    /** @return the median input FWHM of the selected stars, pixels */
    public double inputFwhm() {
        return inputFwhm;
    }

    /** @return the stars of the FWHM and flux metrics */
    public List<StarSite> fwhmStars() {
        return fwhmStars;
    }

    /** @return the stars of the ring metric */
    public List<StarSite> ringStars() {
        return ringStars;
    }
}
