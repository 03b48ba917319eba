package dev.nitid.fft.internal;

import org.jtransforms.fft.FloatFFT_1D;

/**
 * The passes of a 2-D real FFT on one thread, composed from JTransforms' 1-D plans.
 *
 * <h2>Layout of the buffer every pass works on</h2>
 * {@code height} rows of {@code stride = 2·(width/2 + 1)} floats. Before {@link #rowsForward} (and after
 * {@link #rowsInverse}) row {@code y} holds the real samples in its first {@code width} floats; in
 * between it holds the half spectrum {@code X(kx, y)}, {@code 0 ≤ kx ≤ width/2}, as interleaved
 * {@code (re, im)} pairs, which the column passes then transform along {@code y}. This is the packing
 * documented on {@link dev.nitid.fft.RealFft2d}.
 *
 * <p>Each instance owns its 1-D plans and its column scratch, so one instance serves one thread; a plan
 * that runs on {@code T} threads holds {@code T} kernels. Row and column transforms are independent of
 * each other, so splitting rows or columns among threads never changes the arithmetic.
 *
 * <p>JTransforms' mixed-radix 1-D code (lengths with factors 2, 3, 4, 5) allocates one scratch array of
 * the transform length per call and never starts threads. Its power-of-two and Bluestein code may use
 * its own (daemon) thread pool for lengths above {@code CommonUtils.getThreadsBeginN_1D_FFT_2Threads()}
 * (8192 by default); that pool splits the same butterflies, so results do not change.
 */
public final class RealFftKernel {
    /** Complex columns gathered per cache pass: 8 pairs are one 64-byte line of each row. */
    private static final int BLOCK = 8;

    private final int width;
    private final int height;
    private final int stride;
    private final FloatFFT_1D rowFft;
    private final FloatFFT_1D colFft;
    private final float[] cols;
    /**
     * What an unscaled row inverse multiplies by: {@code width} for most plans, but JTransforms'
     * power-of-two real inverse, unscaled, returns {@code width/2} times the input (its split-radix
     * convention; checked here on a delta rather than assumed).
     */
    private final double rowInverseGain;

    /**
     * Plans the 1-D transforms.
     *
     * @param width  real samples per row, ≥ 1
     * @param height rows, ≥ 1
     */
    public RealFftKernel(int width, int height) {
        this.width = width;
        this.height = height;
        this.stride = 2 * (width / 2 + 1);
        this.rowFft = width > 1 ? new FloatFFT_1D(width) : null;
        this.colFft = height > 1 ? new FloatFFT_1D(height) : null;
        this.cols = new float[BLOCK * 2 * height];
        if (width > 1) {
            float[] delta = new float[stride];
            delta[0] = 1f;
            rowFft.realForward(delta);
            rowFft.realInverse(delta, false);
            this.rowInverseGain = Math.abs(delta[0] - width) <= Math.abs(delta[0] - width / 2.0) ? width : width / 2.0;
        } else {
            this.rowInverseGain = 1;
        }
    }

    /** @return floats per buffer row, {@code 2·(width/2 + 1)} */
    public int stride() {
        return stride;
    }

    /**
     * Real rows → half-spectrum rows, in place, for rows {@code [y0, y1)}.
     *
     * @param buf the buffer (input and output, modified)
     * @param y0  first row
     * @param y1  end row, exclusive
     */
    public void rowsForward(float[] buf, int y0, int y1) {
        int n = width;
        for (int y = y0; y < y1; y++) {
            int off = y * stride;
            if (n == 1) {
                buf[off + 1] = 0f;
                continue;
            }
            rowFft.realForward(buf, off);
            // JTransforms packs Re X(n/2) (n even) or Im X((n-1)/2) (n odd) into slot 1; move it out.
            if ((n & 1) == 0) {
                buf[off + n] = buf[off + 1];
                buf[off + n + 1] = 0f;
            } else {
                buf[off + n] = buf[off + 1];
            }
            buf[off + 1] = 0f;
        }
    }

    /**
     * Half-spectrum rows → real rows, in place, for rows {@code [y0, y1)}, scaled by {@code 1/width}.
     * The imaginary parts of the {@code kx = 0} (and, for even widths, {@code kx = width/2}) terms are
     * ignored, as for any Hermitian spectrum.
     *
     * @param buf the buffer (input and output, modified)
     * @param y0  first row
     * @param y1  end row, exclusive
     */
    public void rowsInverse(float[] buf, int y0, int y1) {
        rowsInverse(buf, y0, y1, true);
    }

    /**
     * As {@link #rowsInverse(float[], int, int)}, optionally unnormalised (for callers that fold the
     * normalisation into a transfer function with {@link #toColumnMajor}; the unnormalised gain is
     * {@code width}, or {@code width/2} for JTransforms' power-of-two plans).
     *
     * @param buf   the buffer (input and output, modified)
     * @param y0    first row
     * @param y1    end row, exclusive
     * @param scale true to normalise (divide by {@code width})
     */
    public void rowsInverse(float[] buf, int y0, int y1, boolean scale) {
        int n = width;
        if (n == 1) {
            return;
        }
        for (int y = y0; y < y1; y++) {
            int off = y * stride;
            buf[off + 1] = buf[off + n];
            rowFft.realInverse(buf, off, scale);
        }
    }

    /**
     * Forward complex transform of columns {@code [c0, c1)} of the half spectrum, in place.
     *
     * @param buf the buffer (input and output, modified)
     * @param c0  first complex column
     * @param c1  end column, exclusive
     */
    public void columnsForward(float[] buf, int c0, int c1) {
        columns(buf, c0, c1, null, 0, false);
    }

    /**
     * Inverse complex transform of columns {@code [c0, c1)}, in place, scaled by {@code 1/height}.
     *
     * @param buf the buffer (input and output, modified)
     * @param c0  first complex column
     * @param c1  end column, exclusive
     */
    public void columnsInverse(float[] buf, int c0, int c1) {
        columns(buf, c0, c1, null, 0, true);
    }

    /**
     * For columns {@code [c0, c1)}: forward transform, multiply by the transfer function (or its complex
     * conjugate), inverse transform without the {@code 1/height} factor, all while the columns sit in
     * cache. The caller folds the normalisation into {@code otf} (see {@link #toColumnMajor}).
     *
     * @param buf  the buffer, rows already forward-transformed (input and output, modified)
     * @param c0   first complex column
     * @param c1   end column, exclusive
     * @param otf  transfer function stored column by column: column {@code c} is {@code otf[c·2·height ..]},
     *             interleaved (re, im) over {@code ky} (input, not modified)
     * @param conj true to multiply by the conjugate (correlation, the adjoint)
     */
    public void columnsFilter(float[] buf, int c0, int c1, float[] otf, boolean conj) {
        columns(buf, c0, c1, otf, conj ? -1 : 1, false);
    }

    private void columns(float[] buf, int c0, int c1, float[] otf, int sign, boolean inverse) {
        int h2 = 2 * height;
        for (int c = c0; c < c1; c += BLOCK) {
            int nb = Math.min(BLOCK, c1 - c);
            int w2 = 2 * nb;
            for (int y = 0; y < height; y++) {
                int src = y * stride + 2 * c;
                int dst = 2 * y;
                for (int b = 0; b < w2; b += 2) {
                    cols[dst] = buf[src + b];
                    cols[dst + 1] = buf[src + b + 1];
                    dst += h2;
                }
            }
            for (int b = 0; b < nb; b++) {
                int off = b * h2;
                if (otf == null) {
                    if (colFft != null) {
                        if (inverse) {
                            colFft.complexInverse(cols, off, true);
                        } else {
                            colFft.complexForward(cols, off);
                        }
                    }
                } else {
                    if (colFft != null) {
                        colFft.complexForward(cols, off);
                    }
                    multiply(cols, off, otf, (c + b) * h2, h2, sign);
                    if (colFft != null) {
                        colFft.complexInverse(cols, off, false);
                    }
                }
            }
            for (int y = 0; y < height; y++) {
                int dst = y * stride + 2 * c;
                int src = 2 * y;
                for (int b = 0; b < w2; b += 2) {
                    buf[dst + b] = cols[src];
                    buf[dst + b + 1] = cols[src + 1];
                    src += h2;
                }
            }
        }
    }

    private static void multiply(float[] a, int aOff, float[] h, int hOff, int len, int sign) {
        for (int i = 0; i < len; i += 2) {
            float hr = h[hOff + i];
            float hi = sign * h[hOff + i + 1];
            float ar = a[aOff + i];
            float ai = a[aOff + i + 1];
            a[aOff + i] = hr * ar - hi * ai;
            a[aOff + i + 1] = hr * ai + hi * ar;
        }
    }

    /**
     * Copies a half spectrum in the row layout into the column-by-column layout that
     * {@link #columnsFilter} reads, multiplied by the inverse of the unscaled passes' gain (normally
     * {@code 1/(width·height)}) so that {@link #columnsFilter} followed by {@code rowsInverse(.., false)}
     * gives the normalised result; the factor is exact in float for power-of-two grids.
     *
     * @param spectrum half spectrum, {@code height × stride} (input, not modified)
     * @param otf      column-major copy, {@code (width/2 + 1) · 2·height} floats (output, modified)
     */
    public void toColumnMajor(float[] spectrum, float[] otf) {
        int cw = stride / 2;
        int h2 = 2 * height;
        float norm = (float) (1.0 / (rowInverseGain * height));
        for (int y = 0; y < height; y++) {
            for (int c = 0; c < cw; c++) {
                otf[c * h2 + 2 * y] = spectrum[y * stride + 2 * c] * norm;
                otf[c * h2 + 2 * y + 1] = spectrum[y * stride + 2 * c + 1] * norm;
            }
        }
    }
}
