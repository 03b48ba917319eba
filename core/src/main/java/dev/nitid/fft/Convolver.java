package dev.nitid.fft;

import dev.nitid.image.Image;
import org.jtransforms.fft.FloatFFT_2D;

/**
 * Same-size linear convolution of images of one size with one PSF, and its exact adjoint.
 *
 * <h2>The PSF-centre rule</h2>
 * The PSF pixel {@code (cx, cy) = (⌊pw/2⌋, ⌊ph/2⌋)} is the centre: a PSF that is 1 there and 0 elsewhere
 * is the identity. For odd sizes this is the middle pixel. The forward operator is
 * <pre>  (K o)(x, y) = Σ_{i,j} psf(i, j) · E[o](x − (i − cx), y − (j − cy))</pre>
 * where {@code E} extends the image beyond its edges by the chosen {@link Boundary}. This matches
 * {@code scipy.ndimage.convolve} and {@code scipy.signal.convolve(mode='same')} for odd PSFs.
 *
 * <h2>The adjoint</h2>
 * {@link #correlate} applies {@code Kᵀ}, so that {@code ⟨K x, y⟩ = ⟨x, Kᵀ y⟩} holds for every boundary:
 * with the zero boundary it is plain correlation; with the others the halo is folded back onto the
 * pixels it was copied from.
 *
 * <h2>Cost</h2>
 * The plan (FFT sizes, the PSF's transfer function, scratch spectra) is built once in
 * {@link #create}; calls allocate nothing. Not thread-safe: one instance per thread of work, or one
 * instance used by one caller at a time (the instance itself uses {@code settings.threads()} workers).
 */
public final class Convolver {
    private final int width;
    private final int height;
    private final int psfWidth;
    private final int psfHeight;
    private final int fftWidth;
    private final int fftHeight;
    /** Offset of original pixel 0 inside the extended grid, per axis. */
    private final int offX;
    private final int offY;
    private final int extWidth;
    private final int extHeight;
    /** Source index of each extended column/row, or −1 where the extension is zero. */
    private final int[] mapX;
    private final int[] mapY;
    private final ConvolutionSettings settings;
    private final FloatFFT_2D fft;
    /** Transfer function of the PSF, interleaved complex, fftHeight × fftWidth. */
    private final float[] otf;
    private final float[] work;

    private Convolver(int width, int height, Image psf, ConvolutionSettings settings) {
        this.width = width;
        this.height = height;
        this.settings = settings;
        this.psfWidth = psf.width();
        this.psfHeight = psf.height();
        int cx = psfWidth / 2;
        int cy = psfHeight / 2;
        this.offX = psfWidth - 1 - cx;
        this.offY = psfHeight - 1 - cy;
        this.extWidth = width + psfWidth - 1;
        this.extHeight = height + psfHeight - 1;
        this.fftWidth = FftSizes.nextFast(extWidth);
        this.fftHeight = FftSizes.nextFast(extHeight);
        this.mapX = extensionMap(extWidth, offX, width, settings.boundary());
        this.mapY = extensionMap(extHeight, offY, height, settings.boundary());
        this.fft = new FloatFFT_2D(fftHeight, fftWidth);
        this.otf = new float[2 * fftWidth * fftHeight];
        float[] k = psf.plane(0);
        for (int j = 0; j < psfHeight; j++) {
            int yy = Math.floorMod(j - cy, fftHeight);
            for (int i = 0; i < psfWidth; i++) {
                int xx = Math.floorMod(i - cx, fftWidth);
                otf[2 * (yy * fftWidth + xx)] = k[j * psfWidth + i];
            }
        }
        fft.complexForward(otf);
        this.work = new float[2 * fftWidth * fftHeight];
    }

    /**
     * Plans the convolution of {@code width × height} images with {@code psf}.
     *
     * @param width    image columns
     * @param height   image rows
     * @param psf      the PSF, plane 0 used, centre by the rule above (input, copied into the plan)
     * @param settings boundary and threads
     * @return a plan ready to run
     * @throws IllegalArgumentException if the PSF is larger than the image, has a non-finite pixel, or sums to 0
     */
    public static Convolver create(int width, int height, Image psf, ConvolutionSettings settings) {
        if (width < 1 || height < 1) {
            throw new IllegalArgumentException("image size " + width + "x" + height + " is not positive");
        }
        if (psf.width() > width || psf.height() > height) {
            throw new IllegalArgumentException("PSF is " + psf.width() + "x" + psf.height()
                    + " but the image is " + width + "x" + height + ": crop the PSF or pad the image");
        }
        double sum = 0;
        float[] k = psf.plane(0);
        for (int i = 0; i < k.length; i++) {
            if (!Float.isFinite(k[i])) {
                throw new IllegalArgumentException("PSF pixel (" + (i % psf.width()) + ", " + (i / psf.width())
                        + ") is " + k[i] + ": a PSF must be finite everywhere");
            }
            sum += k[i];
        }
        if (sum == 0) {
            throw new IllegalArgumentException("PSF sums to 0: a PSF must have a positive total (normalise it to 1)");
        }
        return new Convolver(width, height, psf, settings);
    }

    static int[] extensionMap(int extLength, int offset, int n, Boundary boundary) {
        int[] map = new int[extLength];
        for (int e = 0; e < extLength; e++) {
            int x = e - offset;
            map[e] = switch (boundary) {
                case ZERO -> (x >= 0 && x < n) ? x : -1;
                case PERIODIC -> Math.floorMod(x, n);
                case REFLECT -> {
                    int m = Math.floorMod(x, 2 * n);
                    yield m < n ? m : 2 * n - 1 - m;
                }
            };
        }
        return map;
    }

    /** @return image columns this plan accepts */
    public int width() {
        return width;
    }

    /** @return image rows this plan accepts */
    public int height() {
        return height;
    }

    /** @return FFT columns chosen (fast size ≥ width + psfWidth − 1) */
    public int fftWidth() {
        return fftWidth;
    }

    /** @return FFT rows chosen (fast size ≥ height + psfHeight − 1) */
    public int fftHeight() {
        return fftHeight;
    }

    /** @return the settings this plan was built with */
    public ConvolutionSettings settings() {
        return settings;
    }

    /**
     * {@code out = K in}: convolves with the PSF.
     *
     * @param in  image, width × height (input, not modified)
     * @param out result, width × height (output, modified); may be the same array as {@code in}
     */
    public void convolve(float[] in, float[] out) {
        run(in, out, false);
    }

    /**
     * {@code out = Kᵀ in}: the exact adjoint of {@link #convolve} (correlation, halo folded back).
     *
     * @param in  image, width × height (input, not modified)
     * @param out result, width × height (output, modified); may be the same array as {@code in}
     */
    public void correlate(float[] in, float[] out) {
        run(in, out, true);
    }

    private void run(float[] in, float[] out, boolean adjoint) {
        checkLength(in, "in");
        checkLength(out, "out");
        java.util.Arrays.fill(work, 0f);
        if (!adjoint) {
            for (int ye = 0; ye < extHeight; ye++) {
                int sy = mapY[ye];
                if (sy < 0) {
                    continue;
                }
                int row = ye * fftWidth;
                for (int xe = 0; xe < extWidth; xe++) {
                    int sx = mapX[xe];
                    if (sx >= 0) {
                        work[2 * (row + xe)] = in[sy * width + sx];
                    }
                }
            }
        } else {
            for (int y = 0; y < height; y++) {
                int row = (y + offY) * fftWidth + offX;
                for (int x = 0; x < width; x++) {
                    work[2 * (row + x)] = in[y * width + x];
                }
            }
        }
        fft.complexForward(work);
        for (int i = 0; i < otf.length; i += 2) {
            float hr = otf[i];
            float hi = adjoint ? -otf[i + 1] : otf[i + 1];
            float wr = work[i];
            float wi = work[i + 1];
            work[i] = hr * wr - hi * wi;
            work[i + 1] = hr * wi + hi * wr;
        }
        fft.complexInverse(work, true);
        if (!adjoint) {
            for (int y = 0; y < height; y++) {
                int row = (y + offY) * fftWidth + offX;
                for (int x = 0; x < width; x++) {
                    out[y * width + x] = work[2 * (row + x)];
                }
            }
        } else {
            java.util.Arrays.fill(out, 0f);
            for (int ye = 0; ye < extHeight; ye++) {
                int sy = mapY[ye];
                if (sy < 0) {
                    continue;
                }
                int row = ye * fftWidth;
                for (int xe = 0; xe < extWidth; xe++) {
                    int sx = mapX[xe];
                    if (sx >= 0) {
                        out[sy * width + sx] += work[2 * (row + xe)];
                    }
                }
            }
        }
    }

    private void checkLength(float[] a, String name) {
        if (a.length != width * height) {
            throw new IllegalArgumentException(name + " has " + a.length + " pixels but this plan is for "
                    + width + "x" + height + " images: build a Convolver for that size");
        }
    }
}
