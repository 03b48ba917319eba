package dev.nitid.quality;

import dev.nitid.image.Image;
import dev.nitid.synth.SyntheticField;
import dev.nitid.synth.TruthStar;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * Everything the five metrics need about one synthetic scene, computed once: the masks, the selected stars,
 * the input's sky noise, FWHM and error figure, and the smoothed truth. {@link #evaluate(Image)} then scores
 * any number of restorations of that scene. Immutable and thread-safe.
 *
 * <h2>Masks (from the noise-free model, σ = the detector's expected sky noise)</h2>
 * <ul>
 *   <li>star light = noiseless − sky − blurred extended light;</li>
 *   <li>sky: star light &lt; {@code starLightLimit} σ and blurred extended light &lt; {@code skyExtendedMax} σ;</li>
 *   <li>nebula: star light &lt; {@code starLightLimit} σ and blurred extended light ≥ {@code nebulaMin} σ.</li>
 * </ul>
 *
 * <h2>Star selection</h2>
 * Unsaturated catalogue stars whose noise-free peak exceeds {@code minPeakSigma} times the input's measured
 * sky σ, isolated (no other star brighter than {@code isolationFraction} of their flux within
 * {@code isolationRadius}, and no brighter star within {@code brighterRadius}), with the fit stamp inside the
 * image. The ring metric uses the {@code ringStars} brightest of them whose background annulus fits.
 */
public final class QualityReference {
    private final Image input;
    private final QualitySettings settings;
    private final boolean[] skyMask;
    private final TruthLadder ladder;
    private final List<StarSite> fwhmStars;
    private final List<StarSite> ringStars;
    private final double inputSigma;
    private final QualityMetrics.TruthError inputError;
    private final double inputFwhm;
    private final double apertureRadius;

    private QualityReference(Image input, QualitySettings settings, boolean[] skyMask, TruthLadder ladder,
                             List<StarSite> fwhmStars, List<StarSite> ringStars) {
        this.input = input;
        this.settings = settings;
        this.skyMask = skyMask;
        this.ladder = ladder;
        this.fwhmStars = List.copyOf(fwhmStars);
        this.ringStars = List.copyOf(ringStars);
        this.inputSigma = QualityMetrics.skyNoise(input, skyMask);
        this.inputError = QualityMetrics.truthError(input, ladder);
        this.inputFwhm = QualityMetrics.medianFwhm(input, this.fwhmStars, settings.fitStamp());
        this.apertureRadius = Math.max(settings.apertureFwhm() * inputFwhm, settings.apertureMin());
    }

    /**
     * Builds the reference of a synthetic field (see the class comment).
     *
     * @param field    the scene, its observed image being the input of every restorer (input, not modified)
     * @param settings the metric constants
     * @return the reference
     * @throws IllegalArgumentException if the scene has no sky, no nebula or no usable star
     */
    public static QualityReference of(SyntheticField field, QualitySettings settings) {
        Image obs = field.observed();
        int w = obs.width();
        int h = obs.height();
        double sigma = field.settings().detector().skySigma();
        double sky = field.settings().detector().sky();
        float[] nl = field.noiseless().plane(0);
        float[] ext = field.extendedLight().plane(0);
        boolean[] skyMask = new boolean[nl.length];
        boolean[] nebula = new boolean[nl.length];
        int nSky = 0;
        for (int i = 0; i < nl.length; i++) {
            double star = nl[i] - sky - ext[i];
            boolean clear = star < settings.starLightLimit() * sigma;
            skyMask[i] = clear && ext[i] < settings.skyExtendedMax() * sigma;
            nebula[i] = clear && ext[i] >= settings.nebulaMin() * sigma;
            nSky += skyMask[i] ? 1 : 0;
        }
        if (nSky < 1000) {
            throw new IllegalArgumentException("the scene has only " + nSky
                    + " star-free sky pixels: use fewer stars or less extended structure (need 1000)");
        }
        double measuredSigma = QualityMetrics.skyNoise(obs, skyMask);
        List<TruthStar> cat = field.catalogue();
        int half = settings.fitStamp() / 2;
        List<TruthStar> chosen = new ArrayList<>();
        for (TruthStar s : cat) {
            if (s.saturated() || !(s.peak() > settings.minPeakSigma() * measuredSigma)) {
                continue;
            }
            if (!inside(s, half + 1, w, h) || !isolated(s, cat, settings)) {
                continue;
            }
            chosen.add(s);
        }
        chosen.sort(Comparator.comparingDouble(TruthStar::flux).reversed());
        List<StarSite> fwhmStars = new ArrayList<>();
        List<StarSite> ringStars = new ArrayList<>();
        for (TruthStar s : chosen) {
            StarSite site = new StarSite(s.x(), s.y());
            fwhmStars.add(site);
            if (ringStars.size() < settings.ringStars() && inside(s, settings.backgroundOuter() + 1, w, h)) {
                ringStars.add(site);
            }
        }
        if (fwhmStars.isEmpty()) {
            throw new IllegalArgumentException("no isolated unsaturated star peaks above " + settings.minPeakSigma()
                    + " sky σ: add brighter stars to the scene");
        }
        TruthLadder ladder = TruthLadder.build(field.extendedTruth(), nebula, settings);
        return new QualityReference(obs, settings, skyMask, ladder, fwhmStars, ringStars);
    }

    private static boolean inside(TruthStar s, double border, int w, int h) {
        return s.x() >= border && s.y() >= border && s.x() <= w - 1 - border && s.y() <= h - 1 - border;
    }

    private static boolean isolated(TruthStar s, List<TruthStar> cat, QualitySettings q) {
        for (TruthStar o : cat) {
            if (o == s) {
                continue;
            }
            double d = Math.hypot(o.x() - s.x(), o.y() - s.y());
            if (d < q.isolationRadius() && o.flux() > q.isolationFraction() * s.flux()) {
                return false;
            }
            if (d < q.brighterRadius() && o.flux() > s.flux()) {
                return false;
            }
        }
        return true;
    }

    /**
     * Scores one restoration of the scene with the five metrics.
     *
     * @param output the restored image, same size as the input (input, not modified)
     * @return the report
     */
    public QualityReport evaluate(Image output) {
        if (output.width() != input.width() || output.height() != input.height()) {
            throw new IllegalArgumentException("output is " + output.width() + "x" + output.height()
                    + " but the input is " + input.width() + "x" + input.height() + ": score a same-size restoration");
        }
        QualityMetrics.FwhmComparison fwhm = QualityMetrics.fwhmRatio(input, output, fwhmStars, settings.fitStamp());
        QualityMetrics.RingDepth ring = QualityMetrics.ringDepth(output, ringStars, inputSigma, settings);
        QualityMetrics.TruthError err = QualityMetrics.truthError(output, ladder);
        QualityMetrics.FluxComparison flux = QualityMetrics.fluxRatio(input, output, fwhmStars, apertureRadius, settings);
        double noiseOut = QualityMetrics.skyNoise(output, skyMask);
        return new QualityReport(fwhm, ring, inputError, err, err.figure() / inputError.figure(), flux,
                inputSigma, noiseOut, noiseOut / inputSigma);
    }

    /** @return the input's sky σ (1.4826 MAD over the sky mask) */
    public double inputSigma() {
        return inputSigma;
    }

    /** @return the median input FWHM of the selected stars */
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

    /** @return the input's error-vs-truth figure */
    public QualityMetrics.TruthError inputError() {
        return inputError;
    }

    /** @return the sky mask (a copy) */
    public boolean[] skyMask() {
        return skyMask.clone();
    }

    /** @return nebula pixels compared with the truth */
    public int nebulaPixels() {
        return ladder.pixelCount();
    }

    /** @return the radius of the flux metric's aperture, px: max(apertureFwhm · input FWHM, apertureMin) */
    public double apertureRadius() {
        return apertureRadius;
    }

    /**
     * The flux ratio a perfect restoration scores: the observed aperture misses the PSF's light beyond the
     * radius, which a perfect restoration puts back into the star, so the ideal is {@code 1 / EE(r)} with
     * {@code EE(r) = Σ psf} over the pixels within {@code r} of the PSF centre (⌊w/2⌋, ⌊h/2⌋), for a unit-sum
     * PSF (encircled energy, Born &amp; Wolf, Principles of Optics, §8.5.2, section from memory; definition of the metric).
     *
     * @param psf    the PSF (input, not modified), normalised here to unit sum
     * @param radius aperture radius, px
     * @return {@code 1 / EE(radius)}
     */
    public static double idealFluxRatio(Image psf, double radius) {
        if (!(radius > 0)) {
            throw new IllegalArgumentException("aperture radius is " + radius + ": use a value > 0");
        }
        int cx = psf.width() / 2;
        int cy = psf.height() / 2;
        double total = 0;
        double inside = 0;
        for (int y = 0; y < psf.height(); y++) {
            for (int x = 0; x < psf.width(); x++) {
                double v = psf.get(x, y);
                total += v;
                if (Math.hypot(x - cx, y - cy) <= radius) {
                    inside += v;
                }
            }
        }
        if (!(inside > 0)) {
            throw new IllegalArgumentException("the PSF holds no light within " + radius + " px of its centre");
        }
        return total / inside;
    }
}
