package dev.nitid.synth.internal;

import java.util.SplittableRandom;

/**
 * Draws the unblurred extended structure of a synthetic field — a smooth nebula of Gaussian clouds clustered
 * around one centre,
 * fine filaments along smooth random curves, and elliptical exponential discs for galaxies — onto a
 * canvas that may be larger than the field (the field's pixel (0, 0) is canvas pixel (pad, pad)).
 */
public final class ExtendedRenderer {
    /** Number of broad clouds summed into the nebula. */
    static final int CLOUDS = 6;
    /** Spread of the cloud centres around the nebula's centre, in units of the field's smaller side. */
    static final double CLUSTER_SPREAD = 0.12;
    /** Sampling step along a filament in pixels: fine enough that the splats merge into a smooth line. */
    static final double FILAMENT_STEP = 0.25;

    private ExtendedRenderer() {
    }

    /**
     * Adds a nebula whose maximum over the canvas is {@code peak}.
     *
     * @param canvas canvas pixels (output, modified: added to)
     * @param cw     canvas width
     * @param ch     canvas height
     * @param pad    field offset inside the canvas
     * @param fw     field width
     * @param fh     field height
     * @param peak   brightness of the brightest nebula pixel
     * @param rnd    random source (modified: advanced)
     */
    public static void nebula(float[] canvas, int cw, int ch, int pad, int fw, int fh, double peak,
                              SplittableRandom rnd) {
        double[] cx = new double[CLOUDS];
        double[] cy = new double[CLOUDS];
        double[] inv2s2 = new double[CLOUDS];
        double[] amp = new double[CLOUDS];
        double side = Math.min(fw, fh);
        // The clouds cluster around one centre in the middle half of the field, so that the nebula covers
        // part of the field and leaves dark sky elsewhere, as a real nebula in a wider field does.
        double nx = pad + fw * rnd.nextDouble(0.25, 0.75);
        double ny = pad + fh * rnd.nextDouble(0.25, 0.75);
        for (int k = 0; k < CLOUDS; k++) {
            cx[k] = nx + CLUSTER_SPREAD * side * rnd.nextGaussian();
            cy[k] = ny + CLUSTER_SPREAD * side * rnd.nextGaussian();
            double s = side * rnd.nextDouble(0.04, 0.12);
            inv2s2[k] = 1 / (2 * s * s);
            amp[k] = rnd.nextDouble(0.3, 1.0);
        }
        double[] tmp = new double[cw * ch];
        double max = 0;
        for (int y = 0; y < ch; y++) {
            for (int x = 0; x < cw; x++) {
                double v = 0;
                for (int k = 0; k < CLOUDS; k++) {
                    double ddx = x - cx[k];
                    double ddy = y - cy[k];
                    v += amp[k] * Math.exp(-(ddx * ddx + ddy * ddy) * inv2s2[k]);
                }
                tmp[y * cw + x] = v;
                max = Math.max(max, v);
            }
        }
        double scale = max > 0 ? peak / max : 0;
        for (int i = 0; i < tmp.length; i++) {
            canvas[i] += (float) (tmp[i] * scale);
        }
    }

    /**
     * Adds {@code count} filaments with a Gaussian cross-section of the given FWHM; each filament's peak
     * across its length is between half and all of {@code peak}, fading to zero at both ends.
     *
     * @param canvas canvas pixels (output, modified: added to)
     * @param cw     canvas width
     * @param ch     canvas height
     * @param pad    field offset inside the canvas
     * @param fw     field width
     * @param fh     field height
     * @param count  number of filaments
     * @param peak   brightest cross-section peak
     * @param fwhm   cross-section FWHM in pixels
     * @param rnd    random source (modified: advanced)
     */
    public static void filaments(float[] canvas, int cw, int ch, int pad, int fw, int fh, int count,
                                 double peak, double fwhm, SplittableRandom rnd) {
        double sigma = fwhm / AnalyticProfiles.GAUSS_FWHM_PER_SIGMA;
        double inv2s2 = 1 / (2 * sigma * sigma);
        int radius = (int) Math.ceil(4 * sigma) + 1;
        // A line of Gaussian splats of weight w·ds has the cross-section w·√(2π)·σ·exp(−d²/2σ²).
        double perLength = 1 / (Math.sqrt(2 * Math.PI) * sigma);
        double side = Math.min(fw, fh);
        for (int f = 0; f < count; f++) {
            double x = pad + rnd.nextDouble(0, fw);
            double y = pad + rnd.nextDouble(0, fh);
            double heading = rnd.nextDouble(0, 2 * Math.PI);
            double curvature = rnd.nextDouble(-0.02, 0.02);
            double length = side * rnd.nextDouble(0.2, 0.5);
            double brightness = peak * rnd.nextDouble(0.5, 1.0);
            int steps = (int) Math.ceil(length / FILAMENT_STEP);
            for (int s = 0; s <= steps; s++) {
                double taper = Math.sin(Math.PI * s / steps);
                double w = brightness * taper * perLength * FILAMENT_STEP;
                int x0 = (int) Math.round(x);
                int y0 = (int) Math.round(y);
                for (int j = Math.max(0, y0 - radius); j <= Math.min(ch - 1, y0 + radius); j++) {
                    double ddy = j - y;
                    for (int i = Math.max(0, x0 - radius); i <= Math.min(cw - 1, x0 + radius); i++) {
                        double ddx = i - x;
                        canvas[j * cw + i] += (float) (w * Math.exp(-(ddx * ddx + ddy * ddy) * inv2s2));
                    }
                }
                heading += curvature * FILAMENT_STEP + 0.02 * rnd.nextGaussian() * Math.sqrt(FILAMENT_STEP);
                x += FILAMENT_STEP * Math.cos(heading);
                y += FILAMENT_STEP * Math.sin(heading);
            }
        }
    }

    /**
     * Adds {@code count} elliptical exponential discs {@code I = I₀ exp(−r_e/h)}, with
     * {@code r_e² = x'² + (y'/q)²} in the disc's own axes; scale length h from 2 to 6 px, axis ratio q from
     * 0.3 to 1; the first has central brightness {@code peak}, the others between a quarter and all of it.
     *
     * @param canvas canvas pixels (output, modified: added to)
     * @param cw     canvas width
     * @param ch     canvas height
     * @param pad    field offset inside the canvas
     * @param fw     field width
     * @param fh     field height
     * @param count  number of discs
     * @param peak   brightest central brightness
     * @param rnd    random source (modified: advanced)
     */
    public static void galaxies(float[] canvas, int cw, int ch, int pad, int fw, int fh, int count,
                                double peak, SplittableRandom rnd) {
        for (int g = 0; g < count; g++) {
            double gx = pad + rnd.nextDouble(0, fw);
            double gy = pad + rnd.nextDouble(0, fh);
            double h = rnd.nextDouble(2, 6);
            double q = rnd.nextDouble(0.3, 1.0);
            double pa = rnd.nextDouble(0, Math.PI);
            double i0 = g == 0 ? peak : peak * rnd.nextDouble(0.25, 1.0);
            double c = Math.cos(pa);
            double s = Math.sin(pa);
            int radius = (int) Math.ceil(10 * h);
            int x0 = (int) Math.round(gx);
            int y0 = (int) Math.round(gy);
            for (int j = Math.max(0, y0 - radius); j <= Math.min(ch - 1, y0 + radius); j++) {
                for (int i = Math.max(0, x0 - radius); i <= Math.min(cw - 1, x0 + radius); i++) {
                    double dx = i - gx;
                    double dy = j - gy;
                    double xp = c * dx + s * dy;
                    double yp = (-s * dx + c * dy) / q;
                    canvas[j * cw + i] += (float) (i0 * Math.exp(-Math.sqrt(xp * xp + yp * yp) / h));
                }
            }
        }
    }
}
