package dev.nitid.synth;

import dev.nitid.synth.internal.AnalyticProfiles;

/**
 * An analytic PSF model for synthetic fields, integrated over square pixels, whose width may vary linearly
 * across the field: at field position (u, v) (see {@link FieldPsf#render}) the FWHM is
 * <pre>  FWHM(u, v) = fwhm · (1 + gradientX · u + gradientY · v)</pre>
 * so {@code gradientX = 0.2} makes stars 20 % wider at the right edge than at the left.
 *
 * @param shape      the profile
 * @param fwhm       FWHM at the field centre in pixels, &gt; 0
 * @param beta       Moffat power index, &gt; 1 (4.765 for Kolmogorov seeing, Trujillo et al. 2001, MNRAS 328,
 *                   977); ignored by the Gaussian
 * @param size       stamp side in pixels, odd, ≥ 3
 * @param oversample sub-samples per pixel and axis used to integrate over the pixel, 1 to 16
 * @param gradientX  fractional FWHM change across the full width
 * @param gradientY  fractional FWHM change across the full height
 */
public record SyntheticModelPsf(Shape shape, double fwhm, double beta, int size, int oversample,
                       double gradientX, double gradientY) implements FieldPsf {

    /** Analytic profiles. */
    public enum Shape {
        /** {@code I(r) ∝ exp(−r²/2σ²)}, FWHM = 2√(2 ln 2) σ. */
        GAUSSIAN,
        /** {@code I(r) ∝ [1 + (r/α)²]^(−β)}, FWHM = 2α√(2^(1/β) − 1) (Moffat 1969, A&amp;A 3, 455). */
        MOFFAT
    }

    /** Validates the model. */
    public SyntheticModelPsf {
        if (shape == null) {
            throw new IllegalArgumentException("PSF shape is null: choose GAUSSIAN or MOFFAT");
        }
        if (!(fwhm > 0) || Double.isInfinite(fwhm)) {
            throw new IllegalArgumentException("PSF FWHM is " + fwhm + ": use a finite value > 0 pixels");
        }
        if (shape == Shape.MOFFAT && (!(beta > 1) || Double.isInfinite(beta))) {
            throw new IllegalArgumentException("Moffat beta is " + beta + ": use a finite value > 1 (2.5 to 4.765 is typical)");
        }
        if (size < 3 || size % 2 == 0) {
            throw new IllegalArgumentException("PSF stamp size is " + size + ": use an odd size ≥ 3");
        }
        if (oversample < 1 || oversample > 16) {
            throw new IllegalArgumentException("PSF oversampling is " + oversample + ": use 1 to 16");
        }
        double worst = 1 - 0.5 * Math.abs(gradientX) - 0.5 * Math.abs(gradientY);
        if (!(worst > 0.05)) {
            throw new IllegalArgumentException("PSF gradients " + gradientX + ", " + gradientY
                    + " shrink the FWHM to nothing somewhere in the field: keep |gx| + |gy| below 1.9");
        }
    }

    /**
     * A Moffat PSF with a stamp of about 8 FWHM, constant across the field.
     *
     * @param fwhm FWHM in pixels
     * @param beta power index
     * @return the model
     */
    public static SyntheticModelPsf moffat(double fwhm, double beta) {
        return new SyntheticModelPsf(Shape.MOFFAT, fwhm, beta, defaultSize(fwhm, 8), 5, 0, 0);
    }

    /**
     * A Gaussian PSF with a stamp of about 4 FWHM, constant across the field.
     *
     * @param fwhm FWHM in pixels
     * @return the model
     */
    public static SyntheticModelPsf gaussian(double fwhm) {
        return new SyntheticModelPsf(Shape.GAUSSIAN, fwhm, 2.5, defaultSize(fwhm, 4), 5, 0, 0);
    }

    private static int defaultSize(double fwhm, double widths) {
        int half = (int) Math.ceil(widths * fwhm / 2);
        return 2 * Math.max(half, 3) + 1;
    }

    /** @return this model with another stamp size */
    public SyntheticModelPsf withSize(int s) {
        return new SyntheticModelPsf(shape, fwhm, beta, s, oversample, gradientX, gradientY);
    }

    /** @return this model with another oversampling */
    public SyntheticModelPsf withOversample(int o) {
        return new SyntheticModelPsf(shape, fwhm, beta, size, o, gradientX, gradientY);
    }

    /** @return this model with a linear FWHM variation across the field */
    public SyntheticModelPsf withGradient(double gx, double gy) {
        return new SyntheticModelPsf(shape, fwhm, beta, size, oversample, gx, gy);
    }

    @Override
    public boolean subPixel() {
        return true;
    }

    @Override
    public void render(double u, double v, double dx, double dy, float[] out) {
        double w = fwhm * (1 + gradientX * u + gradientY * v);
        AnalyticProfiles.render(shape == Shape.MOFFAT, w, beta, size, oversample, dx, dy, out);
    }

    @Override
    public String describe() {
        String s = shape == Shape.MOFFAT
                ? String.format("Moffat FWHM %.4g px beta %.4g", fwhm, beta)
                : String.format("Gaussian FWHM %.4g px", fwhm);
        if (gradientX != 0 || gradientY != 0) {
            s += String.format(", FWHM gradient %.3g across x, %.3g across y", gradientX, gradientY);
        }
        return s + ", stamp " + size + " px";
    }
}
