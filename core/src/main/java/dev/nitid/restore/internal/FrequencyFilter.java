package dev.nitid.restore.internal;

import dev.nitid.fft.FftSizes;
import dev.nitid.image.Image;
import dev.nitid.restore.EdgeHandling;
import dev.nitid.fft.RealFft2d;

/**
 * Wiener and Tikhonov filters in the frequency domain on one image size with one PSF, on the project's
 * real-to-complex plan {@link RealFft2d} (its packing and the PSF-centre rule are documented there).
 *
 * <p>The output is {@code x = F⁻¹[ H* Y / (|H|² + R) ]} where {@code H} is the unnormalised DFT of the PSF
 * zero-padded to the grid with its centre pixel {@code (⌊w/2⌋, ⌊h/2⌋)} rolled to index 0 (so H(0) = Σpsf),
 * {@code Y} the DFT of the (edge-extended) image and
 * <ul>
 *   <li>Tikhonov (Wiener–Hunt): {@code R = λ |D|²}, {@code |D|² = (4 − 2cos 2πu/M − 2cos 2πv/N)²}, the 5-point
 *       Laplacian — scikit-image 0.19's {@code restoration.wiener};</li>
 *   <li>Wiener, K given: {@code R = K};</li>
 *   <li>Wiener, K estimated: {@code R = |H|² Pn / max(P̄_Y − κ Pn, Pn·1e-6)} with {@code Pn = MN σ²} the white-noise
 *       power of the unnormalised DFT, {@code P̄_Y} the azimuthal mean of {@code |Y|²} in rings of one
 *       frequency bin and κ = {@link #NOISE_OVERSUBTRACTION}; for κ = 1 the filter is
 *       {@code (1/H) · max(0, 1 − Pn/P̄_Y)}, the classic
 *       power-spectrum-subtraction Wiener estimate (Gonzalez &amp; Woods, Digital Image Processing, §5.8,
 *       section from memory); then {@code R} is raised to a constant floor that keeps the white-noise
 *       gain {@code sqrt(mean|W|²)} at most {@link #MAX_NOISE_GAIN}.</li>
 * </ul>
 * For {@link EdgeHandling#PERIODIC} the grid is the frame; otherwise the frame is padded to a fast size with
 * the half-sample mirror of itself ({@link EdgeHandling#ZERO}: zeros), which removes the seams of the
 * circular model. Not thread-safe; close it to stop the FFT threads.
 */
public final class FrequencyFilter implements AutoCloseable {
    /** Filter kind. */
    public enum Kind {
        /** Constant or estimated noise-to-signal ratio. */
        WIENER,
        /** Laplacian regulariser. */
        TIKHONOV
    }

    /**
     * The noise power is subtracted this many times when the signal power is estimated, so a frequency
     * needs a signal at least as strong as the noise before the filter amplifies it (over-subtraction in
     * spectral subtraction, Berouti, Schwartz &amp; Makhoul 1979, ICASSP, from memory). Without it, rings
     * where the measured power exceeds the noise by chance get gains of 1/H near the band limit, and a
     * band-limited (diffraction) PSF blows up; measured on the quality harness (notes/restore.md).
     */
    public static final double NOISE_OVERSUBTRACTION = 2.0;
    /**
     * When K is estimated, it is raised where needed to a floor that keeps the filter's white-noise gain at
     * or below this (the acceptance bound of issue 5 on the sky-noise ratio; our choice). On star fields
     * the stars' power is flat and strong, so the per-frequency estimate alone approaches 1/H and
     * multiplies the sky noise tens of times (measured on the quality harness, notes/restore.md).
     */
    public static final double MAX_NOISE_GAIN = 1.5;

    private final int width;
    private final int height;
    private final int gw;
    private final int gh;
    private final int padX;
    private final int padY;
    private final EdgeHandling edges;
    private final RealFft2d fft;
    private final float[] h;
    private final float[] grid;
    private final float[] work;

    /**
     * Plans the filter.
     *
     * @param width  frame columns
     * @param height frame rows
     * @param psf    the PSF (input, copied into the transfer function)
     * @param edges  edge handling
     * @param threads FFT threads
     */
    public FrequencyFilter(int width, int height, Image psf, EdgeHandling edges, int threads) {
        this.width = width;
        this.height = height;
        this.edges = edges;
        if (edges == EdgeHandling.PERIODIC) {
            gw = width;
            gh = height;
            padX = 0;
            padY = 0;
        } else {
            gw = FftSizes.nextFast(width + psf.width());
            gh = FftSizes.nextFast(height + psf.height());
            padX = (gw - width) / 2;
            padY = (gh - height) / 2;
        }
        fft = RealFft2d.create(gw, gh, threads);
        h = fft.transferFunction(psf);
        grid = new float[gw * gh];
        work = fft.newSpectrum();
    }

    /**
     * Filters one frame.
     *
     * @param in         frame (input, not modified); non-finite pixels must have been filled by the caller
     * @param out        result (output, modified)
     * @param kind       filter kind
     * @param reg        λ (Tikhonov) or K (Wiener); NaN for Wiener estimates K per frequency from {@code sigma}
     * @param noiseSigma the frame's noise σ, used only when K is estimated
     */
    public void apply(float[] in, float[] out, Kind kind, double reg, double noiseSigma) {
        java.util.Arrays.fill(grid, 0f);
        for (int ye = 0; ye < gh; ye++) {
            int sy = map(ye - padY, height);
            if (sy < 0) {
                continue;
            }
            for (int xe = 0; xe < gw; xe++) {
                int sx = map(xe - padX, width);
                if (sx >= 0) {
                    grid[ye * gw + xe] = in[sy * width + sx];
                }
            }
        }
        fft.forward(grid, work);
        final int sw = fft.spectrumWidth();
        double[] ringMean = null;
        double pn = 0;
        if (kind == Kind.WIENER && Double.isNaN(reg)) {
            pn = (double) gw * gh * noiseSigma * noiseSigma;
            int nb = (int) Math.ceil(Math.hypot(gw / 2.0, gh / 2.0)) + 2;
            ringMean = new double[nb];
            long[] cnt = new long[nb];
            for (int v = 0; v < gh; v++) {
                for (int u = 0; u < sw; u++) {
                    int b = ring(u, v);
                    int i = 2 * (v * sw + u);
                    ringMean[b] += (double) work[i] * work[i] + (double) work[i + 1] * work[i + 1];
                    cnt[b]++;
                }
            }
            for (int b = 0; b < nb; b++) {
                ringMean[b] = cnt[b] > 0 ? ringMean[b] / cnt[b] : 0;
            }
        }
        double kCap = ringMean != null ? noiseGainFloor(ringMean, pn, sw) : 0;
        for (int v = 0; v < gh; v++) {
            double cv = Math.cos(2 * Math.PI * v / gh);
            for (int u = 0; u < sw; u++) {
                int i = 2 * (v * sw + u);
                double hr = h[i];
                double hi = h[i + 1];
                double h2 = hr * hr + hi * hi;
                double r;
                if (kind == Kind.TIKHONOV) {
                    double lap = 4 - 2 * Math.cos(2 * Math.PI * u / gw) - 2 * cv;
                    r = reg * lap * lap;
                } else if (ringMean != null) {
                    double sig = ringMean[ring(u, v)] - NOISE_OVERSUBTRACTION * pn;
                    r = Math.max(h2 * pn / Math.max(sig, pn * 1e-6), kCap);
                } else {
                    r = reg;
                }
                double den = h2 + r;
                double yr = work[i];
                double yi = work[i + 1];
                if (den > 0) {
                    work[i] = (float) ((hr * yr + hi * yi) / den);
                    work[i + 1] = (float) ((hr * yi - hi * yr) / den);
                } else {
                    work[i] = 0f;
                    work[i + 1] = 0f;
                }
            }
        }
        fft.inverse(work, grid);
        for (int y = 0; y < height; y++) {
            System.arraycopy(grid, (y + padY) * gw + padX, out, y * width, width);
        }
    }

    @Override
    public void close() {
        fft.close();
    }

    /**
     * The smallest constant K that keeps the estimated filter's white-noise gain
     * {@code sqrt(mean |W|²)} at or below {@link #MAX_NOISE_GAIN} (bisection in log K on a regular sample of
     * at most 2²⁰ frequencies; by Parseval the mean of |W|² over frequencies is the filter's noise-power gain).
     */
    private double noiseGainFloor(double[] ringMean, double pn, int sw) {
        int total = gh * sw;
        int step = Math.max(1, total / (1 << 20));
        double lo = 1e-12;
        double hi = 1e3;
        if (noiseGain(ringMean, pn, sw, step, 0) <= MAX_NOISE_GAIN) {
            return 0;
        }
        for (int it = 0; it < 50; it++) {
            double mid = Math.sqrt(lo * hi);
            if (noiseGain(ringMean, pn, sw, step, mid) > MAX_NOISE_GAIN) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return hi;
    }

    private double noiseGain(double[] ringMean, double pn, int sw, int step, double kCap) {
        double sum = 0;
        double count = 0;
        int total = gh * sw;
        for (int j = 0; j < total; j += step) {
            int v = j / sw;
            int u = j % sw;
            int i = 2 * j;
            double h2 = (double) h[i] * h[i] + (double) h[i + 1] * h[i + 1];
            double sig = ringMean[ring(u, v)] - NOISE_OVERSUBTRACTION * pn;
            double r = Math.max(h2 * pn / Math.max(sig, pn * 1e-6), kCap);
            double den = h2 + r;
            // columns 1 .. W/2−1 of the half spectrum stand for two frequencies each
            double wgt = (u == 0 || 2 * u == gw) ? 1 : 2;
            sum += den > 0 ? wgt * h2 / (den * den) : 0;
            count += wgt;
        }
        return Math.sqrt(sum / count);
    }

    private int ring(int u, int v) {
        int fu = u <= gw / 2 ? u : gw - u;
        int fv = v <= gh / 2 ? v : gh - v;
        // radius in units of the coarser axis' frequency bin
        double r = Math.hypot(fu * (double) Math.max(gw, gh) / gw, fv * (double) Math.max(gw, gh) / gh);
        return Math.min((int) Math.round(r), (int) Math.ceil(Math.hypot(gw / 2.0, gh / 2.0)) + 1);
    }

    private int map(int x, int n) {
        return switch (edges) {
            case PERIODIC -> Math.floorMod(x, n);
            case ZERO -> (x >= 0 && x < n) ? x : -1;
            case REFLECT, EXTENDED_DOMAIN -> {
                int m = Math.floorMod(x, 2 * n);
                yield m < n ? m : 2 * n - 1 - m;
            }
        };
    }
}
