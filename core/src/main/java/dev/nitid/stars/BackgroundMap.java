package dev.nitid.stars;

import dev.nitid.stars.internal.HistogramMedian;
import dev.nitid.stars.internal.Parallel;
import dev.nitid.image.internal.Select;

/**
 * A smooth background level and noise map from a mesh of sigma-clipped cells.
 *
 * <p>For each {@code meshSize × meshSize} cell: drop values farther than {@code k·σ} from the median and
 * repeat, with σ = 1.4826·MAD (Hampel 1974, JASA 69, 383); the cell's level is the clipped median and
 * its noise the clipped σ. Cells with too few finite pixels take the median of the valid cells. The
 * mesh is median-filtered (to remove cells biased by bright stars or small nebulae) and interpolated
 * bilinearly between cell centres. This is the common mesh approach (e.g. photutils {@code Background2D};
 * Bertin &amp; Arnouts 1996, A&amp;AS 117, 393, §3.1), simplified to the median as the level estimator.
 *
 * <p>Immutable and thread-safe.
 */
public final class BackgroundMap {
    private final int width;
    private final int height;
    private final int mesh;
    private final BackgroundSettings settings;
    private final int cellsX;
    private final int cellsY;
    private final float[] level;
    private final float[] noise;
    private final double globalNoise;
    private final double globalLevel;

    private BackgroundMap(int width, int height, int mesh, BackgroundSettings settings, int cellsX, int cellsY,
                          float[] level, float[] noise) {
        this.width = width;
        this.height = height;
        this.mesh = mesh;
        this.settings = settings;
        this.cellsX = cellsX;
        this.cellsY = cellsY;
        this.level = level;
        this.noise = noise;
        double[] l = new double[level.length];
        double[] n = new double[noise.length];
        for (int i = 0; i < l.length; i++) {
            l[i] = level[i];
            n[i] = noise[i];
        }
        this.globalLevel = Select.median(l);
        this.globalNoise = Select.median(n);
    }

    /**
     * Estimates the background of one image plane.
     *
     * @param pixels   row-major pixels, NaN = masked (input, not modified)
     * @param width    columns
     * @param height   rows
     * @param settings mesh size and clipping
     * @param threads  worker threads, ≥ 1 (the result does not depend on it)
     * @return the background map
     */
    public static BackgroundMap estimate(float[] pixels, int width, int height, BackgroundSettings settings,
                                         int threads) {
        if (pixels.length != width * height) {
            throw new IllegalArgumentException("pixels has " + pixels.length + " values for a " + width + "x"
                    + height + " image: pass width*height pixels");
        }
        int mesh = Math.min(settings.meshSize(), Math.max(width, height));
        int cx = Math.max(1, width / mesh);
        int cy = Math.max(1, height / mesh);
        float[] level = new float[cx * cy];
        float[] noise = new float[cx * cy];
        int maxCell = (width / cx + width % cx + 1) * (height / cy + height % cy + 1);
        float[][] scratch = new float[Math.max(1, threads)][maxCell];
        float[][] deviations = new float[Math.max(1, threads)][maxCell];
        HistogramMedian[] medians = new HistogramMedian[Math.max(1, threads)];
        for (int t = 0; t < medians.length; t++) {
            medians[t] = new HistogramMedian(maxCell);
        }
        Parallel.forEach(cx * cy, threads, (cell, worker) -> {
            int i = cell % cx;
            int j = cell / cx;
            // The last row/column of cells absorbs the remainder so every pixel belongs to one cell.
            int x0 = i * (width / cx);
            int x1 = i == cx - 1 ? width : x0 + width / cx;
            int y0 = j * (height / cy);
            int y1 = j == cy - 1 ? height : y0 + height / cy;
            float[] buf = scratch[worker];
            int n = 0;
            for (int y = y0; y < y1; y++) {
                int row = y * width;
                for (int x = x0; x < x1; x++) {
                    float v = pixels[row + x];
                    if (Float.isFinite(v)) {
                        buf[n++] = v;
                    }
                }
            }
            int total = (x1 - x0) * (y1 - y0);
            if (n < Math.max(8, total / 4)) {
                level[cell] = Float.NaN;
                noise[cell] = Float.NaN;
                return;
            }
            double med = 0;
            double sig = 0;
            for (int it = 0; it < settings.clipIterations(); it++) {
                med = medians[worker].median(buf, n);
                sig = madSigma(buf, n, med, deviations[worker], medians[worker]);
                if (!(sig > 0)) {
                    break;
                }
                double lo = med - settings.clipSigma() * sig;
                double hi = med + settings.clipSigma() * sig;
                int m = 0;
                for (int k = 0; k < n; k++) {
                    if (buf[k] >= lo && buf[k] <= hi) {
                        buf[m++] = buf[k];
                    }
                }
                if (m == n) {
                    break;
                }
                n = m;
            }
            level[cell] = (float) med;
            noise[cell] = (float) sig;
        });
        fillInvalid(level);
        fillInvalid(noise);
        float[] fl = medianFilter(level, cx, cy, settings.filterSize());
        float[] fn = medianFilter(noise, cx, cy, settings.filterSize());
        return new BackgroundMap(width, height, mesh, settings, cx, cy, fl, fn);
    }

    private static double madSigma(float[] v, int n, double med, float[] dev, HistogramMedian median) {
        for (int k = 0; k < n; k++) {
            dev[k] = (float) Math.abs(v[k] - med);
        }
        return Select.MAD_TO_SIGMA * median.median(dev, n);
    }

    private static void fillInvalid(float[] cells) {
        double[] valid = new double[cells.length];
        int n = 0;
        for (float c : cells) {
            if (Float.isFinite(c)) {
                valid[n++] = c;
            }
        }
        double fill = n == 0 ? 0 : Select.median(java.util.Arrays.copyOf(valid, n));
        for (int i = 0; i < cells.length; i++) {
            if (!Float.isFinite(cells[i])) {
                cells[i] = (float) fill;
            }
        }
    }

    private static float[] medianFilter(float[] in, int w, int h, int size) {
        if (size <= 1) {
            return in.clone();
        }
        int r = size / 2;
        float[] out = new float[in.length];
        float[] buf = new float[size * size];
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                int n = 0;
                for (int dy = -r; dy <= r; dy++) {
                    for (int dx = -r; dx <= r; dx++) {
                        int xx = x + dx;
                        int yy = y + dy;
                        if (xx >= 0 && yy >= 0 && xx < w && yy < h) {
                            buf[n++] = in[yy * w + xx];
                        }
                    }
                }
                out[y * w + x] = (float) Select.median(buf, n);
            }
        }
        return out;
    }

    /** @return image width this map covers */
    public int width() {
        return width;
    }

    /** @return image height this map covers */
    public int height() {
        return height;
    }

    /**
     * @return the settings the map was estimated with (a caller holding a map can check that it is the one it
     *         would have estimated itself before reusing it)
     */
    public BackgroundSettings settings() {
        return settings;
    }

    /** @return cell side in pixels */
    public int meshSize() {
        return mesh;
    }

    /** @return median of the cell levels: one number for the whole frame */
    public double globalLevel() {
        return globalLevel;
    }

    /** @return median of the cell noise values: one σ for the whole frame */
    public double globalNoise() {
        return globalNoise;
    }

    /** @return background level at pixel (x, y), bilinear between cell centres */
    public double levelAt(double x, double y) {
        return interpolate(level, x, y);
    }

    /** @return background σ at pixel (x, y), bilinear between cell centres */
    public double noiseAt(double x, double y) {
        return interpolate(noise, x, y);
    }

    private double interpolate(float[] cells, double x, double y) {
        double cw = (double) width / cellsX;
        double ch = (double) height / cellsY;
        double gx = Math.min(Math.max((x + 0.5) / cw - 0.5, 0), cellsX - 1);
        double gy = Math.min(Math.max((y + 0.5) / ch - 0.5, 0), cellsY - 1);
        int ix = Math.min((int) gx, cellsX - 1);
        int iy = Math.min((int) gy, cellsY - 1);
        int ix1 = Math.min(ix + 1, cellsX - 1);
        int iy1 = Math.min(iy + 1, cellsY - 1);
        double fx = gx - ix;
        double fy = gy - iy;
        double a = cells[iy * cellsX + ix] * (1 - fx) + cells[iy * cellsX + ix1] * fx;
        double b = cells[iy1 * cellsX + ix] * (1 - fx) + cells[iy1 * cellsX + ix1] * fx;
        return a * (1 - fy) + b * fy;
    }

    /**
     * Writes the full-resolution background level, or the data minus it.
     *
     * @param pixels   data to subtract from, or {@code null} to write the level itself (input, not modified)
     * @param out      row-major output of width×height (output, modified); may be {@code pixels}
     * @param threads  worker threads
     */
    public void subtract(float[] pixels, float[] out, int threads) {
        if (out.length != width * height || (pixels != null && pixels.length != out.length)) {
            throw new IllegalArgumentException("arrays must hold " + width + "x" + height + " pixels");
        }
        // Column positions on the cell grid, computed once: the per-pixel work is then one lerp.
        double cw = (double) width / cellsX;
        int[] ix = new int[width];
        float[] fx = new float[width];
        for (int x = 0; x < width; x++) {
            double gx = Math.min(Math.max((x + 0.5) / cw - 0.5, 0), cellsX - 1);
            ix[x] = Math.min((int) gx, cellsX - 1);
            fx[x] = (float) (gx - ix[x]);
        }
        double ch = (double) height / cellsY;
        float[][] rowCells = new float[Math.max(1, threads)][cellsX + 1];
        Parallel.forEach(height, threads, (y, worker) -> {
            double gy = Math.min(Math.max((y + 0.5) / ch - 0.5, 0), cellsY - 1);
            int iy = Math.min((int) gy, cellsY - 1);
            int iy1 = Math.min(iy + 1, cellsY - 1);
            double fy = gy - iy;
            float[] rc = rowCells[worker];
            for (int c = 0; c < cellsX; c++) {
                rc[c] = (float) (level[iy * cellsX + c] * (1 - fy) + level[iy1 * cellsX + c] * fy);
            }
            rc[cellsX] = rc[cellsX - 1];
            int row = y * width;
            for (int x = 0; x < width; x++) {
                int c = ix[x];
                float b = rc[c] + fx[x] * (rc[c + 1] - rc[c]);
                out[row + x] = pixels == null ? b : pixels[row + x] - b;
            }
        });
    }
}
