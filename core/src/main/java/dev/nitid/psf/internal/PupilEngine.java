package dev.nitid.psf.internal;

import dev.nitid.fft.FftSizes;
import dev.nitid.fft.internal.WorkerPool;
import java.util.Arrays;
import org.jtransforms.fft.DoubleFFT_1D;

/**
 * The diffraction PSF as |FFT(pupil)|², sampled on a chosen fine detector grid.
 *
 * <h2>Sampling</h2>
 * A pupil sampled at spacing δ on an N × N grid gives, through the DFT, PSF samples at angular spacing
 * λ/(Nδ) (Goodman, Introduction to Fourier Optics, ch. 4: the Fraunhofer pattern is the Fourier
 * transform of the pupil). We want that spacing to be the fine detector sample q/f (q the sub-pixel,
 * f the focal length), so the pupil diameter spans {@code n_D = N·s} samples, where
 * {@code s = q/(λf/D)} is the fine sample in units of λ/D. N is one fast FFT length for all wavelengths,
 * large enough that (a) the fine stamp fits with a guard band against the periodic wrap of the pattern
 * and (b) the pupil has at least the requested number of samples across at the longest wavelength.
 * When the fine sample is coarser than {@link #MAX_SAMPLE_OVER_LAMBDA_D} λ/D the pupil would fill more
 * than half the grid (n_D = N·s), so the pattern is computed on an m-times finer grid (m odd, keeping a
 * sample on the centre) and every m-th sample is kept: the point samples stay exact.
 *
 * <h2>Pupil edges</h2>
 * The transmission of each pupil sample is the fraction of the sample covered by the open aperture,
 * estimated from the signed distance to each edge (a linear ramp one sample wide): it makes the pupil
 * follow the true circle far better than a 0/1 mask at the same grid. Each wavelength's pattern is
 * normalised to the open area A = Σt (the light the aperture lets through), not to Σt², so the centre
 * sample is A/N² exactly (Parseval: Σ|X|² = N²·Σt²; X(0) = Σt), as for the continuous pupil. The field
 * then holds Σt²/Σt &lt; 1 of the light: the rest is the far wing a sharp edge sends beyond the field.
 *
 * <h2>Sub-pixel offsets</h2>
 * By the shift theorem, multiplying the pupil by {@code exp(+2πi·s·n/N)} moves the pattern by +s
 * samples, so any offset is exact (no interpolation).
 *
 * <h2>Cost</h2>
 * Only the rows crossing the pupil are transformed, then only the columns the stamp needs, and only the
 * stamp's rows of those are kept (a pruned 2-D FFT); rows and columns are cut into a fixed number of
 * interleaved chunks ({@value #CHUNKS}) spread over the caller's thread count (a {@link WorkerPool} held for
 * one render), each output sample written by one chunk, so the result is identical whatever the number of
 * threads.
 *
 * <p>Stateless; each call allocates its own buffers.
 */
public final class PupilEngine {
    /** Guard factor between the FFT field and the fine stamp, against the periodic wrap of the wings. */
    public static final double GUARD = 1.5;
    /** Largest FFT side used: bounds the time and the pupil rows held in memory. */
    public static final int MAX_FFT = 8192;
    /** Work is split into this many interleaved chunks (fixed, so results never depend on the thread count). */
    static final int CHUNKS = 16;
    /** Coarsest computed sample, in λ/D, before the grid is refined (Nyquist for the PSF is 0.5). */
    public static final double MAX_SAMPLE_OVER_LAMBDA_D = 0.5;

    private PupilEngine() {
    }

    /**
     * The aperture geometry, in units where the pupil radius is 1.
     *
     * @param obstruction  central obstruction ratio ε in [0, 1)
     * @param vanes        number of radial spider vanes, ≥ 0
     * @param vaneWidth    vane width over the pupil radius
     * @param vaneAngleDeg angle of the first vane from +x towards +y
     * @param zernike      coefficients for Noll 4..11 in waves at the reference wavelength (8 values)
     */
    public record Aperture(double obstruction, int vanes, double vaneWidth, double vaneAngleDeg, double[] zernike) {
    }

    /**
     * Result of one rendering.
     *
     * @param fine          fine-grid samples, flux per sub-pixel over the whole PSF (sum = energy in the stamp)
     * @param fftSize       N
     * @param refine        m, the extra refinement (1 when not needed)
     * @param pupilDiameter samples across the pupil diameter, per wavelength
     * @param sumT          Σ t over the pupil, per wavelength
     * @param sumT2         Σ t² over the pupil, per wavelength
     */
    public record Result(float[] fine, int fftSize, int refine, double[] pupilDiameter, double[] sumT, double[] sumT2) {
    }

    /**
     * Renders the fine grid.
     *
     * @param aperture       the aperture (input, not modified)
     * @param samplesPerLD   per wavelength, the fine detector sample in units of λ/D
     * @param weights        per wavelength photon weight (sum 1)
     * @param waveScale      per wavelength, λ_ref/λ (scales the Zernike phase)
     * @param stamp          fine stamp side (size × oversample)
     * @param shiftX         pattern offset in fine samples, x
     * @param shiftY         pattern offset in fine samples, y
     * @param centreIndex    fine index whose sample sits at offset −shift from the PSF centre
     * @param minPupilSamples fewest samples across the pupil diameter
     * @param threads        worker threads including the caller's, ≥ 1 (the result does not depend on it)
     * @return the samples and the grid used
     */
    public static Result render(Aperture aperture, double[] samplesPerLD, double[] weights, double[] waveScale,
                                int stamp, double shiftX, double shiftY, int centreIndex, int minPupilSamples,
                                int threads) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
        double sMax = Arrays.stream(samplesPerLD).max().orElseThrow();
        double sMin = Arrays.stream(samplesPerLD).min().orElseThrow();
        int m = 1;
        while (sMax / m > MAX_SAMPLE_OVER_LAMBDA_D) {
            m += 2;
        }
        long need = Math.max((long) Math.ceil(GUARD * stamp * m), (long) Math.ceil(minPupilSamples / (sMin / m)));
        if (need > MAX_FFT) {
            throw new IllegalArgumentException("the pupil FFT would need a " + need + "² grid (limit " + MAX_FFT
                    + "²): lower --oversample or --size, or the pixel is far finer than the diffraction pattern");
        }
        int n = FftSizes.nextFast((int) need);
        int nl = samplesPerLD.length;
        double[] diam = new double[nl];
        double[] sumT = new double[nl];
        double[] sumT2 = new double[nl];
        double[] acc = new double[stamp * stamp];
        int[] kIndex = new int[stamp];
        for (int g = 0; g < stamp; g++) {
            kIndex[g] = Math.floorMod(m * (g - centreIndex), n);
        }
        // Only the rows crossing the pupil are non-zero, and only the stamp's columns and rows of the
        // spectrum are needed: a pruned 2-D FFT (rows, then the needed columns) does a fraction of the work.
        int half = (int) Math.ceil(0.5 * n * sMax / m) + 1;
        int lo = Math.max(0, n / 2 - half);
        int hi = Math.min(n - 1, n / 2 + half);
        int nRows = hi - lo + 1;
        double[] rows = new double[2 * n * nRows];
        int chunks = Math.max(1, Math.min(CHUNKS, stamp));
        try (WorkerPool pool = new WorkerPool(Math.min(threads, chunks))) {
            for (int l = 0; l < nl; l++) {
                double sp = samplesPerLD[l] / m;
                double radius = 0.5 * n * sp;
                diam[l] = 2 * radius;
                Arrays.fill(rows, 0);
                double[] sums = fillPupil(rows, lo, hi, n, radius, aperture, waveScale[l], m * shiftX, m * shiftY);
                sumT[l] = sums[0];
                sumT2[l] = sums[1];
                double norm = (double) m * m * weights[l] / ((double) n * n * sums[0]);
                pool.run(chunks, (worker, from, to) -> {
                    DoubleFFT_1D fft = new DoubleFFT_1D(n);
                    double[] row = new double[2 * n];
                    for (int ch = from; ch < to; ch++) {
                        for (int r = ch; r < nRows; r += chunks) {
                            System.arraycopy(rows, 2 * n * r, row, 0, 2 * n);
                            fft.complexForward(row);
                            System.arraycopy(row, 0, rows, 2 * n * r, 2 * n);
                        }
                    }
                });
                pool.run(chunks, (worker, from, to) -> {
                    DoubleFFT_1D fft = new DoubleFFT_1D(n);
                    double[] col = new double[2 * n];
                    for (int ch = from; ch < to; ch++) {
                        for (int gx = ch; gx < stamp; gx += chunks) {
                            int kx = kIndex[gx];
                            Arrays.fill(col, 0);
                            for (int r = 0; r < nRows; r++) {
                                int src = 2 * n * r + 2 * kx;
                                col[2 * (lo + r)] = rows[src];
                                col[2 * (lo + r) + 1] = rows[src + 1];
                            }
                            fft.complexForward(col);
                            for (int gy = 0; gy < stamp; gy++) {
                                int k = 2 * kIndex[gy];
                                double re = col[k];
                                double im = col[k + 1];
                                // each (gx, gy) belongs to one chunk and wavelengths run in order: thread-count
                                // independent
                                acc[gy * stamp + gx] += norm * (re * re + im * im);
                            }
                        }
                    }
                });
            }
        }
        float[] fine = new float[stamp * stamp];
        for (int i = 0; i < fine.length; i++) {
            fine[i] = (float) acc[i];
        }
        return new Result(fine, n, m, diam, sumT, sumT2);
    }

    /**
     * Writes the complex pupil field t·exp(iφ)·ramp into rows {@code lo..hi} of an n-wide grid (interleaved,
     * row j stored at {@code (j − lo)·2n}, pupil centre at (n/2, n/2)) and returns {Σt, Σt²}.
     */
    static double[] fillPupil(double[] rows, int rowLo, int rowHi, int n, double radius, Aperture ap,
                              double waveScale, double shiftX, double shiftY) {
        int c = n / 2;
        int half = (int) Math.ceil(radius) + 1;
        int lo = Math.max(rowLo, c - half);
        int hi = Math.min(rowHi, c + half);
        double[] zc = ap.zernike();
        boolean aberrated = false;
        for (double v : zc) {
            aberrated |= v != 0;
        }
        VaneGeometry vanes = new VaneGeometry(ap.vanes(), ap.vaneAngleDeg(), 0.5 * ap.vaneWidth() * radius);
        double inner = ap.obstruction() * radius;
        double st = 0;
        double st2 = 0;
        double twoPiOverN = 2 * Math.PI / n;
        for (int j = lo; j <= hi; j++) {
            double y = j - c;
            for (int i = lo; i <= hi; i++) {
                double x = i - c;
                double t = transmission(x, y, radius, inner, vanes);
                if (t <= 0) {
                    continue;
                }
                st += t;
                st2 += t * t;
                double phase = twoPiOverN * (shiftX * x + shiftY * y);
                if (aberrated) {
                    phase += 2 * Math.PI * waveScale * ZernikeKernel.wavefront(zc, x / radius, y / radius);
                }
                int k = 2 * ((j - rowLo) * n + i);
                rows[k] = t * Math.cos(phase);
                rows[k + 1] = t * Math.sin(phase);
            }
        }
        return new double[] {st, st2};
    }

    /**
     * Fraction of the sample at (x, y) (pupil samples from the centre) that lies in the open aperture:
     * annulus coverage from the signed distances to both circles, times the uncovered fraction of each vane.
     */
    static double transmission(double x, double y, double radius, double inner, VaneGeometry vanes) {
        double r = Math.sqrt(x * x + y * y);
        double outer = clamp01(radius - r + 0.5);
        if (outer <= 0) {
            return 0;
        }
        double t = outer;
        if (inner > 0) {
            double in = clamp01(r - inner + 0.5);
            t = Math.max(0, outer + in - 1);
        }
        for (int v = 0; v < vanes.count && t > 0; v++) {
            double along = x * vanes.cos[v] + y * vanes.sin[v];
            if (along <= -0.5) {
                continue;
            }
            double across = -x * vanes.sin[v] + y * vanes.cos[v];
            double cover = Math.max(0, Math.min(across + 0.5, vanes.halfWidth) - Math.max(across - 0.5, -vanes.halfWidth));
            if (along < 0.5) {
                cover *= along + 0.5;
            }
            t *= 1 - Math.min(1, cover);
        }
        return t;
    }

    private static double clamp01(double v) {
        return v < 0 ? 0 : (v > 1 ? 1 : v);
    }

    /** Direction cosines of each vane and its half-width in pupil samples. */
    static final class VaneGeometry {
        final int count;
        final double[] cos;
        final double[] sin;
        final double halfWidth;

        VaneGeometry(int count, double angleDeg, double halfWidth) {
            this.count = count;
            this.halfWidth = halfWidth;
            cos = new double[count];
            sin = new double[count];
            for (int v = 0; v < count; v++) {
                double a = Math.toRadians(angleDeg + 360.0 * v / count);
                cos[v] = Math.cos(a);
                sin[v] = Math.sin(a);
            }
        }
    }

    /**
     * Strehl ratio at the Gaussian image point for one wavelength: |Σ t·e^{iφ}|² / (Σt)² (the PSF value at
     * the centre relative to the unaberrated one; Born &amp; Wolf, Principles of Optics, §9.1).
     *
     * @param ap             the aperture
     * @param pupilDiameter  samples across the pupil used for the sum
     * @param waveScale      λ_ref/λ
     * @return the Strehl ratio
     */
    public static double strehlAtCentre(Aperture ap, int pupilDiameter, double waveScale) {
        double radius = 0.5 * pupilDiameter;
        int half = (int) Math.ceil(radius) + 1;
        VaneGeometry vanes = new VaneGeometry(ap.vanes(), ap.vaneAngleDeg(), 0.5 * ap.vaneWidth() * radius);
        double inner = ap.obstruction() * radius;
        double re = 0;
        double im = 0;
        double st = 0;
        for (int j = -half; j <= half; j++) {
            for (int i = -half; i <= half; i++) {
                double t = transmission(i, j, radius, inner, vanes);
                if (t <= 0) {
                    continue;
                }
                double phase = 2 * Math.PI * waveScale * ZernikeKernel.wavefront(ap.zernike(), i / radius, j / radius);
                re += t * Math.cos(phase);
                im += t * Math.sin(phase);
                st += t;
            }
        }
        return (re * re + im * im) / (st * st);
    }
}
