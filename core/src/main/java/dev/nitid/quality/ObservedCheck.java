package dev.nitid.quality;

import dev.nitid.image.Image;
import dev.nitid.image.ImageStats;
import dev.nitid.stars.BackgroundMap;
import dev.nitid.stars.BackgroundSettings;
import dev.nitid.stars.Detection;
import dev.nitid.stars.MeasuredStar;
import dev.nitid.stars.StarMeasurement;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.List;

/**
 * The quality metrics on a real image, where no truth is known: what {@code nitid sharpen} prints after a
 * restoration (star FWHM before and after, worst dark ring, sky noise before and after, star flux kept).
 * The definitions are those of {@link QualityMetrics}; only the choice of stars and of sky pixels differs
 * from {@link QualityReference}, because it must come from the image itself:
 * <ul>
 *   <li><b>stars</b>: the stars {@link dev.nitid.stars.StarMeasurer} accepted (it has already rejected
 *   saturated, blended, extended, too-sharp and edge objects) whose fitted Gaussian peak exceeds
 *   {@code minPeakSigma} times the background σ and whose stamp lies inside the image; the ring metric
 *   uses the {@code ringStars} brightest whose background annulus lies inside;</li>
 *   <li><b>sky</b>: pixels farther than {@code max(3·FWHM, 8)} px from every detection (accepted or not)
 *   and beyond the radius where a broad-winged Moffat (β 2.5) of the measured FWHM and the detection's
 *   peak falls below 0.5σ,
 *   below the local background + 3σ, where the local background (the mesh map of
 *   {@link BackgroundMap}) is within 0.5σ of the global sky level: this keeps nebulosity and galaxies
 *   out of the noise estimate.</li>
 * </ul>
 * Built once per input plane; {@link #evaluate(Image)} scores any number of outputs. Immutable.
 */
public final class ObservedCheck {
    /** Sky pixels must lie below background + this many σ (common practice, no source). */
    static final double SKY_CLIP_SIGMA = 3;
    /**
     * Only where the smooth background map lies within this many σ of the global sky level: faint
     * nebulosity raises the map and would inflate the noise estimate (common practice, no source).
     */
    static final double FLAT_SKY_SIGMA = 0.5;
    /** Rounds of re-estimating the sky level and σ on the sky mask. */
    static final int SKY_ROUNDS = 3;
    /** Fewest sky pixels for a re-estimate. */
    static final int MIN_SKY_PIXELS = 100;
    /** Moffat β assumed for star wings when masking them out of the sky (broad wings: common practice, no source). */
    static final double WING_BETA = 2.5;
    /** Star wings are masked out to where they fall below this many sky σ. */
    static final double WING_SIGMA = 0.5;
    /** Distance from any detection, in FWHMs, beyond which a pixel may count as sky. */
    static final double SKY_DISTANCE_FWHM = 3;
    /** ... but at least this many pixels. */
    static final double SKY_DISTANCE_MIN = 8;

    private final Image input;
    private final QualitySettings settings;
    private final boolean[] skyMask;
    private final List<StarSite> fwhmStars;
    private final List<StarSite> ringStars;
    private final double inputSigma;
    private final double apertureRadius;

    private ObservedCheck(Image input, QualitySettings settings, boolean[] skyMask, List<StarSite> fwhmStars,
                          List<StarSite> ringStars, double inputSigma, double apertureRadius) {
        this.input = input;
        this.settings = settings;
        this.skyMask = skyMask;
        this.fwhmStars = List.copyOf(fwhmStars);
        this.ringStars = List.copyOf(ringStars);
        this.inputSigma = inputSigma;
        this.apertureRadius = apertureRadius;
    }

    /**
     * Chooses the stars and the sky of one plane.
     *
     * @param input    the plane before restoration, single-plane (input, not modified)
     * @param stars    the star measurement of that plane
     * @param settings the metric constants
     * @return the check, or one with no stars if none qualifies (its figures are then NaN)
     */
    public static ObservedCheck prepare(Image input, StarMeasurement stars, QualitySettings settings) {
        int w = input.width();
        int h = input.height();
        float[] px = input.plane(0);
        double fwhm = stars.best() != null && stars.best().count() > 0 ? stars.best().fwhm() : Double.NaN;
        double keepOut = Math.max(SKY_DISTANCE_MIN, Double.isFinite(fwhm) ? SKY_DISTANCE_FWHM * fwhm : 0);
        BackgroundMap map = BackgroundMap.estimate(px, w, h, BackgroundSettings.defaults(), 1);
        boolean[] nearStars = starNeighbourhood(px, w, h, stars, map, fwhm, keepOut);
        // The mesh statistics include faint nebulosity: refine the sky level and sigma on the sky itself,
        // over a few rounds of clipping (common practice, no source).
        double level = map.globalLevel();
        double sigma = map.globalNoise();
        boolean[] sky = new boolean[px.length];
        float[] sample = new float[px.length];
        for (int round = 0; round < SKY_ROUNDS; round++) {
            int n = 0;
            for (int y = 0; y < h; y++) {
                for (int x = 0; x < w; x++) {
                    int i = y * w + x;
                    double local = map.levelAt(x, y);
                    sky[i] = !nearStars[i] && Float.isFinite(px[i]) && px[i] < local + SKY_CLIP_SIGMA * sigma
                            && local < level + FLAT_SKY_SIGMA * sigma;
                    if (sky[i]) {
                        sample[n++] = px[i];
                    }
                }
            }
            if (n < MIN_SKY_PIXELS) {
                break;
            }
            ImageStats st = ImageStats.of(Arrays.copyOf(sample, n));
            level = st.median();
            sigma = st.madSigma();
        }
        double inputSigma = QualityMetrics.skyNoise(input, sky);
        int half = settings.fitStamp() / 2;
        List<MeasuredStar> chosen = new ArrayList<>();
        for (MeasuredStar s : stars.stars()) {
            if (s.gaussian() != null && s.gaussian().amplitude() > settings.minPeakSigma() * inputSigma
                    && inside(s, half + 1, w, h)) {
                chosen.add(s);
            }
        }
        chosen.sort(Comparator.comparingDouble((MeasuredStar s) -> s.gaussian().amplitude()).reversed());
        List<StarSite> fwhmStars = new ArrayList<>();
        List<StarSite> ringStars = new ArrayList<>();
        for (MeasuredStar s : chosen) {
            fwhmStars.add(new StarSite(s.x(), s.y()));
            if (ringStars.size() < settings.ringStars() && inside(s, settings.backgroundOuter() + 1, w, h)) {
                ringStars.add(new StarSite(s.x(), s.y()));
            }
        }
        double inFwhm = fwhmStars.isEmpty() ? Double.NaN
                : QualityMetrics.medianFwhm(input, fwhmStars, settings.fitStamp());
        double radius = Math.max(settings.apertureFwhm() * (Double.isFinite(inFwhm) ? inFwhm : 0),
                settings.apertureMin());
        return new ObservedCheck(input, settings, sky, fwhmStars, ringStars, inputSigma, radius);
    }

    /**
     * Pixels near any detection: within {@code keepOut}, and out to where a Moffat of the measured FWHM and
     * broad wings (β 2.5) with the detection's peak falls below half the sky σ, so that bright stars keep
     * their wings out of the sky sample.
     */
    private static boolean[] starNeighbourhood(float[] px, int w, int h, StarMeasurement stars, BackgroundMap map,
                                               double fwhm, double keepOut) {
        double sigma = map.globalNoise();
        boolean[] near = new boolean[px.length];
        double alpha = (Double.isFinite(fwhm) ? fwhm : 3) / (2 * Math.sqrt(Math.pow(2, 1 / WING_BETA) - 1));
        for (Detection d : stars.detections()) {
            int cx = (int) Math.round(d.x());
            int cy = (int) Math.round(d.y());
            if (cx < 0 || cy < 0 || cx >= w || cy >= h) {
                continue;
            }
            double peak = Math.max(0, px[cy * w + cx] - map.levelAt(cx, cy));
            double wing = alpha * Math.sqrt(Math.max(0, Math.pow(peak / (WING_SIGMA * sigma), 1 / WING_BETA) - 1));
            double radius = Math.max(keepOut, Double.isFinite(wing) ? wing : keepOut);
            int r = (int) Math.ceil(radius);
            for (int y = Math.max(0, cy - r); y <= Math.min(h - 1, cy + r); y++) {
                for (int x = Math.max(0, cx - r); x <= Math.min(w - 1, cx + r); x++) {
                    if ((x - d.x()) * (x - d.x()) + (y - d.y()) * (y - d.y()) <= radius * radius) {
                        near[y * w + x] = true;
                    }
                }
            }
        }
        return near;
    }

    private static boolean inside(MeasuredStar s, double border, int w, int h) {
        return s.x() >= border && s.y() >= border && s.x() <= w - 1 - border && s.y() <= h - 1 - border;
    }

    /**
     * Scores one restoration of the plane.
     *
     * @param output the restored plane, same size (input, not modified)
     * @return the figures; NaN where no star or sky qualified
     */
    public Figures evaluate(Image output) {
        if (output.width() != input.width() || output.height() != input.height()) {
            throw new IllegalArgumentException("output is " + output.width() + "x" + output.height()
                    + " but the input is " + input.width() + "x" + input.height() + ": check a same-size restoration");
        }
        double noiseOut = QualityMetrics.skyNoise(output, skyMask);
        if (fwhmStars.isEmpty()) {
            return new Figures(Double.NaN, Double.NaN, Double.NaN, 0, Double.NaN, 0, inputSigma, noiseOut,
                    noiseOut / inputSigma, Double.NaN, 0);
        }
        QualityMetrics.FwhmComparison f = QualityMetrics.fwhmRatio(input, output, fwhmStars, settings.fitStamp());
        QualityMetrics.RingDepth ring = ringStars.isEmpty() ? null
                : QualityMetrics.ringDepth(output, ringStars, inputSigma, settings);
        QualityMetrics.FluxComparison flux = QualityMetrics.fluxRatio(input, output, fwhmStars, apertureRadius,
                settings);
        return new Figures(f.inputFwhm(), f.outputFwhm(), f.ratio(), f.stars(),
                ring == null ? Double.NaN : ring.depth(), ring == null ? 0 : ring.stars(),
                inputSigma, noiseOut, noiseOut / inputSigma, flux.ratio(), flux.stars());
    }

    /** @return the number of stars the FWHM and flux figures use */
    public int starCount() {
        return fwhmStars.size();
    }

    /** @return the crop centres of the brightest selected stars (at most n) */
    public List<StarSite> brightestStars(int n) {
        return fwhmStars.subList(0, Math.min(n, fwhmStars.size()));
    }

    /**
     * The figures of one restoration.
     *
     * @param fwhmIn       median FWHM of the selected stars in the input [px]
     * @param fwhmOut      the same in the output [px]
     * @param fwhmRatio    median of the per-star ratios output/input
     * @param fwhmStars    stars behind the FWHM figures
     * @param ringDepth    worst dark ring, in input sky σ (0 = none)
     * @param ringStars    stars behind the ring figure
     * @param noiseIn      input sky σ
     * @param noiseOut     output sky σ
     * @param noiseRatio   noiseOut / noiseIn
     * @param fluxRatio    median aperture flux ratio output/input
     * @param fluxStars    stars behind the flux figure
     */
    public record Figures(double fwhmIn, double fwhmOut, double fwhmRatio, int fwhmStars, double ringDepth,
                          int ringStars, double noiseIn, double noiseOut, double noiseRatio, double fluxRatio,
                          int fluxStars) {
    }
}
