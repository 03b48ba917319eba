package dev.nitid.restore.internal;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.image.Image;
import dev.nitid.restore.EdgeHandling;
import dev.nitid.restore.IterationRecord;
import dev.nitid.restore.Method;
import dev.nitid.restore.ProgressListener;
import dev.nitid.restore.StopReason;
import dev.nitid.restore.StopRule;
import dev.nitid.restore.Stopping;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.function.BooleanSupplier;

/**
 * The Richardson–Lucy family on one image size with one PSF: the convolver (with the PSF's transfer
 * function) and every scratch buffer are made in the constructor; {@link #run} allocates no image-sized
 * array. Not thread-safe: one plan per thread of work. Close it to stop the convolver's threads.
 *
 * <p>The iteration, on a grid that is the frame itself or, for {@link EdgeHandling#EXTENDED_DOMAIN}, the
 * frame padded by the PSF's half-size:
 * <pre>  o ← (o / s) · Kᵀ[ w (d + c) / (K o + c + ε) ],   s = Kᵀ w</pre>
 * with {@code w} = 0 on masked pixels and outside the frame, 1 elsewhere; {@code c} the noise offset;
 * {@code ε} the denominator guard. Pixels where {@code s} is below {@link #MIN_SENSITIVITY} are left as
 * they are (no data constrain them).
 */
public final class RlPlan implements AutoCloseable {
    /** Below this {@code s = Kᵀw} a pixel is unconstrained and keeps its value (our choice: 1e-6 of a unit PSF). */
    public static final float MIN_SENSITIVITY = 1e-6f;
    /** Exponent N of the damped form (White 1994 uses 10; from memory). */
    public static final int DAMPING_POWER = 10;
    /** The TV-RL denominator is kept at least this fraction of {@code s} (Dey et al. require it positive). */
    public static final float TV_MIN_DENOMINATOR = 0.5f;

    /**
     * Conventions of the iteration that tests may change to reproduce other libraries.
     *
     * @param startValue constant start estimate, or NaN for the mean of the valid data (floored at
     *                   {@code startFloor})
     * @param startFloor lowest start value, &gt; 0
     * @param guard      ε added to the denominator {@code K o + c}, ≥ 0
     * @param normalise  divide by {@code s = Kᵀ w} (the general, boundary-correct form); false reproduces the
     *                   plain form {@code o ← o · Kᵀ[...]}
     * @param startImage a start estimate on the grid, or null (input, not modified); overrides startValue
     */
    public record Conventions(double startValue, double startFloor, double guard, boolean normalise,
                              float[] startImage) {
        /** @return our defaults: flat start at the data mean, no guard beyond the noise offset, normalised */
        public static Conventions standard(double startFloor) {
            return new Conventions(Double.NaN, startFloor, 0, true, null);
        }
    }

    /**
     * Parameters of the method run by the plan.
     *
     * @param method       one of the iterative methods
     * @param offset       noise offset {@code c} in data units
     * @param gain         electrons per data unit (scales the likelihood, χ² and the damping)
     * @param tvWeight     λ of TV-RL
     * @param tvEpsilon    added in quadrature to |∇o| in TV-RL, data units, &gt; 0
     * @param dampingSigma T of damped RL
     * @param signalLevel  the χ² of the stopping rule counts only pixels whose model {@code K o} exceeds this
     *                     level (data units), i.e. pixels that carry light from the scene, so that a large
     *                     flat sky cannot satisfy the rule while the stars are still blurred; NaN counts
     *                     every valid pixel. When fewer than {@link #MIN_SIGNAL_PIXELS} pixels qualify,
     *                     every valid pixel counts.
     * @param signalMask   grid pixels the χ² counts instead of the signal level (e.g. the discs around the
     *                     protected stars), or null (input, not modified)
     * @param alphaPixels  grid indices over which the accelerated methods take their α, distinct, or null
     *                     for every pixel (input, not modified); with a list, the change vectors are kept
     *                     for these pixels only instead of a whole grid
     */
    public record Params(Method method, double offset, double gain, double tvWeight, double tvEpsilon,
                         double dampingSigma, double signalLevel, boolean[] signalMask, int[] alphaPixels) {
        /** Parameters whose χ² counts every valid pixel. */
        public Params(Method method, double offset, double gain, double tvWeight, double tvEpsilon,
                      double dampingSigma) {
            this(method, offset, gain, tvWeight, tvEpsilon, dampingSigma, Double.NaN, null, null);
        }
    }

    /** Fewest pixels above the signal level for the χ² to be taken over them alone. */
    public static final long MIN_SIGNAL_PIXELS = 100;


    private final int width;
    private final int height;
    private final int gw;
    private final int gh;
    private final int padX;
    private final int padY;
    private final Convolver conv;
    /** The estimate on the grid: own storage on an extended grid, else the caller's output array. */
    private float[] o;
    private final float[] ownO;
    private final float[] tmp;
    private float[] xPrev;
    private final float[] accBuf;
    /** g_{k−1} on the whole grid, for accelerated runs without an α pixel list; allocated on first use and kept. */
    private float[] gBuf;
    /** Observed data on the grid, NaN where the weight is 0; null when the observed plane is used directly. */
    private final float[] dataGrid;
    private final float[] invS;
    /** s for frames with masked pixels, allocated on the first such run and kept. */
    private float[] invMasked;
    private final Method method;
    private final int threads;
    /** Zero outside the frame: s = Kᵀw is below 1 near the edges even without masked pixels. */
    private final boolean zeroEdges;
    /** The element-wise passes and their threads, held for the plan's life. */
    private final BlockPasses passes;
    /** Per row block, three grid rows for the normalised gradients of the TV term; null without it. */
    private final float[][][] tvRows;

    /**
     * Plans a restoration.
     *
     * @param width   frame columns
     * @param height  frame rows
     * @param psf     unit-sum PSF (input, copied)
     * @param edges   edge handling
     * @param method  iterative method (decides which buffers exist)
     * @param threads FFT worker threads
     */
    public RlPlan(int width, int height, Image psf, EdgeHandling edges, Method method, int threads) {
        this.width = width;
        this.height = height;
        this.method = method;
        this.threads = threads;
        boolean ext = edges == EdgeHandling.EXTENDED_DOMAIN;
        this.padX = ext ? psf.width() / 2 : 0;
        this.padY = ext ? psf.height() / 2 : 0;
        this.gw = width + (ext ? psf.width() - 1 : 0);
        this.gh = height + (ext ? psf.height() - 1 : 0);
        this.zeroEdges = edges == EdgeHandling.ZERO;
        Boundary b = switch (edges) {
            case ZERO, EXTENDED_DOMAIN -> Boundary.ZERO;
            case REFLECT -> Boundary.REFLECT;
            case PERIODIC -> Boundary.PERIODIC;
        };
        this.conv = Convolver.create(gw, gh, psf, new ConvolutionSettings(b, threads));
        int n = gw * gh;
        // buffers: tmp always; the estimate lives in the caller's output unless the grid is larger; the
        // accelerated form adds x_{k−1} and g_{k−1} (its prediction y is recomputed on the fly)
        this.ownO = ext ? new float[n] : null;
        this.tmp = new float[n];
        boolean acc = accelerated(method);
        this.accBuf = acc ? new float[n] : null;
        this.dataGrid = ext ? new float[n] : null;
        this.invS = ext ? new float[n] : null;
        this.passes = new BlockPasses(gw, gh, threads);
        this.tvRows = regularised(method) ? new float[passes.blocks()][3][gw] : null;
    }

    /** Stops the convolver's threads; the plan must not be used afterwards. */
    @Override
    public void close() {
        conv.close();
        passes.close();
    }

    /** @return grid columns (frame plus padding) */
    public int gridWidth() {
        return gw;
    }

    /** @return column of frame pixel x = 0 inside the grid */
    public int padX() {
        return padX;
    }

    /** @return row of frame pixel y = 0 inside the grid */
    public int padY() {
        return padY;
    }

    /** @return grid rows */
    public int gridHeight() {
        return gh;
    }

    /**
     * Outcome of one run.
     *
     * @param iterations iterations completed
     * @param reason     why it stopped
     * @param history    per-iteration records
     * @param nanos      time in the iterations
     */
    public record Outcome(int iterations, StopReason reason, List<IterationRecord> history, long nanos) {
    }

    /**
     * Runs the iterations.
     *
     * @param observed  frame data, width × height (input, not modified); NaN/±∞ masked
     * @param valid     per-pixel weight of the frame, or null when every finite pixel counts (input, not modified)
     * @param floor     the star floor, or null (input, not modified)
     * @param takeBack  after the last iteration, take the light the floor added to the rings back from the cores
     * @param out       restored frame, width × height (output, modified)
     * @param p         method parameters
     * @param conv0     iteration conventions
     * @param stop      stopping rule
     * @param plane     plane index for the records
     * @param listener  progress listener
     * @param cancelled cancellation poll
     * @return the outcome
     */
    public Outcome run(float[] observed, boolean[] valid, StarFloor.Floor floor, boolean takeBack, float[] out,
                       Params p, Conventions conv0, Stopping stop, int plane, ProgressListener listener,
                       BooleanSupplier cancelled) {
        final int n = gw * gh;
        if (out.length != width * height || observed.length != width * height) {
            throw new IllegalArgumentException("observed has " + observed.length + " and out " + out.length
                    + " pixels but this plan is for " + width + "x" + height + ": build a plan for that size");
        }
        o = ownO != null ? ownO : out;
        xPrev = accBuf;
        final float[] d;
        final boolean[] w;
        if (dataGrid != null) {
            d = dataGrid;
            w = null;
            Arrays.fill(d, Float.NaN);
            for (int y = 0; y < height; y++) {
                for (int x = 0; x < width; x++) {
                    int i = y * width + x;
                    float v = observed[i];
                    boolean ok = Float.isFinite(v) && (valid == null || valid[i]);
                    d[(y + padY) * gw + x + padX] = ok ? v : Float.NaN;
                }
            }
        } else {
            // the observed plane is read in place; masked pixels are found through `valid` and isFinite
            d = observed;
            w = valid;
        }
        // sensitivity s = Kᵀ w
        float[] inv = invS;
        if (conv0.normalise()) {
            // Zero edges: Kᵀ1 falls below 1 within a PSF radius of the frame's edge, so s is computed even
            // without masked pixels; before, the plain form (s = 1) ran until a single masked pixel switched
            // the whole frame to this form (docs/restore.md, "Edges")
            boolean anyMasked = dataGrid != null || zeroEdges;
            if (!anyMasked) {
                for (int i = 0; i < n; i++) {
                    if (masked(d, w, i)) {
                        anyMasked = true;
                        break;
                    }
                }
            }
            if (anyMasked) {
                if (inv == null) {
                    if (invMasked == null) {
                        invMasked = new float[n];
                    }
                    inv = invMasked;
                }
                for (int i = 0; i < n; i++) {
                    tmp[i] = masked(d, w, i) ? 0f : 1f;
                }
                conv.correlate(tmp, inv);
                for (int i = 0; i < n; i++) {
                    inv[i] = inv[i] >= MIN_SENSITIVITY ? 1f / inv[i] : 0f;
                }
            } else {
                inv = null; // s = Σpsf = 1 everywhere for the reflective and periodic boundaries, no mask
            }
        } else {
            inv = null;
        }
        // start estimate
        double start = conv0.startValue();
        if (Double.isNaN(start)) {
            double sum = 0;
            long cnt = 0;
            for (int i = 0; i < n; i++) {
                if (!masked(d, w, i)) {
                    sum += d[i];
                    cnt++;
                }
            }
            start = Math.max(cnt > 0 ? sum / cnt : 0, conv0.startFloor());
        }
        if (conv0.startImage() != null) {
            System.arraycopy(conv0.startImage(), 0, o, 0, n);
        } else {
            Arrays.fill(o, (float) start);
        }
        // the accelerated form keeps g_{k−1} on the α pixels only, or on the whole grid without a list
        final int[] ap = p.alphaPixels();
        final float[] gAt = xPrev != null && ap != null ? new float[ap.length] : null;
        final float[] yAt = gAt != null ? new float[ap.length] : null;
        if (xPrev != null) {
            System.arraycopy(o, 0, xPrev, 0, n);
            if (ap == null) {
                if (gBuf == null) {
                    gBuf = new float[n];
                }
                Arrays.fill(gBuf, 0f);
            }
        }


        final double c = p.offset();
        final double g = p.gain();
        final double guard = conv0.guard();
        final boolean logLik = stop.needsLikelihood();
        long nValid = 0;
        for (int i = 0; i < n; i++) {
            if (!masked(d, w, i)) {
                nValid++;
            }
        }
        List<IterationRecord> history = new ArrayList<>();
        long t0 = System.nanoTime();
        double prevL = Double.NaN;
        double gDotPrev = Double.NaN; // Σ g_{k−1}² for the acceleration
        double alphaNum = 0;
        int sinceRestart = 0; // updates since the start or the last restart of the extrapolation
        int k = 0;
        StopReason reason = null;
        double[] lifted = floor == null ? null : new double[Math.max(1, floor.stars())];
        {
            final BlockPasses passes = this.passes;
            final float[][][] tvRows = this.tvRows;
            final int nb = passes.blocks();
            final double[] s1 = new double[nb];
            final double[] s2 = new double[nb];
            final double[] s3 = new double[nb];
            final double[] s4 = new double[nb];
            final double[] chiSig = new double[nb];
            final double[] nSig = new double[nb];
            final float[] t = tmp;
            final float[] sInv = inv;
            while (reason == null) {
                if (k >= stop.maxIterations()) {
                    reason = stop.rule() == StopRule.FIXED_COUNT ? StopReason.FIXED_COUNT_REACHED : StopReason.ITERATION_CAP;
                    break;
                }
                if (cancelled.getAsBoolean()) {
                    reason = StopReason.CANCELLED;
                    break;
                }
                final float[] x = o;
                final float[] xp = xPrev;
                final boolean acc = accelerated(method);
                // the point the map is evaluated at: x_k, or the prediction y_k, held in x_{k−1}'s storage
                final float[] at;
                if (acc) {
                    double alpha = 0;
                    if (sinceRestart >= 2 && gDotPrev > 0) {
                        if (alphaNum < 0) {
                            // successive changes point apart: extrapolating would overshoot, so restart
                            sinceRestart = 0;
                        } else {
                            alpha = Math.min(alphaNum / gDotPrev, method == Method.ACCELERATED_TV_RL ? ACCEL_MAX_TV : ACCEL_MAX);
                        }
                    }
                    final float a = (float) alpha;
                    // y = max(0, x + α (x − x_{k−1})) replaces x_{k−1}, which is not needed any more
                    passes.run((blk, from, to) -> {
                        for (int i = from; i < to; i++) {
                            xp[i] = predict(x[i], xp[i], a);
                        }
                    });
                    at = xp;
                } else {
                    at = x;
                }
                conv.convolve(at, t);
                // tmp = K est, then the ratio, then Kᵀ ratio
                passes.run((blk, from, to) -> ratio(d, w, t, c, g, guard, p, logLik, from, to, s1, s2, chiSig, nSig, blk));
                double logL = logLik ? g * BlockPasses.sum(s1) : Double.NaN;
                double nSignal = BlockPasses.sum(nSig);
                double chi2 = nSignal >= MIN_SIGNAL_PIXELS ? BlockPasses.sum(chiSig) / nSignal
                        : BlockPasses.sum(s2) / Math.max(1, nValid);
                conv.correlate(t, t);
                if (regularised(method) && p.tvWeight() > 0) {
                    final float lam = (float) p.tvWeight();
                    final float eps = (float) p.tvEpsilon();
                    passes.run((blk, from, to) -> tvDenominator(at, t, sInv, lam, eps, from / gw, to / gw, tvRows[blk]));
                }
                double change;
                if (acc) {
                    // x_{k+1} = y · Kᵀ(...) / s replaces y; g_k = x_{k+1} − y; x_k stays for the next prediction
                    // α is measured where the restoration converges, the protected stars' cores: on the sky
                    // the TV term makes successive changes anti-correlated (α < 0, a restart every other
                    // step), and over the whole discs α still decayed to 0.1 within 35 iterations
                    final float[] gb = ap == null ? gBuf : null;
                    if (ap != null) {
                        for (int j = 0; j < ap.length; j++) {
                            yAt[j] = xp[ap[j]];
                        }
                    }
                    passes.run((blk, from, to) -> {
                        double num = 0;
                        double den = 0;
                        double diff = 0;
                        double tot = 0;
                        for (int i = from; i < to; i++) {
                            float yv = xp[i];
                            float nv = update(yv, t[i], sInv, i);
                            if (gb != null) {
                                float gv = nv - yv;
                                num += (double) gv * gb[i];
                                den += (double) gb[i] * gb[i];
                                gb[i] = gv;
                            }
                            diff += Math.abs(nv - x[i]);
                            tot += Math.abs(nv);
                            xp[i] = nv;
                        }
                        s1[blk] = num;
                        s2[blk] = den;
                        s3[blk] = diff;
                        s4[blk] = tot;
                    });
                    if (ap != null) {
                        // the α pixels are few (the stars' cores): one pass in list order, on this thread
                        double num = 0;
                        double den = 0;
                        for (int j = 0; j < ap.length; j++) {
                            float gv = xp[ap[j]] - yAt[j];
                            num += (double) gv * gAt[j];
                            den += (double) gAt[j] * gAt[j];
                            gAt[j] = gv;
                        }
                        Arrays.fill(s1, 0);
                        Arrays.fill(s2, 0);
                        s1[0] = num;
                        s2[0] = den;
                    }
                    alphaNum = BlockPasses.sum(s1);
                    gDotPrev = BlockPasses.sum(s2);
                    sinceRestart++;
                    float[] swap = o;
                    o = xPrev;
                    xPrev = swap;
                } else {
                    passes.run((blk, from, to) -> {
                        double diff = 0;
                        double tot = 0;
                        for (int i = from; i < to; i++) {
                            float nv = update(x[i], t[i], sInv, i);
                            diff += Math.abs(nv - x[i]);
                            tot += Math.abs(nv);
                            x[i] = nv;
                        }
                        s3[blk] = diff;
                        s4[blk] = tot;
                    });
                }
                double tot = BlockPasses.sum(s4);
                change = tot > 0 ? BlockPasses.sum(s3) / tot : 0;
                if (floor != null) {
                    floor.apply(o, lifted);
                }
                k++;
                IterationRecord rec = new IterationRecord(plane, k, logL, chi2, change, System.nanoTime() - t0);
                history.add(rec);
                listener.onIteration(rec);
                double gainPerPixel = Double.isNaN(prevL) ? Double.POSITIVE_INFINITY : (logL - prevL) / Math.max(1, nValid);
                prevL = logL;
                switch (stop.rule()) {
                    case FIXED_COUNT -> { }
                    case CHI_SQUARE -> {
                        if (chi2 <= stop.threshold()) {
                            reason = StopReason.CHI_SQUARE_REACHED;
                        } else if (change < stop.minChange()) {
                            reason = StopReason.STALLED;
                        }
                    }
                    case LIKELIHOOD_GAIN -> {
                        if (gainPerPixel < stop.threshold()) {
                            reason = StopReason.LIKELIHOOD_CONVERGED;
                        } else if (change < stop.minChange()) {
                            reason = StopReason.STALLED;
                        }
                    }
                }
            }
        }
        if (floor != null && k > 0 && takeBack) {
            // the ring the last update dug was light moved into the cores: return it
            floor.takeBack(o, lifted);
        }
        long nanos = System.nanoTime() - t0;
        if (o != out) {
            for (int y = 0; y < height; y++) {
                System.arraycopy(o, (y + padY) * gw + padX, out, y * width, width);
            }
        }
        o = null;
        xPrev = null;
        return new Outcome(k, reason, history, nanos);
    }

    /** Largest extrapolation factor of the accelerated form (Biggs &amp; Andrews clip α below 1). */
    public static final double ACCEL_MAX = 0.999;
    /**
     * Largest extrapolation factor of {@link Method#ACCELERATED_TV_RL} (project choice, measured; docs/restore.md).
     * With α taken over the stars' cores, 0.7 gave dark rings of 2.1 σ beside the brightest stars of the
     * 24-megapixel test frame after 35 iterations (1.7 σ for TV-RL after 100); 0.5 gave 1.3 σ after 45 with
     * the same sharpening. Without the stars' mask, on the unit-test Moffat field, 0.999 deepened a ring beside
     * the cores to 1.9 σ after 35 iterations and 5 σ after 60.
     */
    public static final double ACCEL_MAX_TV = 0.5;

    /** @return true for the methods that extrapolate (Biggs &amp; Andrews 1997) */
    private static boolean accelerated(Method m) {
        return m == Method.ACCELERATED_RL || m == Method.ACCELERATED_TV_RL;
    }

    /** @return true for the methods with the total-variation term (Dey et al. 2006) */
    private static boolean regularised(Method m) {
        return m == Method.TV_RL || m == Method.ACCELERATED_TV_RL;
    }

    private static float predict(float x, float prev, float a) {
        float y = x + a * (x - prev);
        return y > 0 ? y : 0f;
    }

    private static boolean masked(float[] d, boolean[] w, int i) {
        return !Float.isFinite(d[i]) || (w != null && !w[i]);
    }

    private static float update(float est, float back, float[] inv, int i) {
        if (inv == null) {
            return est * back;
        }
        float s = inv[i];
        return s == 0f ? est : est * back * s;
    }

    /**
     * Replaces {@code tmp} (holding {@code K o}) by the ratio on {@code [from, to)}; stores the block's
     * log-likelihood (in data units, before the gain) and χ² sums.
     */
    private static void ratio(float[] d, boolean[] w, float[] tmp, double c, double g, double guard, Params p,
                              boolean logLik, int from, int to, double[] sumL, double[] sumChi,
                              double[] sumChiSignal, double[] countSignal, int blk) {
        double logL = 0;
        double chi2 = 0;
        double chi2Signal = 0;
        long nSignal = 0;
        final double level = p.signalLevel();
        final boolean[] mask = p.signalMask();
        final boolean allSignal = mask == null && Double.isNaN(level);
        final boolean damped = p.method() == Method.DAMPED_RL;
        final double t2 = p.dampingSigma() * p.dampingSigma();
        final double minVar = 1.0 / g;
        for (int i = from; i < to; i++) {
            float dv = d[i];
            if (!Float.isFinite(dv) || (w != null && !w[i])) {
                tmp[i] = 0f;
                continue;
            }
            double model = (double) tmp[i] + c;
            double data = Math.max(0, (double) dv + c);
            double r = dv - tmp[i];
            double term = r * r * g / Math.max(model, minVar);
            chi2 += term;
            if (mask != null ? mask[i] : (allSignal || tmp[i] > level)) {
                chi2Signal += term;
                nSignal++;
            }
            if (logLik) {
                logL += model > 0 ? data * Math.log(model) - model : -model;
            }
            double den = model + guard;
            if (!damped) {
                tmp[i] = den > 0 ? (float) (data / den) : 0f;
            } else {
                // White (1994), in electrons: U = min(1, (2/T²)[D ln(D/B) − D + B])
                double bb = g * den;
                double dd = g * data;
                if (bb <= 0) {
                    tmp[i] = 0f;
                    continue;
                }
                double dev = dd > 0 ? dd * Math.log(dd / bb) - dd + bb : bb;
                double u = Math.min(1.0, 2.0 / t2 * dev);
                double un = Math.pow(u, DAMPING_POWER - 1);
                tmp[i] = (float) (1.0 + un * (DAMPING_POWER - (DAMPING_POWER - 1) * u) * (dd - bb) / bb);
            }
        }
        sumL[blk] = logL;
        sumChi[blk] = chi2;
        sumChiSignal[blk] = chi2Signal;
        countSignal[blk] = nSignal;
    }

    /**
     * tmp ← tmp / max(s − λ div(∇o/|∇o|), TV_MIN_DENOMINATOR·s), scaled so that the update divides by s.
     * Forward differences for ∇, backward for div (Rudin, Osher &amp; Fatemi 1992 discretisation; common
     * practice). Each pixel's normalised gradient is computed once, into the block's row buffers, and used
     * by the pixel and its right and lower neighbours: one square root per pixel instead of four, and the
     * same bits as evaluating each term where it is used.
     */
    private void tvDenominator(float[] est, float[] t, float[] inv, float lambda, float eps, int y0, int y1,
                               float[][] rows) {
        float e2 = eps * eps;
        float[] nxRow = rows[0];
        float[] nyPrev = rows[1];
        float[] nyCur = rows[2];
        if (y0 > 0) {
            normals(est, y0 - 1, nxRow, nyPrev, e2);
        }
        for (int y = y0; y < y1; y++) {
            normals(est, y, nxRow, nyCur, e2);
            int row = y * gw;
            boolean top = y == 0;
            for (int x = 0; x < gw; x++) {
                int i = row + x;
                float div = nxRow[x] - (x > 0 ? nxRow[x - 1] : 0f) + nyCur[x] - (top ? 0f : nyPrev[x]);
                float s = inv == null ? 1f : (inv[i] > 0 ? 1f / inv[i] : 1f);
                float den = Math.max(s - lambda * div, TV_MIN_DENOMINATOR * s);
                // the update multiplies by 1/s afterwards, so fold s/den into tmp
                t[i] = t[i] * s / den;
            }
            float[] swap = nyPrev;
            nyPrev = nyCur;
            nyCur = swap;
        }
    }

    /**
     * The normalised forward-difference gradient of row y: {@code nx = gx / √(gx² + gy² + ε²)} and
     * {@code ny = gy / √(gx² + gy² + ε²)}, where a difference across the grid's last column or row is 0 and
     * so is the component that would need it.
     */
    private void normals(float[] a, int y, float[] nx, float[] ny, float e2) {
        int row = y * gw;
        int last = gw - 1;
        if (y + 1 < gh) {
            for (int x = 0; x < last; x++) {
                int i = row + x;
                float gx = a[i + 1] - a[i];
                float gy = a[i + gw] - a[i];
                float q = (float) Math.sqrt(gx * gx + gy * gy + e2);
                nx[x] = gx / q;
                ny[x] = gy / q;
            }
            float gy = a[row + last + gw] - a[row + last];
            nx[last] = 0f;
            ny[last] = gy / (float) Math.sqrt(0f * 0f + gy * gy + e2);
        } else {
            for (int x = 0; x < last; x++) {
                int i = row + x;
                float gx = a[i + 1] - a[i];
                nx[x] = gx / (float) Math.sqrt(gx * gx + 0f * 0f + e2);
                ny[x] = 0f;
            }
            nx[last] = 0f;
            ny[last] = 0f;
        }
    }
}
