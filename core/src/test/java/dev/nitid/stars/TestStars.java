package dev.nitid.stars;

/**
 * Test-side star renderer, written from the textbook formulas in rotated coordinates (independent of the
 * library's quadratic-form parametrisation): u = dx·cosθ + dy·sinθ along the major axis, v across it.
 * Gaussian: exp(−u²/2σu² − v²/2σv²), σ = FWHM/(2√(2 ln 2)) (any statistics handbook).
 * Moffat: (1 + u²/αu² + v²/αv²)^(−β), α = FWHM/(2√(2^(1/β) − 1)) (Moffat 1969; Trujillo et al. 2001, eq. 2).
 */
final class TestStars {
    private TestStars() {
    }

    /** Unit-peak profile value at offset (dx, dy); beta NaN → Gaussian. */
    static double profile(double dx, double dy, double fwhmMajor, double fwhmMinor, double angle, double beta) {
        double cs = Math.cos(angle);
        double sn = Math.sin(angle);
        double u = dx * cs + dy * sn;
        double v = -dx * sn + dy * cs;
        if (Double.isNaN(beta)) {
            double k = 2 * Math.sqrt(2 * Math.log(2));
            double su = fwhmMajor / k;
            double sv = fwhmMinor / k;
            return Math.exp(-0.5 * (u * u / (su * su) + v * v / (sv * sv)));
        }
        double k = 2 * Math.sqrt(Math.pow(2, 1 / beta) - 1);
        double au = fwhmMajor / k;
        double av = fwhmMinor / k;
        return Math.pow(1 + u * u / (au * au) + v * v / (av * av), -beta);
    }

    /**
     * Adds a star of peak {@code amp} to an image, point-sampled (sub = 1) or averaged over sub×sub midpoints
     * of each pixel, within a box of half-size {@code radius}.
     */
    static void addStar(float[] img, int w, int h, double x0, double y0, double amp, double fwhmMajor,
                        double fwhmMinor, double angle, double beta, int sub, int radius) {
        int xa = Math.max(0, (int) Math.floor(x0) - radius);
        int xb = Math.min(w - 1, (int) Math.ceil(x0) + radius);
        int ya = Math.max(0, (int) Math.floor(y0) - radius);
        int yb = Math.min(h - 1, (int) Math.ceil(y0) + radius);
        for (int y = ya; y <= yb; y++) {
            for (int x = xa; x <= xb; x++) {
                double s = 0;
                for (int j = 0; j < sub; j++) {
                    for (int i = 0; i < sub; i++) {
                        double ox = sub == 1 ? 0 : (i + 0.5) / sub - 0.5;
                        double oy = sub == 1 ? 0 : (j + 0.5) / sub - 0.5;
                        s += profile(x + ox - x0, y + oy - y0, fwhmMajor, fwhmMinor, angle, beta);
                    }
                }
                img[y * w + x] += (float) (amp * s / (sub * sub));
            }
        }
    }
}
