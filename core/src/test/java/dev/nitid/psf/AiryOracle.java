package dev.nitid.psf;

import org.hipparchus.special.BesselJ;

/**
 * The analytic (annular) Airy pattern, evaluated with Hipparchus' Bessel J (hipparchus-core 4.0.3) as an
 * oracle independent of our FFT.
 *
 * <p>Amplitude, peak-normalised: {@code a(v; ε) = [2J1(v)/v − ε²·2J1(εv)/(εv)] / (1 − ε²)}
 * (Schroeder, Astronomical Optics, 2nd ed. 2000, §10.2; reduces to Airy 1835 / Born &amp; Wolf §8.5.2 at ε = 0).
 * Flux-normalised in x = θ/(λ/D) units: {@code P(x) = (π/4)(1 − ε²)·a(πx)²}, so ∫P 2πx dx = 1.
 */
final class AiryOracle {
    private AiryOracle() {
    }

    /** 2J1(v)/v, with its limit 1 at v = 0. */
    static double jinc(double v) {
        if (Math.abs(v) < 1e-8) {
            return 1;
        }
        return 2 * BesselJ.value(1, v) / v;
    }

    /** Peak-normalised intensity I/I0 at x = θ/(λ/D). */
    static double intensity(double x, double eps) {
        double v = Math.PI * x;
        double a = (jinc(v) - eps * eps * jinc(eps * v)) / (1 - eps * eps);
        return a * a;
    }

    /** Flux-normalised density per (λ/D)² at x. */
    static double density(double x, double eps) {
        return Math.PI / 4 * (1 - eps * eps) * intensity(x, eps);
    }
}
