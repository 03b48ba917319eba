package dev.nitid.fft;

/**
 * Where every pixel of the boundary-extended image comes from, for one image size, PSF size and boundary.
 *
 * <p>The extended image has {@code extW = W + pw − 1} columns; extended column {@code xe} shows image
 * column {@code mapX[xe]} (or 0 where {@code mapX[xe] < 0}), with image column 0 at {@code xe = offX =
 * pw − 1 − ⌊pw/2⌋}. Likewise for rows. Output pixel {@code (x, y)} of the convolution reads extended
 * pixels {@code [x, x + pw − 1] × [y, y + ph − 1]}.
 */
final class Geometry {
    final int w;
    final int h;
    final int pw;
    final int ph;
    final int cx;
    final int cy;
    final int offX;
    final int offY;
    final int extW;
    final int extH;
    final int[] mapX;
    final int[] mapY;
    /** Extended rows folding onto image row {@code y}: {@code foldRows[foldStart[y] .. foldStart[y+1])}, ascending. */
    final int[] foldStart;
    final int[] foldRows;

    Geometry(int w, int h, int pw, int ph, Boundary boundary) {
        this.w = w;
        this.h = h;
        this.pw = pw;
        this.ph = ph;
        this.cx = pw / 2;
        this.cy = ph / 2;
        this.offX = pw - 1 - cx;
        this.offY = ph - 1 - cy;
        this.extW = w + pw - 1;
        this.extH = h + ph - 1;
        this.mapX = extensionMap(extW, offX, w, boundary);
        this.mapY = extensionMap(extH, offY, h, boundary);
        this.foldStart = new int[h + 1];
        int count = 0;
        for (int ye = 0; ye < extH; ye++) {
            if (mapY[ye] >= 0) {
                foldStart[mapY[ye] + 1]++;
                count++;
            }
        }
        for (int y = 0; y < h; y++) {
            foldStart[y + 1] += foldStart[y];
        }
        this.foldRows = new int[count];
        int[] fill = foldStart.clone();
        for (int ye = 0; ye < extH; ye++) {
            if (mapY[ye] >= 0) {
                foldRows[fill[mapY[ye]]++] = ye;
            }
        }
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

    /** @return true if extended row {@code ye} holds image data (false outside the grid or in a zero halo) */
    boolean rowHasData(int ye) {
        return ye >= 0 && ye < extH && mapY[ye] >= 0;
    }

    /**
     * Copies {@code n} extended pixels of row {@code ye} from column {@code xe0 ≥ 0} on; zero past the
     * extended width and in zero halos. The row must have data.
     */
    void loadExtRow(float[] in, int ye, int xe0, int n, float[] dst, int dstOff) {
        int rowStart = mapY[ye] * w;
        int end = Math.min(n, extW - xe0);
        // Columns that are the image itself (not halo) are one contiguous copy.
        int inner0 = Math.max(0, Math.min(end, offX - xe0));
        int inner1 = Math.max(inner0, Math.min(end, offX + w - xe0));
        for (int c = 0; c < inner0; c++) {
            int sx = mapX[xe0 + c];
            dst[dstOff + c] = sx >= 0 ? in[rowStart + sx] : 0f;
        }
        if (inner1 > inner0) {
            System.arraycopy(in, rowStart + xe0 + inner0 - offX, dst, dstOff + inner0, inner1 - inner0);
        }
        for (int c = inner1; c < end; c++) {
            int sx = mapX[xe0 + c];
            dst[dstOff + c] = sx >= 0 ? in[rowStart + sx] : 0f;
        }
        for (int c = Math.max(end, 0); c < n; c++) {
            dst[dstOff + c] = 0f;
        }
    }

    /**
     * The adjoint of the extension for image rows {@code [y0, y1)}: each image pixel receives the sum of
     * every extended pixel copied from it, added in a fixed order (extended row, then column, ascending)
     * so that the result never depends on how rows are split among threads.
     *
     * @param src       extended image, pixel {@code (xe, ye)} at {@code src[ye·srcStride + xe]} (input)
     * @param srcStride row stride of {@code src}
     * @param out       image (output, rows {@code [y0, y1)} overwritten)
     */
    void fold(float[] src, int srcStride, float[] out, int y0, int y1) {
        for (int y = y0; y < y1; y++) {
            int o = y * w;
            java.util.Arrays.fill(out, o, o + w, 0f);
            for (int k = foldStart[y]; k < foldStart[y + 1]; k++) {
                int s = foldRows[k] * srcStride;
                for (int xe = 0; xe < extW; xe++) {
                    int sx = mapX[xe];
                    if (sx >= 0) {
                        out[o + sx] += src[s + xe];
                    }
                }
            }
        }
    }
}
