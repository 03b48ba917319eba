package dev.nitid.fft;

import dev.nitid.fft.internal.RangeTask;
import dev.nitid.fft.internal.RealFftKernel;
import dev.nitid.fft.internal.WorkerPool;
import dev.nitid.image.Image;
import java.util.Arrays;

/**
 * A 2-D real-to-complex FFT plan for one grid size (any width and height), built once and run many
 * times, with its row and column passes split over a fixed set of threads.
 *
 * <h2>Definition and normalisation</h2>
 * For a real {@code W × H} array {@code x(n, m)} (column {@code n}, row {@code m}):
 * <pre>  forward:  X(k, l) = Σ_{m=0}^{H−1} Σ_{n=0}^{W−1} x(n, m) · exp(−2πi (k n / W + l m / H))
 *  inverse:  x(n, m) = 1/(W H) · Σ_l Σ_k X(k, l) · exp(+2πi (k n / W + l m / H))</pre>
 * (the unitary-free DFT with the 1/N on the inverse; Bracewell, <i>The Fourier Transform and Its
 * Applications</i>, 3rd ed. 2000, ch. 18; numpy/scipy {@code rfft2} use the same convention).
 *
 * <h2>Spectrum packing (the only place it is written down)</h2>
 * Because {@code x} is real, {@code X(W−k, l) = conj X(k, (H−l) mod H)}, so only {@code 0 ≤ k ≤ W/2} is
 * kept (integer division), like {@code numpy.fft.rfft2}. A spectrum is a {@code float[]} of
 * {@link #spectrumLength()} = {@code H · 2·(W/2 + 1)} values: row {@code l} holds
 * {@code Re X(0,l), Im X(0,l), Re X(1,l), Im X(1,l), …, Re X(W/2,l), Im X(W/2,l)}, i.e.
 * <pre>  Re X(k, l) = s[l·2·(W/2+1) + 2k],   Im X(k, l) = s[l·2·(W/2+1) + 2k + 1].</pre>
 * Row {@code l} is the frequency {@code l} for {@code l < H/2} and {@code l − H} above, as in numpy.
 *
 * <h2>PSF-centre rule and transfer function</h2>
 * {@link #transferFunction} places PSF pixel {@code (⌊pw/2⌋, ⌊ph/2⌋)} at grid origin {@code (0, 0)},
 * wrapping the rest around the edges, and transforms it; multiplying a spectrum by it is circular
 * convolution with the PSF centred by the rule of {@link Convolver}.
 *
 * <h2>Threads and cost</h2>
 * Rows are transformed with JTransforms' 1-D {@code realForward}, then columns with
 * {@code complexForward}, each pass split into one contiguous range of rows or columns per thread.
 * Every row and column is transformed by the same code whatever the thread count, so results are
 * bit-identical for 1 or N threads. The threads are daemons and never keep the JVM alive;
 * {@link #close()} stops them at once. Not thread-safe: one caller at a time.
 */
public final class RealFft2d implements AutoCloseable {
    private final int width;
    private final int height;
    private final int stride;
    private final WorkerPool pool;
    private final RealFftKernel[] kernels;

    private float[] curSpectrum;
    private float[] curReal;
    private final RangeTask loadRows = this::loadRows;
    private final RangeTask forwardColumns = this::forwardColumns;
    private final RangeTask inverseColumns = this::inverseColumns;
    private final RangeTask storeRows = this::storeRows;

    private RealFft2d(int width, int height, int threads) {
        this.width = width;
        this.height = height;
        this.pool = new WorkerPool(threads);
        this.kernels = new RealFftKernel[threads];
        for (int t = 0; t < threads; t++) {
            kernels[t] = new RealFftKernel(width, height);
        }
        this.stride = kernels[0].stride();
    }

    /**
     * Plans transforms of {@code width × height} real arrays.
     *
     * @param width   columns, ≥ 1 (any size; sizes with factors 2, 3, 5 only are fastest, see {@link FftSizes})
     * @param height  rows, ≥ 1
     * @param threads threads for the row and column passes, ≥ 1
     * @return the plan
     * @throws IllegalArgumentException if a size or the thread count is not positive
     */
    public static RealFft2d create(int width, int height, int threads) {
        if (width < 1 || height < 1) {
            throw new IllegalArgumentException("FFT grid " + width + "x" + height
                    + " is not positive: width and height must be at least 1");
        }
        if ((long) height * 2 * (width / 2 + 1) > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("FFT grid " + width + "x" + height
                    + " needs a spectrum above 2^31 floats: transform it in tiles");
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
        return new RealFft2d(width, height, threads);
    }

    /** @return real columns W */
    public int width() {
        return width;
    }

    /** @return real rows H */
    public int height() {
        return height;
    }

    /** @return complex values per spectrum row, {@code W/2 + 1} */
    public int spectrumWidth() {
        return stride / 2;
    }

    /** @return floats in a spectrum, {@code H · 2·(W/2 + 1)} */
    public int spectrumLength() {
        return height * stride;
    }

    /** @return threads used by the passes */
    public int threads() {
        return kernels.length;
    }

    /** @return a new zeroed spectrum array of {@link #spectrumLength()} floats */
    public float[] newSpectrum() {
        return new float[spectrumLength()];
    }

    /**
     * Forward transform {@code X = F x}; see the class Javadoc for the definition and packing.
     *
     * @param in       real array, {@code H × W} row-major (input, not modified)
     * @param spectrum half spectrum, {@link #spectrumLength()} floats (output, modified)
     */
    public void forward(float[] in, float[] spectrum) {
        check(in, width * height, "real array");
        check(spectrum, spectrumLength(), "spectrum");
        curReal = in;
        curSpectrum = spectrum;
        try {
            pool.run(height, loadRows);
            pool.run(stride / 2, forwardColumns);
        } finally {
            curReal = null;
            curSpectrum = null;
        }
    }

    /**
     * Inverse transform {@code x = F⁻¹ X}, including the {@code 1/(W H)} factor.
     *
     * @param spectrum half spectrum in the packing above (input, overwritten: it is the workspace)
     * @param out      real array, {@code H × W} row-major (output, modified)
     */
    public void inverse(float[] spectrum, float[] out) {
        check(spectrum, spectrumLength(), "spectrum");
        check(out, width * height, "real array");
        curReal = out;
        curSpectrum = spectrum;
        try {
            pool.run(stride / 2, inverseColumns);
            pool.run(height, storeRows);
        } finally {
            curReal = null;
            curSpectrum = null;
        }
    }

    /**
     * The transfer function (OTF) of a PSF on this grid: the forward transform of the PSF placed with
     * its centre pixel {@code (⌊pw/2⌋, ⌊ph/2⌋)} at the origin and wrapped around the edges.
     *
     * @param psf      the PSF, plane 0 used; at most W × H (input, not modified)
     * @param spectrum its transfer function in the packing above (output, modified)
     * @throws IllegalArgumentException if the PSF is larger than the grid or has a non-finite pixel
     */
    public void transferFunction(Image psf, float[] spectrum) {
        Checks.psfFits(psf, width, height, "FFT grid");
        Checks.psfFinite(psf);
        check(spectrum, spectrumLength(), "spectrum");
        Arrays.fill(spectrum, 0f);
        placePsf(psf, spectrum, width, height, stride);
        curSpectrum = spectrum;
        try {
            pool.run(height, (t, a, b) -> kernels[t].rowsForward(curSpectrum, a, b));
            pool.run(stride / 2, forwardColumns);
        } finally {
            curSpectrum = null;
        }
    }

    /**
     * Allocating variant of {@link #transferFunction(Image, float[])}.
     *
     * @param psf the PSF (input, not modified)
     * @return a new spectrum array holding its transfer function
     */
    public float[] transferFunction(Image psf) {
        float[] s = newSpectrum();
        transferFunction(psf, s);
        return s;
    }

    /** Stops this plan's worker threads; the plan must not be used afterwards. Idempotent. */
    @Override
    public void close() {
        pool.close();
    }

    /** Writes the PSF, centre at the origin, into the real part of a buffer with the given row stride. */
    static void placePsf(Image psf, float[] buf, int w, int h, int stride) {
        int pw = psf.width();
        int ph = psf.height();
        int cx = pw / 2;
        int cy = ph / 2;
        float[] k = psf.plane(0);
        for (int j = 0; j < ph; j++) {
            int yy = Math.floorMod(j - cy, h);
            for (int i = 0; i < pw; i++) {
                int xx = Math.floorMod(i - cx, w);
                buf[yy * stride + xx] = k[j * pw + i];
            }
        }
    }

    private void loadRows(int t, int y0, int y1) {
        float[] s = curSpectrum;
        float[] in = curReal;
        for (int y = y0; y < y1; y++) {
            int off = y * stride;
            System.arraycopy(in, y * width, s, off, width);
            Arrays.fill(s, off + width, off + stride, 0f);
        }
        kernels[t].rowsForward(s, y0, y1);
    }

    private void forwardColumns(int t, int c0, int c1) {
        kernels[t].columnsForward(curSpectrum, c0, c1);
    }

    private void inverseColumns(int t, int c0, int c1) {
        kernels[t].columnsInverse(curSpectrum, c0, c1);
    }

    private void storeRows(int t, int y0, int y1) {
        float[] s = curSpectrum;
        kernels[t].rowsInverse(s, y0, y1);
        for (int y = y0; y < y1; y++) {
            System.arraycopy(s, y * stride, curReal, y * width, width);
        }
    }

    private static void check(float[] a, int n, String what) {
        if (a == null) {
            throw new IllegalArgumentException(what + " is null: pass an array of " + n + " floats");
        }
        if (a.length != n) {
            throw new IllegalArgumentException(what + " has " + a.length + " floats but this plan needs " + n
                    + ": allocate it with the plan's sizes (newSpectrum() for spectra)");
        }
    }
}
