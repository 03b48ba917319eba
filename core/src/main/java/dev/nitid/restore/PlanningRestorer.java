package dev.nitid.restore;

import dev.nitid.image.Image;
import dev.nitid.image.ImageStats;
import dev.nitid.restore.internal.FrequencyFilter;
import dev.nitid.restore.internal.RlPlan;
import dev.nitid.restore.internal.SkyNoise;
import dev.nitid.restore.internal.StarFloor;
import java.util.ArrayList;
import java.util.List;
import java.util.function.BooleanSupplier;

/** The restorer behind {@link Restorers}: plans per plane (a PSF per plane), then runs. Stateless between calls. */
final class PlanningRestorer implements Restorer {
    /**
     * The χ² stopping rule counts the pixels whose model lies this many sky σ above the sky: the pixels
     * that carry the scene's light (project choice, measured on the quality harness and on a sparse
     * 24-megapixel field, where counting every pixel stopped after 4 iterations with the stars still
     * blurred).
     */
    static final double SIGNAL_SIGMA = 3;

    /**
     * ε of the TV term, in sky σ: |∇o| is taken as √(|∇o|² + ε²). With ε = 1e-3 σ (before) the
     * normalised gradient of the sky noise flipped between ±1 from one iteration to the next, so the sky
     * never converged (a constant 0.8 % change per iteration) and the extrapolation of
     * {@link Method#ACCELERATED_TV_RL} found no correlation to use. 0.3 σ smooths the term at the noise
     * level and keeps it edge-preserving above; on the quality harness it lowered the error and the noise
     * of TV-RL on the seeing scene and left the diffraction scene within 1 % (project choice, measured:
     * 0.001, 0.1, 0.3 and 1 σ, docs/restore.md).
     */
    static final double TV_EPSILON_SIGMA = 0.3;

    private final RestoreSettings settings;

    PlanningRestorer(RestoreSettings settings) {
        this.settings = settings;
    }

    @Override
    public RestoreSettings settings() {
        return settings;
    }

    @Override
    public RestorationResult restore(Image observed, Image psf, ProgressListener listener, BooleanSupplier cancelled) {
        checkInputs(observed, psf);
        if (listener == null) {
            listener = ProgressListener.NONE;
        }
        if (cancelled == null) {
            cancelled = () -> false;
        }
        int w = observed.width();
        int h = observed.height();
        Image out = Image.create(w, h, observed.planes());
        List<PlaneReport> reports = new ArrayList<>();
        RlPlan plan = null;
        FrequencyFilter filter = null;
        try {
            for (int p = 0; p < observed.planes(); p++) {
                long t0 = System.nanoTime();
                boolean newPsf = p == 0 || psf.planes() > 1;
                Image k = newPsf ? normalised(psf, psf.planes() > 1 ? p : 0) : null;
                float[] d = observed.plane(p);
                boolean[] valid = validity(d);
                long masked = 0;
                for (int i = 0; i < d.length; i++) {
                    if (!Float.isFinite(d[i]) || (valid != null && !valid[i])) {
                        masked++;
                    }
                }
                SkyNoise.Estimate est = SkyNoise.of(d, valid, w, h);
                double sky = Double.isNaN(est.sky()) ? 0 : est.sky();
                double sigma = est.sigma() > 0 ? est.sigma() : fallbackSigma(observed.stats(p));
                NoiseModel noise = settings.noise().isEstimated() ? estimate(sky, sigma) : settings.noise();
                Method m = settings.method();
                if (m.iterative()) {
                    if (newPsf) {
                        if (plan != null) {
                            plan.close();
                        }
                        plan = new RlPlan(w, h, k, settings.edges(), m, settings.threads());
                    }
                    StarProtection prot = settings.protection();
                    StarFloor.Floor floor = null;
                    if (prot.guard() != StarGuard.NONE) {
                        Image kp = k != null ? k : normalised(psf, 0);
                        double radius = Math.max(StarFloor.MIN_RADIUS,
                                prot.radiusFactor() * StarFloor.psfRadius(kp.plane(0), kp.width(), kp.height()));
                        int padX = plan.padX();
                        int padY = plan.padY();
                        floor = StarFloor.build(d, valid, w, h, sky, sigma, prot.detectSigma(), radius,
                                prot.marginSigma(), plan.gridWidth(), padX, padY, prot.guard() == StarGuard.RING_FLOOR);
                    }
                    double tiny = sigma > 0 ? 1e-3 * sigma : 1e-6;
                    // The discrepancy of the χ² rule is taken where the restoration has work to do: on the
                    // discs of the protected stars, else where the model lies SIGNAL_SIGMA above the sky. On a
                    // sparse field or under a smooth nebula, the sky alone would satisfy it at once.
                    boolean[] discs = starDiscs(floor, plan.gridWidth() * plan.gridHeight());
                    RlPlan.Params params = new RlPlan.Params(m, noise.offset(), noise.gain(), settings.tvWeight(),
                            sigma > 0 ? TV_EPSILON_SIGMA * sigma : tiny, settings.dampingSigma(), sky + SIGNAL_SIGMA * sigma,
                            discs, m == Method.ACCELERATED_TV_RL ? starCores(floor) : null);
                    long setup = System.nanoTime() - t0;
                    RlPlan.Outcome oc = plan.run(d, valid, floor, true, out.plane(p), params,
                            RlPlan.Conventions.standard(tiny), settings.stopping(), p, listener, cancelled);
                    reports.add(new PlaneReport(oc.iterations(), oc.reason(), oc.history(), noise, masked,
                            floor == null ? 0 : floor.stars(), setup, oc.nanos()));
                    if (oc.reason() == StopReason.CANCELLED) {
                        // the remaining planes keep the observed data so the output is still an image of the scene
                        for (int q = p + 1; q < observed.planes(); q++) {
                            System.arraycopy(observed.plane(q), 0, out.plane(q), 0, d.length);
                        }
                        break;
                    }
                } else {
                    if (newPsf) {
                        if (filter != null) {
                            filter.close();
                        }
                        filter = new FrequencyFilter(w, h, k, settings.edges(), settings.threads());
                    }
                    float[] filled = d.clone();
                    for (int i = 0; i < filled.length; i++) {
                        if (!Float.isFinite(filled[i]) || (valid != null && !valid[i])) {
                            filled[i] = (float) sky; // a flat fill: the frequency filters have no weights
                        }
                    }
                    long setup = System.nanoTime() - t0;
                    long t1 = System.nanoTime();
                    FrequencyFilter.Kind kind = m == Method.TIKHONOV ? FrequencyFilter.Kind.TIKHONOV : FrequencyFilter.Kind.WIENER;
                    filter.apply(filled, out.plane(p), kind, settings.regularisation(), sigma);
                    reports.add(new PlaneReport(0, StopReason.SINGLE_PASS, List.of(), noise, masked, 0, setup,
                            System.nanoTime() - t1));
                }
            }
        } finally {
            if (plan != null) {
                plan.close();
            }
            if (filter != null) {
                filter.close();
            }
        }
        return new RestorationResult(out, reports);
    }

    /** The estimated noise model; see {@link NoiseModel}. */
    /** The grid pixels of the protected stars' discs (rings and cores), or null without enough of them. */
    static boolean[] starDiscs(StarFloor.Floor floor, int gridPixels) {
        if (floor == null || floor.starGroups() == null || floor.stars() == 0) {
            return null;
        }
        boolean[] mask = new boolean[gridPixels];
        int n = 0;
        for (int i : floor.indices()) {
            n += mask[i] ? 0 : 1;
            mask[i] = true;
        }
        for (int i : floor.coreIndices()) {
            n += mask[i] ? 0 : 1;
            mask[i] = true;
        }
        return n >= RlPlan.MIN_SIGNAL_PIXELS ? mask : null;
    }

    /**
     * The grid indices of the protected stars' cores (r &lt; 1.5 px), ascending and distinct, where the
     * extrapolation's α is measured; null without protected stars (α then uses every pixel).
     */
    static int[] starCores(StarFloor.Floor floor) {
        if (floor == null || floor.starGroups() == null || floor.stars() == 0) {
            return null;
        }
        int[] idx = floor.coreIndices().clone();
        java.util.Arrays.sort(idx);
        int k = 0;
        for (int i = 0; i < idx.length; i++) {
            if (k == 0 || idx[i] != idx[k - 1]) {
                idx[k++] = idx[i];
            }
        }
        return k > 0 ? java.util.Arrays.copyOf(idx, k) : null;
    }

    static NoiseModel estimate(double sky, double sigma) {
        if (!(sigma > 0)) {
            return NoiseModel.poissonCounts();
        }
        double pedestal = Math.max(0, NoiseModel.MIN_SKY_SIGMAS * sigma - sky);
        double gain = (sky + pedestal) / (sigma * sigma);
        return new NoiseModel(gain, 0, pedestal);
    }

    private static double fallbackSigma(ImageStats st) {
        // noise-free data (MAD = 0): a tiny σ relative to the data range keeps the model defined
        double range = Double.isNaN(st.max()) ? 1 : Math.max(Math.abs(st.max()), Math.abs(st.min()));
        return range > 0 ? 1e-6 * range : 1e-6;
    }

    private boolean[] validity(float[] d) {
        double sat = settings.saturation();
        if (sat == Double.POSITIVE_INFINITY) {
            return null;
        }
        boolean[] v = new boolean[d.length];
        for (int i = 0; i < d.length; i++) {
            v[i] = Float.isFinite(d[i]) && d[i] < sat;
        }
        return v;
    }

    private static Image normalised(Image psf, int p) {
        float[] k = psf.plane(p);
        double sum = 0;
        for (float v : k) {
            sum += v;
        }
        Image n = Image.create(psf.width(), psf.height());
        float[] dst = n.plane(0);
        for (int i = 0; i < k.length; i++) {
            dst[i] = (float) (k[i] / sum);
        }
        return n;
    }

    private static void checkInputs(Image observed, Image psf) {
        if (observed == null || psf == null) {
            throw new IllegalArgumentException("observed image and PSF must both be given");
        }
        if (psf.planes() != 1 && psf.planes() != observed.planes()) {
            throw new IllegalArgumentException("PSF has " + psf.planes() + " planes but the image has "
                    + observed.planes() + ": give one PSF for all planes or one per plane");
        }
        if (psf.width() > observed.width() || psf.height() > observed.height()) {
            throw new IllegalArgumentException("PSF is " + psf.width() + "x" + psf.height() + " but the image is "
                    + observed.width() + "x" + observed.height() + ": crop the PSF or pad the image");
        }
        for (int p = 0; p < psf.planes(); p++) {
            float[] k = psf.plane(p);
            double sum = 0;
            for (int i = 0; i < k.length; i++) {
                if (!Float.isFinite(k[i])) {
                    throw new IllegalArgumentException("PSF plane " + p + " pixel (" + (i % psf.width()) + ", "
                            + (i / psf.width()) + ") is " + k[i] + ": a PSF must be finite everywhere");
                }
                if (k[i] < 0) {
                    throw new IllegalArgumentException("PSF plane " + p + " pixel (" + (i % psf.width()) + ", "
                            + (i / psf.width()) + ") is negative (" + k[i]
                            + "): clip the PSF at 0 (Richardson-Lucy needs a non-negative PSF)");
                }
                sum += k[i];
            }
            if (!(sum > 0)) {
                throw new IllegalArgumentException("PSF plane " + p + " sums to " + sum
                        + ": a PSF must have a positive total");
            }
        }
    }
}
