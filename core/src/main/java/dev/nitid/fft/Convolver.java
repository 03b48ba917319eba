package dev.nitid.fft;

import dev.nitid.fft.internal.WorkerPool;
import dev.nitid.image.Image;

/**
 * Same-size linear convolution of images of one size with one PSF, and its exact adjoint.
 *
 * <h2>The PSF-centre rule</h2>
 * The PSF pixel {@code (cx, cy) = (⌊pw/2⌋, ⌊ph/2⌋)} is the centre: a PSF that is 1 there and 0 elsewhere
 * is the identity. For odd sizes this is the middle pixel. The forward operator is
 * <pre>  (K o)(x, y) = Σ_{i,j} psf(i, j) · E[o](x − (i − cx), y − (j − cy))</pre>
 * where {@code E} extends the image beyond its edges by the chosen {@link Boundary}. This matches
 * {@code scipy.ndimage.convolve} (modes {@code 'constant'}, {@code 'reflect'}, {@code 'wrap'}) for
 * odd PSFs, and {@link RealFft2d#transferFunction} uses the same centre.
 *
 * <h2>The adjoint</h2>
 * {@link #correlate} applies {@code Kᵀ}, so that {@code ⟨K x, y⟩ = ⟨x, Kᵀ y⟩} holds for every boundary:
 * with the zero boundary it is plain correlation; with the others the halo is folded back onto the
 * pixels it was copied from.
 *
 * <h2>How it is computed</h2>
 * Either one real FFT of the extended image ({@code W + pw − 1} × {@code H + ph − 1}) padded to the
 * next fast size ({@link FftSizes#nextFast}; {@link #fftWidth()}/{@link #fftHeight()} report it), or
 * overlap-save tiles of a power-of-two size with a halo of PSF size − 1 ({@link Tiling}). With
 * {@link Tiling#AUTO} the rule is: tiles when the whole-plane FFT grid has at least 768² pixels
 * and a tile smaller than it exists, the whole plane otherwise. The tile side per axis is the power
 * of two in [128, 1024] minimising {@code ⌈n/(T − p + 1)⌉ · T · (log₂T + 3.5)}. Measured on one
 * thread (CPU time, {@code notes/fft.md}): 1024² image, 31² PSF: whole 49 ms, 256² tiles 22 ms;
 * 4096²: whole 491 ms, tiles 303 ms; 512²: whole 9.0 ms, tiles 9.5 ms.
 *
 * <h2>Cost, memory and threads</h2>
 * The plan (FFT sizes, the PSF's transfer function, scratch) is built once in {@link #create}. The
 * tiled path allocates nothing per call once it has made, on first need, an extended-image buffer
 * (first {@link #correlate}) and a copy of the input (first in-place {@link #convolve}); the whole-plane
 * path allocates no image-sized array, but JTransforms' mixed-radix code allocates one scratch row per
 * 1-D transform on grids that are not powers of two. Working memory beyond input and output for a
 * 4096² image and a 31² PSF: whole plane 2.2 planes (spectrum and transfer function on 4320²); tiled
 * 0.1 plane, plus 1 plane once {@link #correlate} or an in-place call has run.
 * Results are bit-identical whatever {@code settings.threads()}: every row, column or tile is computed
 * by the same code on one thread. The worker threads are daemons; {@link #close()} stops them at once
 * (an unreachable plan stops them too). Not thread-safe: one caller at a time.
 */
public final class Convolver implements AutoCloseable {
    /** Smallest whole-plane FFT grid (pixels) for which {@link Tiling#AUTO} chooses tiles: 768². */
    static final long AUTO_TILE_MIN_PIXELS = 768L * 768;
    /** Smallest tile side considered: below it per-tile overhead dominates (measured, notes/fft.md). */
    static final int MIN_TILE = 128;
    /** Largest tile side considered (pixels): 1024 × 1026 floats ≈ 4 MB, about a last-level cache. */
    static final int MAX_TILE = 1024;
    /** Per-row cost of a tile in units of one radix-2 stage, fitted to the measurements in notes/fft.md. */
    static final double TILE_OVERHEAD = 3.5;

    private final int width;
    private final int height;
    private final ConvolutionSettings settings;
    private final Engine engine;
    private final boolean tiled;

    private Convolver(int width, int height, Image psf, ConvolutionSettings settings, int forceTileW,
                      int forceTileH) {
        this.width = width;
        this.height = height;
        this.settings = settings;
        Geometry g = new Geometry(width, height, psf.width(), psf.height(), settings.boundary());
        int fftW = FftSizes.nextFast(g.extW);
        int fftH = FftSizes.nextFast(g.extH);
        int tw = forceTileW > 0 ? forceTileW : tileSize(width, psf.width(), fftW);
        int th = forceTileH > 0 ? forceTileH : tileSize(height, psf.height(), fftH);
        boolean canTile = tw < fftW || th < fftH;
        this.tiled = switch (settings.tiling()) {
            case WHOLE_PLANE -> false;
            case TILED -> true;
            case AUTO -> canTile && (long) fftW * fftH >= AUTO_TILE_MIN_PIXELS;
        };
        if (!tiled && (long) fftH * (fftW + 2) > Integer.MAX_VALUE - 8) {
            throw new IllegalArgumentException("the whole-plane FFT grid " + fftW + "x" + fftH
                    + " exceeds 2^31 floats: use Tiling.TILED or AUTO");
        }
        WorkerPool pool = new WorkerPool(settings.threads());
        try {
            this.engine = tiled
                    ? new TiledEngine(g, psf, tw, th, settings.threads(), pool)
                    : new WholePlaneEngine(g, psf, settings.threads(), pool);
        } catch (RuntimeException | Error e) {
            pool.close();
            throw e;
        }
    }

    /**
     * The tile side for one axis: the power of two {@code T} in [{@value #MIN_TILE}, {@value #MAX_TILE}]
     * (and {@code T ≥ 2p}) minimising {@code ⌈n/(T − p + 1)⌉ · T · (log₂T + }{@value #TILE_OVERHEAD}{@code )};
     * the whole-plane size if no such tile is smaller than it. Powers of two because JTransforms' split-radix
     * code runs them 1.5–2× faster per {@code n log n} than its mixed-radix code (measured in notes/fft.md);
     * the constant term stands for per-row work (copies, multiply) and was fitted to the same measurements.
     */
    static int tileSize(int n, int p, int whole) {
        int best = whole;
        double bestCost = Double.POSITIVE_INFINITY;
        for (int t = MIN_TILE; t <= MAX_TILE && t < whole; t *= 2) {
            if (t < 2 * p) {
                continue;
            }
            int valid = t - p + 1;
            double cost = Math.ceil((double) n / valid) * t * (Math.log(t) / Math.log(2) + TILE_OVERHEAD);
            if (cost <= bestCost) {
                bestCost = cost;
                best = t;
            }
        }
        return best;
    }

    /**
     * Plans the convolution of {@code width × height} images with {@code psf}.
     *
     * @param width    image columns
     * @param height   image rows
     * @param psf      the PSF, plane 0 used, centre by the rule above (input, copied into the plan)
     * @param settings boundary, threads and tiling
     * @return a plan ready to run
     * @throws IllegalArgumentException if the PSF is larger than the image, has a non-finite pixel, or sums to 0
     */
    public static Convolver create(int width, int height, Image psf, ConvolutionSettings settings) {
        Checks.psfUsable(psf, width, height);
        if (settings == null) {
            throw new IllegalArgumentException("settings is null: pass ConvolutionSettings.defaults()");
        }
        return new Convolver(width, height, psf, settings, 0, 0);
    }

    /** A tiled plan with the given tile sizes (each ≥ the PSF size), for tests of many small tiles. */
    static Convolver createTiled(int width, int height, Image psf, ConvolutionSettings settings, int tw, int th) {
        Checks.psfUsable(psf, width, height);
        if (tw < psf.width() || th < psf.height()) {
            throw new IllegalArgumentException("tile " + tw + "x" + th + " is smaller than the PSF");
        }
        return new Convolver(width, height, psf, settings.withTiling(Tiling.TILED), tw, th);
    }

    /** @return image columns this plan accepts */
    public int width() {
        return width;
    }

    /** @return image rows this plan accepts */
    public int height() {
        return height;
    }

    /**
     * @return FFT columns chosen: a fast size ≥ width + psfWidth − 1 for the whole plane, or the tile
     *         width when {@link #tiled()}
     */
    public int fftWidth() {
        return engine.fftWidth();
    }

    /** @return FFT rows chosen: as {@link #fftWidth()}, for rows */
    public int fftHeight() {
        return engine.fftHeight();
    }

    /** @return true if this plan runs in overlap-save tiles, false if on the whole padded plane */
    public boolean tiled() {
        return tiled;
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
        checkLength(in, "in");
        checkLength(out, "out");
        engine.convolve(in, out);
    }

    /**
     * {@code out = Kᵀ in}: the exact adjoint of {@link #convolve} (correlation, halo folded back).
     *
     * @param in  image, width × height (input, not modified)
     * @param out result, width × height (output, modified); may be the same array as {@code in}
     */
    public void correlate(float[] in, float[] out) {
        checkLength(in, "in");
        checkLength(out, "out");
        engine.correlate(in, out);
    }

    /** Stops this plan's worker threads; the plan must not be used afterwards. Idempotent. */
    @Override
    public void close() {
        engine.close();
    }

    private void checkLength(float[] a, String name) {
        if (a == null) {
            throw new IllegalArgumentException(name + " is null: pass an array of width*height floats");
        }
        if (a.length != width * height) {
            throw new IllegalArgumentException(name + " has " + a.length + " pixels but this plan is for "
                    + width + "x" + height + " images: build a Convolver for that size");
        }
    }
}
