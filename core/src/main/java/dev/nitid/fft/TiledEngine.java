package dev.nitid.fft;

import dev.nitid.fft.internal.RangeTask;
import dev.nitid.fft.internal.RealFftKernel;
import dev.nitid.fft.internal.WorkerPool;
import dev.nitid.image.Image;
import java.util.Arrays;

/**
 * Overlap-save convolution (Oppenheim &amp; Schafer, <i>Discrete-Time Signal Processing</i>, 3rd ed.
 * 2010, §8.7.3) on tiles of {@code tw × th} (fast FFT sizes). Each tile yields
 * {@code (tw − pw + 1) × (th − ph + 1)} valid outputs: the inputs it needs, output block plus a halo of
 * PSF size − 1, fit in the tile, so the circular wrap-around only lands on the discarded border.
 *
 * <p>Tiles are independent and each is transformed by one thread from start to end, so the split of
 * tiles among threads never changes the arithmetic. The adjoint computes every pixel of the extended
 * image in exactly one tile (a valid correlation of the zero-padded input), then folds the halo back
 * onto the image in a fixed order.
 */
final class TiledEngine implements Engine {
    private final Geometry g;
    private final int tw;
    private final int th;
    private final int vx;
    private final int vy;
    private final int stride;
    private final WorkerPool pool;
    private final RealFftKernel[] kernels;
    private final float[][] tiles;
    private final float[] otf;
    private final int convTilesX;
    private final int convTiles;
    private final int corrTilesX;
    private final int corrTiles;
    /** Extended-image accumulator for the adjoint, allocated on the first {@link #correlate}. */
    private float[] ext;
    /** Copy of the input when the caller convolves in place, allocated on first need. */
    private float[] inCopy;

    private float[] curIn;
    private float[] curOut;
    private final RangeTask convTask = this::convTiles;
    private final RangeTask corrTask = this::corrTiles;
    private final RangeTask fold = this::fold;

    TiledEngine(Geometry g, Image psf, int tw, int th, int threads, WorkerPool pool) {
        this.g = g;
        this.tw = tw;
        this.th = th;
        this.vx = tw - g.pw + 1;
        this.vy = th - g.ph + 1;
        this.pool = pool;
        this.kernels = new RealFftKernel[threads];
        this.tiles = new float[threads][];
        for (int t = 0; t < threads; t++) {
            kernels[t] = new RealFftKernel(tw, th);
        }
        this.stride = kernels[0].stride();
        for (int t = 0; t < threads; t++) {
            tiles[t] = new float[th * stride];
        }
        float[] b = tiles[0];
        RealFft2d.placePsf(psf, b, tw, th, stride);
        kernels[0].rowsForward(b, 0, th);
        kernels[0].columnsForward(b, 0, stride / 2);
        this.otf = new float[b.length];
        kernels[0].toColumnMajor(b, otf);
        this.convTilesX = ceilDiv(g.w, vx);
        this.convTiles = convTilesX * ceilDiv(g.h, vy);
        this.corrTilesX = ceilDiv(g.extW, vx);
        this.corrTiles = corrTilesX * ceilDiv(g.extH, vy);
    }

    private static int ceilDiv(int a, int b) {
        return (a + b - 1) / b;
    }

    @Override
    public int fftWidth() {
        return tw;
    }

    @Override
    public int fftHeight() {
        return th;
    }

    @Override
    public void convolve(float[] in, float[] out) {
        if (in == out) {
            if (inCopy == null) {
                inCopy = new float[in.length];
            }
            System.arraycopy(in, 0, inCopy, 0, in.length);
            in = inCopy;
        }
        curIn = in;
        curOut = out;
        try {
            pool.run(convTiles, convTask);
        } finally {
            curIn = null;
            curOut = null;
        }
    }

    @Override
    public void correlate(float[] in, float[] out) {
        if (ext == null) {
            if ((long) g.extW * g.extH > Integer.MAX_VALUE - 8) {
                throw new IllegalArgumentException("the extended image " + g.extW + "x" + g.extH
                        + " exceeds 2^31 pixels, too large for the adjoint: process the image in regions");
            }
            ext = new float[g.extW * g.extH];
        }
        curIn = in;
        curOut = out;
        try {
            pool.run(corrTiles, corrTask);
            pool.run(g.h, fold);
        } finally {
            curIn = null;
            curOut = null;
        }
    }

    private void convTiles(int t, int i0, int i1) {
        float[] b = tiles[t];
        RealFftKernel k = kernels[t];
        for (int i = i0; i < i1; i++) {
            int x0 = (i % convTilesX) * vx;
            int y0 = (i / convTilesX) * vy;
            int nx = Math.min(vx, g.w - x0);
            int ny = Math.min(vy, g.h - y0);
            // Inputs past the last valid output's halo only wrap onto discarded outputs: leave them zero.
            int loadW = Math.min(tw, nx + g.pw - 1);
            int loadH = Math.min(th, ny + g.ph - 1);
            int r0 = -1;
            int r1 = -1;
            for (int r = 0; r < th; r++) {
                int off = r * stride;
                int ye = y0 + r;
                if (r < loadH && g.rowHasData(ye)) {
                    g.loadExtRow(curIn, ye, x0, loadW, b, off);
                    Arrays.fill(b, off + loadW, off + stride, 0f);
                    if (r0 < 0) {
                        r0 = r;
                    }
                    r1 = r + 1;
                } else {
                    Arrays.fill(b, off, off + stride, 0f);
                }
            }
            if (r0 >= 0) {
                // Rows with data are contiguous (only ZERO halos or the tile's end are empty).
                k.rowsForward(b, r0, r1);
            }
            k.columnsFilter(b, 0, stride / 2, otf, false);
            k.rowsInverse(b, g.offY, g.offY + ny, false);
            for (int r = 0; r < ny; r++) {
                System.arraycopy(b, (g.offY + r) * stride + g.offX, curOut, (y0 + r) * g.w + x0, nx);
            }
        }
    }

    private void corrTiles(int t, int i0, int i1) {
        float[] b = tiles[t];
        RealFftKernel k = kernels[t];
        for (int i = i0; i < i1; i++) {
            int e0x = (i % corrTilesX) * vx;
            int e0y = (i / corrTilesX) * vy;
            int nx = Math.min(vx, g.extW - e0x);
            int ny = Math.min(vy, g.extH - e0y);
            int loadW = Math.min(tw, nx + g.pw - 1);
            int loadH = Math.min(th, ny + g.ph - 1);
            int sx0 = e0x - (g.pw - 1);
            int sy0 = e0y - (g.ph - 1);
            int c0 = Math.max(0, -sx0);
            int c1 = Math.min(loadW, g.w - sx0);
            int r0 = -1;
            int r1 = -1;
            for (int r = 0; r < th; r++) {
                int off = r * stride;
                int y = sy0 + r;
                if (r < loadH && y >= 0 && y < g.h && c1 > c0) {
                    Arrays.fill(b, off, off + c0, 0f);
                    System.arraycopy(curIn, y * g.w + sx0 + c0, b, off + c0, c1 - c0);
                    Arrays.fill(b, off + c1, off + stride, 0f);
                    if (r0 < 0) {
                        r0 = r;
                    }
                    r1 = r + 1;
                } else {
                    Arrays.fill(b, off, off + stride, 0f);
                }
            }
            if (r0 >= 0) {
                k.rowsForward(b, r0, r1);
            }
            k.columnsFilter(b, 0, stride / 2, otf, true);
            k.rowsInverse(b, g.cy, g.cy + ny, false);
            for (int r = 0; r < ny; r++) {
                System.arraycopy(b, (g.cy + r) * stride + g.cx, ext, (e0y + r) * g.extW + e0x, nx);
            }
        }
    }

    private void fold(int t, int y0, int y1) {
        g.fold(ext, g.extW, curOut, y0, y1);
    }

    @Override
    public void close() {
        pool.close();
    }
}
