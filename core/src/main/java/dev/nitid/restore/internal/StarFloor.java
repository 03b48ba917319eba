package dev.nitid.restore.internal;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Builds the floors around bright stars used by {@link dev.nitid.restore.StarGuard}: groups of grid pixels
 * (single pixels or annuli) and the lowest mean each may take. A star is a local maximum that stands
 * {@code detectSigma}·σ above the median of the annulus around it (so bumps of a nebula are not stars).
 */
public final class StarFloor {
    /** Inner gap between the protected disc and the annulus where the local sky is measured, px (our choice). */
    public static final int SKY_GAP = 2;
    /** Width of that annulus, px (our choice: enough pixels for a median even for small discs). */
    public static final int SKY_WIDTH = 5;
    /** Smallest protected radius, px (our choice: covers the first dark ring of a well-sampled PSF). */
    public static final double MIN_RADIUS = 3.0;
    /** The PSF radius is measured where the PSF falls to this fraction of its peak (our choice). */
    public static final double PSF_EDGE_FRACTION = 1e-3;

    /**
     * The floor: groups of grid pixels whose mean must not fall below the group's floor. A group of one
     * pixel is a per-pixel clamp; a group of one annulus keeps the star's azimuthal profile above the sky
     * while leaving the noise texture alone.
     *
     * @param indices    grid pixel indices, group after group
     * @param groupStart where each group starts in {@code indices}; one extra entry at the end
     * @param groupFloor the floor of each group
     * @param starGroups for ring groups: star s owns groups {@code starGroups[s] .. starGroups[s+1]−1}; null
     *                   for per-pixel groups
     * @param coreIndices for ring groups: the core pixels of each star (r &lt; 1.5 from its centroid), star after star
     * @param coreStart  where each star's core starts in {@code coreIndices}; one extra entry at the end
     * @param stars      number of protected stars
     * @param radius     protected radius, px
     */
    public record Floor(int[] indices, int[] groupStart, float[] groupFloor, int[] starGroups, int[] coreIndices,
                        int[] coreStart, int stars, double radius) {
        /**
         * Lifts every group whose mean is below its floor by the missing amount (a single pixel is clamped).
         *
         * @param o     the estimate on the grid (input and output, modified)
         * @param added for ring groups, the light added around each star (output, modified; may be null)
         */
        public void apply(float[] o, double[] added) {
            if (starGroups == null) {
                for (int g = 0; g < groupFloor.length; g++) {
                    lift(o, g);
                }
                return;
            }
            for (int s = 0; s < stars; s++) {
                double sum = 0;
                for (int g = starGroups[s]; g < starGroups[s + 1]; g++) {
                    sum += lift(o, g);
                }
                if (added != null) {
                    added[s] = sum;
                }
            }
        }

        /**
         * Takes light back from each star's core, in proportion to each core pixel's excess over the
         * star's floor: a dark ring is light that the iteration moved into the core, so what the last
         * {@link #apply} added to a star's annuli is returned from its core, keeping the star's flux.
         *
         * @param o      the estimate on the grid (input and output, modified)
         * @param amount light to take from each star (input, not modified)
         */
        public void takeBack(float[] o, double[] amount) {
            if (starGroups == null) {
                return;
            }
            for (int s = 0; s < stars; s++) {
                if (!(amount[s] > 0)) {
                    continue;
                }
                float fl = Float.POSITIVE_INFINITY;
                for (int g = starGroups[s]; g < starGroups[s + 1]; g++) {
                    fl = Math.min(fl, groupFloor[g]);
                }
                double excess = 0;
                for (int j = coreStart[s]; j < coreStart[s + 1]; j++) {
                    excess += Math.max(0, o[coreIndices[j]] - fl);
                }
                // never take more than the core holds above the floor
                double f = excess > 0 ? Math.min(1.0, amount[s] / excess) : 0;
                for (int j = coreStart[s]; j < coreStart[s + 1]; j++) {
                    int i = coreIndices[j];
                    float e = o[i] - fl;
                    if (e > 0) {
                        o[i] -= (float) (f * e);
                    }
                }
            }
        }

        private double lift(float[] o, int g) {
            int a = groupStart[g];
            int b = groupStart[g + 1];
            double sum = 0;
            for (int j = a; j < b; j++) {
                sum += o[indices[j]];
            }
            float lift = (float) (groupFloor[g] - sum / (b - a));
            if (lift > 0) {
                for (int j = a; j < b; j++) {
                    o[indices[j]] += lift;
                }
                return (double) lift * (b - a);
            }
            return 0;
        }
    }

    private StarFloor() {
    }

    /**
     * Radius of the PSF: the largest distance from its centre pixel of a pixel at or above
     * {@link #PSF_EDGE_FRACTION} of the peak.
     *
     * @param psf    PSF pixels (input, not modified)
     * @param pw     PSF width
     * @param ph     PSF height
     * @return the radius in pixels
     */
    public static double psfRadius(float[] psf, int pw, int ph) {
        float peak = 0;
        for (float v : psf) {
            peak = Math.max(peak, v);
        }
        double r = 0;
        int cx = pw / 2;
        int cy = ph / 2;
        for (int j = 0; j < ph; j++) {
            for (int i = 0; i < pw; i++) {
                if (psf[j * pw + i] >= PSF_EDGE_FRACTION * peak) {
                    r = Math.max(r, Math.hypot(i - cx, j - cy));
                }
            }
        }
        return r;
    }

    /**
     * Finds bright stars and builds their floor.
     *
     * @param d           frame data (input, not modified); NaN/±∞ ignored
     * @param valid       per-pixel validity or null (input, not modified)
     * @param width       frame columns
     * @param height      frame rows
     * @param sky         global sky level (for detection)
     * @param sigma       sky noise σ
     * @param detectSigma detection threshold in σ above the sky
     * @param radius      protected radius, px
     * @param marginSigma how far below the local sky the floor sits, in σ
     * @param gridWidth   width of the restoration grid
     * @param padX        frame offset inside the grid, x
     * @param padY        frame offset inside the grid, y
     * @param rings       true: one group per 1-px annulus around each star; false: one group per pixel
     * @return the floor (empty if no star qualifies)
     */
    public static Floor build(float[] d, boolean[] valid, int width, int height, double sky, double sigma,
                              double detectSigma, double radius, double marginSigma, int gridWidth, int padX,
                              int padY, boolean rings) {
        double thr = sky + detectSigma * sigma;
        List<int[]> stars = new ArrayList<>();
        for (int y = 0; y < height; y++) {
            for (int x = 0; x < width; x++) {
                int i = y * width + x;
                float v = d[i];
                if (!ok(d, valid, i) || v <= thr) {
                    continue;
                }
                boolean max = true;
                for (int dy = -1; dy <= 1 && max; dy++) {
                    for (int dx = -1; dx <= 1; dx++) {
                        int xx = x + dx;
                        int yy = y + dy;
                        if ((dx != 0 || dy != 0) && xx >= 0 && yy >= 0 && xx < width && yy < height) {
                            int j = yy * width + xx;
                            // ties go to the first pixel in raster order
                            if (ok(d, valid, j) && (d[j] > v || (d[j] == v && j < i))) {
                                max = false;
                                break;
                            }
                        }
                    }
                }
                if (max) {
                    stars.add(new int[] {x, y});
                }
            }
        }
        if (stars.isEmpty()) {
            return new Floor(new int[0], new int[] {0}, new float[0], null, new int[0], new int[] {0}, 0, radius);
        }
        int ri = (int) Math.ceil(radius);
        int ro = ri + SKY_GAP + SKY_WIDTH;
        double r2 = radius * radius;
        // floor per frame pixel (min over overlapping stars); +∞ where unprotected
        float[] f = new float[width * height];
        Arrays.fill(f, Float.POSITIVE_INFINITY);
        float[] ann = new float[(2 * ro + 1) * (2 * ro + 1)];
        List<Integer> ringIdx = new ArrayList<>();
        List<Integer> ringStart = new ArrayList<>();
        List<Float> ringFloor = new ArrayList<>();
        int accepted = 0;
        List<Integer> starGroups = new ArrayList<>();
        List<Integer> core = new ArrayList<>();
        List<Integer> coreStart = new ArrayList<>();
        for (int[] s : stars) {
            int n = 0;
            for (int dy = -ro; dy <= ro; dy++) {
                for (int dx = -ro; dx <= ro; dx++) {
                    double rr = Math.hypot(dx, dy);
                    int xx = s[0] + dx;
                    int yy = s[1] + dy;
                    if (rr >= ri + SKY_GAP && rr <= ro && xx >= 0 && yy >= 0 && xx < width && yy < height
                            && ok(d, valid, yy * width + xx)) {
                        ann[n++] = d[yy * width + xx];
                    }
                }
            }
            if (n < 8) {
                continue; // too close to the edge or to masked data to measure a local sky
            }
            Arrays.sort(ann, 0, n);
            double local = (n & 1) == 1 ? ann[n / 2] : 0.5 * (ann[n / 2 - 1] + ann[n / 2]);
            if (d[s[1] * width + s[0]] - local < detectSigma * sigma) {
                continue; // a bump on a nebula or a noise peak, not a bright point source
            }
            accepted++;
            float fv = (float) (local - marginSigma * sigma);
            if (rings) {
                // sub-pixel centre by three-point Gaussian interpolation of the peak above the local sky in x
                // and in y (the log-parabola vertex; common practice, e.g. in particle-image velocimetry), so
                // the annuli follow the star's true radius: a half-pixel offset mixes the core into the rings
                double cx = s[0] + peakOffset(d, valid, width, height, s[0], s[1], 1, 0, local);
                double cy = s[1] + peakOffset(d, valid, width, height, s[0], s[1], 0, 1, local);
                starGroups.add(ringStart.size());
                coreStart.add(core.size());
                // annulus b (b ≥ 2) holds the pixels with b − 0.5 ≤ r < b + 0.5 from the centre; r < 1.5 is the core
                int[] bin = new int[(2 * ri + 5) * (2 * ri + 5)];
                int side = 2 * ri + 5;
                for (int dy = -ri - 2; dy <= ri + 2; dy++) {
                    for (int dx = -ri - 2; dx <= ri + 2; dx++) {
                        int xx = s[0] + dx;
                        int yy = s[1] + dy;
                        double rr = Math.hypot(xx - cx, yy - cy);
                        int bb = (int) Math.floor(rr + 0.5);
                        boolean inside = xx >= 0 && yy >= 0 && xx < width && yy < height;
                        bin[(dy + ri + 2) * side + dx + ri + 2] = inside ? bb : -1;
                        if (inside && rr < 1.5) {
                            core.add((yy + padY) * gridWidth + xx + padX);
                        }
                    }
                }
                for (int b = 2; b <= ri; b++) {
                    int before = ringIdx.size();
                    for (int dy = -ri - 2; dy <= ri + 2; dy++) {
                        for (int dx = -ri - 2; dx <= ri + 2; dx++) {
                            if (bin[(dy + ri + 2) * side + dx + ri + 2] == b) {
                                ringIdx.add((s[1] + dy + padY) * gridWidth + s[0] + dx + padX);
                            }
                        }
                    }
                    if (ringIdx.size() > before) {
                        ringStart.add(before);
                        ringFloor.add(fv);
                    }
                }
                continue;
            }
            for (int dy = -ri; dy <= ri; dy++) {
                for (int dx = -ri; dx <= ri; dx++) {
                    int xx = s[0] + dx;
                    int yy = s[1] + dy;
                    if (dx * dx + dy * dy <= r2 && xx >= 0 && yy >= 0 && xx < width && yy < height) {
                        int i = yy * width + xx;
                        f[i] = Math.min(f[i], fv);
                    }
                }
            }
        }
        if (rings) {
            int[] idx = ringIdx.stream().mapToInt(Integer::intValue).toArray();
            int[] start = new int[ringStart.size() + 1];
            float[] fl = new float[ringFloor.size()];
            for (int g = 0; g < fl.length; g++) {
                start[g] = ringStart.get(g);
                fl[g] = ringFloor.get(g);
            }
            start[fl.length] = idx.length;
            starGroups.add(ringStart.size());
            coreStart.add(core.size());
            int[] sg = starGroups.stream().mapToInt(Integer::intValue).toArray();
            int[] ci = core.stream().mapToInt(Integer::intValue).toArray();
            int[] cs = coreStart.stream().mapToInt(Integer::intValue).toArray();
            return new Floor(idx, start, fl, sg, ci, cs, sg.length - 1, radius);
        }
        int count = 0;
        for (float v : f) {
            if (v != Float.POSITIVE_INFINITY) {
                count++;
            }
        }
        int[] idx = new int[count];
        float[] val = new float[count];
        int k = 0;
        for (int y = 0; y < height; y++) {
            for (int x = 0; x < width; x++) {
                float v = f[y * width + x];
                if (v != Float.POSITIVE_INFINITY) {
                    idx[k] = (y + padY) * gridWidth + x + padX;
                    val[k] = v;
                    k++;
                }
            }
        }
        int[] start = new int[count + 1];
        for (int g = 0; g <= count; g++) {
            start[g] = g;
        }
        return new Floor(idx, start, val, null, new int[0], new int[] {0}, accepted, radius);
    }

    /** Vertex of the parabola through the logs of the three samples along (ax, ay), clamped to ±0.5 px. */
    private static double peakOffset(float[] d, boolean[] valid, int width, int height, int x, int y, int ax, int ay,
                                     double local) {
        int xl = x - ax;
        int yl = y - ay;
        int xr = x + ax;
        int yr = y + ay;
        if (xl < 0 || yl < 0 || xr >= width || yr >= height || !ok(d, valid, yl * width + xl)
                || !ok(d, valid, yr * width + xr)) {
            return 0;
        }
        double l = d[yl * width + xl] - local;
        double c = d[y * width + x] - local;
        double r = d[yr * width + xr] - local;
        if (!(l > 0 && c > 0 && r > 0)) {
            return 0;
        }
        double ll = Math.log(l);
        double lc = Math.log(c);
        double lr = Math.log(r);
        double den = 2 * (ll - 2 * lc + lr);
        if (!(den < 0)) {
            return 0;
        }
        return Math.max(-0.5, Math.min(0.5, (ll - lr) / den));
    }

    private static boolean ok(float[] d, boolean[] valid, int i) {
        return Float.isFinite(d[i]) && (valid == null || valid[i]);
    }
}
