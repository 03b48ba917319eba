package dev.nitid.psf;

/**
 * The half-maximum-region FWHM measurement behind {@link PsfFigures} (see there for the method).
 */
final class FwhmMeasure {
    /** Keys' cubic-convolution parameter (Keys 1981, IEEE Trans. ASSP 29, 1153). */
    private static final double KEYS_A = -0.5;
    /** Fewest interpolated samples across the measuring window. */
    private static final int FINE_TARGET = 600;
    /** Values below this fraction of the peak are raised to it before taking logarithms. */
    private static final double LOG_FLOOR = 1e-4;

    private FwhmMeasure() {
    }

    /** @return {major, minor, angleDeg}, NaNs when the half-maximum region reaches the image edge */
    static double[] measure(float[] a, int w, int h, int px, int py) {
        double peak = a[py * w + px];
        // Grow a window until its border is well below half maximum.
        int r = 1;
        while (true) {
            if (px - r < 0 || py - r < 0 || px + r >= w || py + r >= h) {
                return new double[] {Double.NaN, Double.NaN, Double.NaN};
            }
            double border = 0;
            for (int k = -r; k <= r; k++) {
                border = Math.max(border, Math.max(a[(py - r) * w + px + k], a[(py + r) * w + px + k]));
                border = Math.max(border, Math.max(a[(py + k) * w + px - r], a[(py + k) * w + px + r]));
            }
            if (border < 0.4 * peak) {
                break;
            }
            r++;
        }
        // Interpolate the logarithm: a Gaussian's is a quadratic, which Keys' kernel reproduces exactly, and
        // a Moffat's is far smoother than the profile itself. The floor keeps dark rings finite.
        float[] logA = new float[a.length];
        double floor = LOG_FLOOR * peak;
        for (int i = 0; i < a.length; i++) {
            logA[i] = (float) Math.log(Math.max(a[i], floor));
        }
        int side = 2 * r + 1;
        int u = Math.max(4, Math.min(64, FINE_TARGET / side));
        int nf = side * u;
        double[] f = new double[nf * nf];
        double max = peak;
        for (int j = 0; j < nf; j++) {
            double y = py - r - 0.5 + (j + 0.5) / u;
            for (int i = 0; i < nf; i++) {
                double x = px - r - 0.5 + (i + 0.5) / u;
                double v = Math.exp(interpolate(logA, w, h, x, y));
                f[j * nf + i] = v;
                max = Math.max(max, v);
            }
        }
        double half = 0.5 * max;
        double n = 0;
        double mx = 0;
        double my = 0;
        for (int j = 0; j < nf; j++) {
            for (int i = 0; i < nf; i++) {
                if (f[j * nf + i] >= half) {
                    n++;
                    mx += i;
                    my += j;
                }
            }
        }
        mx /= n;
        my /= n;
        double sxx = 0;
        double syy = 0;
        double sxy = 0;
        for (int j = 0; j < nf; j++) {
            for (int i = 0; i < nf; i++) {
                if (f[j * nf + i] >= half) {
                    double dx = i - mx;
                    double dy = j - my;
                    sxx += dx * dx;
                    syy += dy * dy;
                    sxy += dx * dy;
                }
            }
        }
        sxx = sxx / n / ((double) u * u);
        syy = syy / n / ((double) u * u);
        sxy = sxy / n / ((double) u * u);
        double tr = 0.5 * (sxx + syy);
        double det = Math.sqrt(0.25 * (sxx - syy) * (sxx - syy) + sxy * sxy);
        double l1 = tr + det;
        double l2 = Math.max(0, tr - det);
        double angle = Math.toDegrees(0.5 * Math.atan2(2 * sxy, sxx - syy));
        if (angle <= -90) {
            angle += 180;
        }
        return new double[] {4 * Math.sqrt(l1), 4 * Math.sqrt(l2), angle};
    }

    /** Keys cubic convolution at (x, y), pixel centres at integers, edges extended by clamping. */
    static double interpolate(float[] a, int w, int h, double x, double y) {
        int x0 = (int) Math.floor(x);
        int y0 = (int) Math.floor(y);
        double fx = x - x0;
        double fy = y - y0;
        double s = 0;
        for (int j = -1; j <= 2; j++) {
            double wy = keys(j - fy);
            int yy = Math.min(h - 1, Math.max(0, y0 + j));
            for (int i = -1; i <= 2; i++) {
                int xx = Math.min(w - 1, Math.max(0, x0 + i));
                s += wy * keys(i - fx) * a[yy * w + xx];
            }
        }
        return s;
    }

    private static double keys(double t) {
        t = Math.abs(t);
        if (t <= 1) {
            return ((KEYS_A + 2) * t - (KEYS_A + 3)) * t * t + 1;
        }
        if (t < 2) {
            return ((KEYS_A * t - 5 * KEYS_A) * t + 8 * KEYS_A) * t - 4 * KEYS_A;
        }
        return 0;
    }
}
