package dev.nitid.fft;

import dev.nitid.fft.internal.RangeTask;
import dev.nitid.fft.internal.RealFftKernel;
import dev.nitid.fft.internal.WorkerPool;
import dev.nitid.image.Image;
import java.util.Arrays;

/**
 * Convolution by one real FFT of the extended image padded to fast sizes. Rows that hold no data are
 * not transformed forward (they stay zero), and only the rows that reach the output are transformed
 * back: a pruned FFT. The column pass applies forward transform, transfer function and inverse
 * transform to each block of columns while it is in cache.
 */
final class WholePlaneEngine implements Engine {
    private final Geometry g;
    private final int fftW;
    private final int fftH;
    private final int stride;
    private final WorkerPool pool;
    private final RealFftKernel[] kernels;
    private final float[] buf;
    private final float[] otf;

    private float[] curIn;
    private float[] curOut;
    private boolean conj;
    private final RangeTask convLoad = this::convLoad;
    private final RangeTask corrLoad = this::corrLoad;
    private final RangeTask filter = this::filter;
    private final RangeTask convStore = this::convStore;
    private final RangeTask corrInverse = this::corrInverse;
    private final RangeTask fold = this::fold;

    WholePlaneEngine(Geometry g, Image psf, int threads, WorkerPool pool) {
        this.g = g;
        this.fftW = FftSizes.nextFast(g.extW);
        this.fftH = FftSizes.nextFast(g.extH);
        this.pool = pool;
        this.kernels = new RealFftKernel[threads];
        for (int t = 0; t < threads; t++) {
            kernels[t] = new RealFftKernel(fftW, fftH);
        }
        this.stride = kernels[0].stride();
        this.buf = new float[fftH * stride];
        RealFft2d.placePsf(psf, buf, fftW, fftH, stride);
        pool.run(fftH, (t, a, b) -> kernels[t].rowsForward(buf, a, b));
        pool.run(stride / 2, (t, a, b) -> kernels[t].columnsForward(buf, a, b));
        this.otf = new float[buf.length];
        kernels[0].toColumnMajor(buf, otf);
    }

    @Override
    public int fftWidth() {
        return fftW;
    }

    @Override
    public int fftHeight() {
        return fftH;
    }

    @Override
    public void convolve(float[] in, float[] out) {
        curIn = in;
        curOut = out;
        conj = false;
        try {
            pool.run(fftH, convLoad);
            pool.run(stride / 2, filter);
            pool.run(g.h, convStore);
        } finally {
            curIn = null;
            curOut = null;
        }
    }

    @Override
    public void correlate(float[] in, float[] out) {
        curIn = in;
        curOut = out;
        conj = true;
        try {
            pool.run(fftH, corrLoad);
            pool.run(stride / 2, filter);
            pool.run(g.extH, corrInverse);
            pool.run(g.h, fold);
        } finally {
            curIn = null;
            curOut = null;
        }
    }

    private void convLoad(int t, int y0, int y1) {
        for (int ye = y0; ye < y1; ye++) {
            int off = ye * stride;
            if (g.rowHasData(ye)) {
                g.loadExtRow(curIn, ye, 0, g.extW, buf, off);
                Arrays.fill(buf, off + g.extW, off + stride, 0f);
                kernels[t].rowsForward(buf, ye, ye + 1);
            } else {
                Arrays.fill(buf, off, off + stride, 0f);
            }
        }
    }

    private void corrLoad(int t, int y0, int y1) {
        for (int ye = y0; ye < y1; ye++) {
            int off = ye * stride;
            int y = ye - g.offY;
            if (y >= 0 && y < g.h) {
                Arrays.fill(buf, off, off + g.offX, 0f);
                System.arraycopy(curIn, y * g.w, buf, off + g.offX, g.w);
                Arrays.fill(buf, off + g.offX + g.w, off + stride, 0f);
                kernels[t].rowsForward(buf, ye, ye + 1);
            } else {
                Arrays.fill(buf, off, off + stride, 0f);
            }
        }
    }

    private void filter(int t, int c0, int c1) {
        kernels[t].columnsFilter(buf, c0, c1, otf, conj);
    }

    private void convStore(int t, int y0, int y1) {
        kernels[t].rowsInverse(buf, y0 + g.offY, y1 + g.offY, false);
        for (int y = y0; y < y1; y++) {
            System.arraycopy(buf, (y + g.offY) * stride + g.offX, curOut, y * g.w, g.w);
        }
    }

    private void corrInverse(int t, int y0, int y1) {
        for (int ye = y0; ye < y1; ye++) {
            if (g.mapY[ye] >= 0) {
                kernels[t].rowsInverse(buf, ye, ye + 1, false);
            }
        }
    }

    private void fold(int t, int y0, int y1) {
        g.fold(buf, stride, curOut, y0, y1);
    }

    @Override
    public void close() {
        pool.close();
    }
}
