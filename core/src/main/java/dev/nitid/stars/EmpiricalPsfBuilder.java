package dev.nitid.stars;

import dev.nitid.image.Image;
import dev.nitid.image.internal.Select;
import java.util.ArrayList;
import java.util.List;

/**
 * Stacks normalised star stamps into an oversampled effective PSF (Anderson &amp; King 2000, PASP 112, 1360,
 * §3–4). Each node of the grid takes the 3σ-clipped mean of the samples that fall on it, weighted by each
 * star's inverse variance (flux/σ_sky)². The noise is estimated by splitting the stars into two halves
 * (alternating by brightness), stacking each, and taking half their difference: for independent halves
 * {@code Var(mean) = Var(A − B)/4} (split-half estimate, common practice, no source).
 */
final class EmpiricalPsfBuilder {
    /** Clipping threshold, in σ (from the MAD), for the samples of one node (common practice, no source). */
    private static final double CLIP = 3.0;

    private EmpiricalPsfBuilder() {
    }

    static EmpiricalPsf build(List<MeasuredStar> stars, ProfileShape best, float[] resid, int w, int h,
                              BackgroundMap bg, MeasureSettings s) {
        int r = s.stampRadius();
        int os = s.psfOversampling();
        List<MeasuredStar> bySnr = new ArrayList<>(stars);
        bySnr.sort((a, b) -> Double.compare(b.snr(), a.snr()));
        int box = 2 * r + 1;
        List<float[]> norm = new ArrayList<>();
        List<double[]> meta = new ArrayList<>();
        for (MeasuredStar m : bySnr) {
            if (norm.size() >= s.psfStars()) {
                break;
            }
            StarProfile p = m.profile(best) != null ? m.profile(best) : m.gaussian();
            int cx = (int) Math.round(p.x());
            int cy = (int) Math.round(p.y());
            if (cx - r < 0 || cy - r < 0 || cx + r >= w || cy + r >= h) {
                continue;
            }
            double local = p.background() - bg.levelAt(cx, cy);
            float[] st = new float[box * box];
            double sum = 0;
            boolean ok = true;
            for (int j = 0; j < box && ok; j++) {
                for (int i = 0; i < box; i++) {
                    float v = resid[(cy - r + j) * w + cx - r + i];
                    if (v != v) {
                        ok = false;
                        break;
                    }
                    st[j * box + i] = (float) (v - local);
                    sum += v - local;
                }
            }
            if (!ok || !(sum > 0)) {
                continue;
            }
            for (int i = 0; i < st.length; i++) {
                st[i] /= (float) sum;
            }
            norm.add(st);
            double sig = bg.noiseAt(cx, cy);
            meta.add(new double[] {p.x() - (cx - r), p.y() - (cy - r), (sum / sig) * (sum / sig)});
        }
        if (norm.isEmpty()) {
            return null;
        }
        int k = norm.size();
        int[] all = new int[k];
        int[] even = new int[(k + 1) / 2];
        int[] odd = new int[k / 2];
        for (int i = 0; i < k; i++) {
            all[i] = i;
            if ((i & 1) == 0) {
                even[i / 2] = i;
            } else {
                odd[i / 2] = i;
            }
        }
        float[] grid = stack(norm, meta, all, r, os);
        float[] sampled = sample(grid, r, os, true);
        float[] noise = new float[box * box];
        double noiseToPeak = Double.NaN;
        double peak = 0;
        for (float v : sampled) {
            peak = Math.max(peak, v);
        }
        if (odd.length >= 1) {
            float[] a = sample(stack(norm, meta, even, r, os), r, os, false);
            float[] b = sample(stack(norm, meta, odd, r, os), r, os, false);
            double ss = 0;
            int n = 0;
            for (int i = 0; i < noise.length; i++) {
                noise[i] = (float) (0.5 * Math.abs(a[i] - b[i]));
                if (sampled[i] >= 0.5 * peak) {
                    ss += (double) noise[i] * noise[i];
                    n++;
                }
            }
            noiseToPeak = n > 0 ? Math.sqrt(ss / n) / peak : Double.NaN;
        } else {
            java.util.Arrays.fill(noise, Float.NaN);
        }
        // Scale the oversampled grid so that its whole-pixel nodes sum to 1, like the sampled PSF.
        float[] raw = sample(grid, r, os, false);
        double rawSum = 0;
        for (float v : raw) {
            rawSum += v;
        }
        int n = 2 * r * os + 1;
        float[] over = new float[n * n];
        for (int i = 0; i < over.length; i++) {
            over[i] = (float) (grid[i] / rawSum);
        }
        return new EmpiricalPsf(Image.wrap(box, box, sampled), Image.wrap(n, n, over), os, k, noiseToPeak,
                Image.wrap(box, box, noise));
    }

    /** Whole-pixel nodes of the grid, normalised to sum 1; negatives set to 0 when {@code clip}. */
    private static float[] sample(float[] grid, int r, int os, boolean clip) {
        int box = 2 * r + 1;
        int half = r * os;
        int n = 2 * half + 1;
        float[] out = new float[box * box];
        double sum = 0;
        for (int j = 0; j < box; j++) {
            for (int i = 0; i < box; i++) {
                float v = grid[(half + (j - r) * os) * n + half + (i - r) * os];
                // A PSF is a distribution of light: negative wings are noise and break the restorers'
                // positivity, so the recommended PSF sets them to zero before normalising.
                if (clip) {
                    v = Math.max(0f, v);
                }
                out[j * box + i] = v;
                sum += v;
            }
        }
        for (int i = 0; i < out.length; i++) {
            out[i] = (float) (out[i] / sum);
        }
        return out;
    }

    /** The oversampled grid from the chosen stars. */
    private static float[] stack(List<float[]> norm, List<double[]> meta, int[] use, int r, int os) {
        int box = 2 * r + 1;
        int half = r * os;
        int n = 2 * half + 1;
        int[] count = new int[n * n];
        int[][] node = new int[use.length][box * box];
        for (int u = 0; u < use.length; u++) {
            double[] c = meta.get(use[u]);
            for (int j = 0; j < box; j++) {
                for (int i = 0; i < box; i++) {
                    int gu = half + (int) Math.round((i - c[0]) * os);
                    int gv = half + (int) Math.round((j - c[1]) * os);
                    int id = (gu < 0 || gv < 0 || gu >= n || gv >= n) ? -1 : gv * n + gu;
                    node[u][j * box + i] = id;
                    if (id >= 0) {
                        count[id]++;
                    }
                }
            }
        }
        int[] start = new int[n * n + 1];
        for (int i = 0; i < n * n; i++) {
            start[i + 1] = start[i] + count[i];
        }
        float[] samples = new float[start[n * n]];
        double[] weights = new double[start[n * n]];
        int[] fill = new int[n * n];
        for (int u = 0; u < use.length; u++) {
            float[] st = norm.get(use[u]);
            double wk = meta.get(use[u])[2];
            for (int i = 0; i < st.length; i++) {
                int id = node[u][i];
                if (id >= 0) {
                    weights[start[id] + fill[id]] = wk;
                    samples[start[id] + fill[id]++] = st[i];
                }
            }
        }
        float[] grid = new float[n * n];
        boolean[] empty = new boolean[n * n];
        float[] tmp = new float[Math.max(1, use.length)];
        for (int id = 0; id < n * n; id++) {
            int c = count[id];
            if (c == 0) {
                empty[id] = true;
                continue;
            }
            System.arraycopy(samples, start[id], tmp, 0, c);
            double med = Select.median(tmp, c);
            for (int i = 0; i < c; i++) {
                tmp[i] = (float) Math.abs(samples[start[id] + i] - med);
            }
            double mad = Select.MAD_TO_SIGMA * Select.median(tmp, c);
            double sw = 0;
            double swv = 0;
            for (int i = start[id]; i < start[id] + c; i++) {
                if (mad > 0 && Math.abs(samples[i] - med) > CLIP * mad) {
                    continue;
                }
                sw += weights[i];
                swv += weights[i] * samples[i];
            }
            grid[id] = (float) (sw > 0 ? swv / sw : med);
        }
        // Nodes no star reached (few stars, corners): mean of the filled 8-neighbours, repeated outward.
        for (int pass = 0; pass < n; pass++) {
            boolean changed = false;
            boolean[] now = empty.clone();
            for (int id = 0; id < n * n; id++) {
                if (!empty[id]) {
                    continue;
                }
                int u = id % n;
                int v = id / n;
                double acc = 0;
                int m = 0;
                for (int dv = -1; dv <= 1; dv++) {
                    for (int du = -1; du <= 1; du++) {
                        int uu = u + du;
                        int vv = v + dv;
                        if (uu >= 0 && vv >= 0 && uu < n && vv < n && !empty[vv * n + uu]) {
                            acc += grid[vv * n + uu];
                            m++;
                        }
                    }
                }
                if (m > 0) {
                    grid[id] = (float) (acc / m);
                    now[id] = false;
                    changed = true;
                }
            }
            empty = now;
            if (!changed) {
                break;
            }
        }
        return grid;
    }
}
