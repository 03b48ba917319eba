package dev.nitid.bench.quality;

import dev.nitid.image.Image;
import org.jtransforms.fft.FloatFFT_2D;

/**
 * Stand-in for the PSF package's pupil model until it lands on main: the monochromatic PSF of an annular
 * pupil with straight vanes is |FT(pupil)|² (Fraunhofer diffraction; Goodman, <i>Introduction to Fourier
 * Optics</i>, ch. 4 and 6 — from memory), computed on an oversampled grid and binned to pixels.
 */
final class PupilPsf {
    private PupilPsf() {
    }

    /**
     * @param samplesPerLambdaOverD detector pixels per λ/D (2 is Nyquist)
     * @param obstruction           central obstruction, linear ratio ε
     * @param vanes                 number of vanes (evenly spaced in angle), 0 for none
     * @param vaneWidth             vane width as a fraction of the pupil diameter
     * @param size                  odd stamp side in pixels
     * @return a unit-sum PSF
     */
    static Image obstructedAiry(double samplesPerLambdaOverD, double obstruction, int vanes, double vaneWidth,
                                int size) {
        int os = 3;
        int m = 1152;
        // On the oversampled grid, λ/D spans q·os samples, so the pupil spans m/(q·os) samples.
        double diameter = m / (samplesPerLambdaOverD * os);
        double r = diameter / 2;
        float[] a = new float[2 * m * m];
        int sub = 4;
        for (int y = 0; y < m; y++) {
            for (int x = 0; x < m; x++) {
                double t = 0;
                for (int sy = 0; sy < sub; sy++) {
                    for (int sx = 0; sx < sub; sx++) {
                        double px = x - m / 2.0 + (sx + 0.5) / sub - 0.5;
                        double py = y - m / 2.0 + (sy + 0.5) / sub - 0.5;
                        double rr = Math.hypot(px, py);
                        if (rr > r || rr < obstruction * r) {
                            continue;
                        }
                        boolean blocked = false;
                        for (int v = 0; v < vanes; v++) {
                            double ang = Math.PI * v / vanes;
                            double dist = Math.abs(-Math.sin(ang) * px + Math.cos(ang) * py);
                            if (dist < vaneWidth * diameter / 2) {
                                blocked = true;
                                break;
                            }
                        }
                        t += blocked ? 0 : 1;
                    }
                }
                a[2 * (y * m + x)] = (float) (t / (sub * sub));
            }
        }
        new FloatFFT_2D(m, m).complexForward(a);
        double[] power = new double[m * m];
        for (int y = 0; y < m; y++) {
            for (int x = 0; x < m; x++) {
                int sy = (y + m / 2) % m;
                int sx = (x + m / 2) % m;
                double re = a[2 * (sy * m + sx)];
                double im = a[2 * (sy * m + sx) + 1];
                power[y * m + x] = re * re + im * im;
            }
        }
        // Peak at (m/2, m/2) = os·(m/(2·os)): the binned pixel m/(2·os) is centred on it.
        int c = m / (2 * os);
        int half = size / 2;
        Image out = Image.create(size, size);
        float[] o = out.plane(0);
        double sum = 0;
        for (int j = 0; j < size; j++) {
            for (int i = 0; i < size; i++) {
                double acc = 0;
                int bx = (c - half + i) * os - 1 + os / 2 - (os - 1) / 2;
                int by = (c - half + j) * os - 1 + os / 2 - (os - 1) / 2;
                for (int v = 0; v < os; v++) {
                    for (int u = 0; u < os; u++) {
                        acc += power[(by + v) * m + bx + u];
                    }
                }
                o[j * size + i] = (float) acc;
                sum += acc;
            }
        }
        for (int k = 0; k < o.length; k++) {
            o[k] = (float) (o[k] / sum);
        }
        return out;
    }
}
