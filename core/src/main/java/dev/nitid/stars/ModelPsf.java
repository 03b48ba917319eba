package dev.nitid.stars;

import dev.nitid.image.Image;
import dev.nitid.stars.internal.EllipticalProfileModel;

/**
 * Renders a fitted elliptical Gaussian or Moffat profile as a PSF image for the restorers: odd size,
 * centred on the middle pixel ({@code (⌊w/2⌋, ⌊h/2⌋)}, the project's PSF-centre rule), each pixel the
 * profile averaged over the pixel (2×2 Gauss–Legendre), normalised to sum 1.
 */
public final class ModelPsf {
    private ModelPsf() {
    }

    /**
     * @param shape     Gaussian or Moffat
     * @param fwhmMajor major-axis FWHM, px, &gt; 0
     * @param fwhmMinor minor-axis FWHM, px, in (0, fwhmMajor]
     * @param angle     major-axis angle, radians from +x towards +y
     * @param beta      Moffat β &gt; 1 (ignored for a Gaussian)
     * @param radius    the image is (2·radius+1)², radius ≥ 1
     * @return the PSF image, sum 1
     */
    public static Image render(ProfileShape shape, double fwhmMajor, double fwhmMinor, double angle, double beta,
                               int radius) {
        if (!(fwhmMajor > 0) || !(fwhmMinor > 0) || fwhmMinor > fwhmMajor * (1 + 1e-12)) {
            throw new IllegalArgumentException("FWHM major " + fwhmMajor + " and minor " + fwhmMinor
                    + " must be > 0 with minor ≤ major");
        }
        if (radius < 1) {
            throw new IllegalArgumentException("radius is " + radius + ": use at least 1");
        }
        boolean moffat = shape == ProfileShape.MOFFAT;
        if (moffat && !(beta > 1)) {
            throw new IllegalArgumentException("Moffat beta is " + beta + ": use a value > 1");
        }
        double num = moffat ? Math.pow(2, 1 / beta) - 1 : 2 * Math.log(2);
        // FWHM = 2√(num/λ) along an eigen-axis ⇒ λ = 4·num/FWHM².
        double lMaj = 4 * num / (fwhmMajor * fwhmMajor);
        double lMin = 4 * num / (fwhmMinor * fwhmMinor);
        double cs = Math.cos(angle);
        double sn = Math.sin(angle);
        double a = lMaj * cs * cs + lMin * sn * sn;
        double b = (lMaj - lMin) * cs * sn;
        double c = lMaj * sn * sn + lMin * cs * cs;
        int size = 2 * radius + 1;
        EllipticalProfileModel m = new EllipticalProfileModel(moffat, true, size, size);
        double[] q = moffat ? new double[] {1, radius, radius, a, b, c, beta, 0}
                : new double[] {1, radius, radius, a, b, c, 0};
        double[] v = new double[size * size];
        m.evaluate(q, v, null);
        double sum = 0;
        for (double d : v) {
            sum += d;
        }
        float[] out = new float[v.length];
        for (int i = 0; i < v.length; i++) {
            out[i] = (float) (v[i] / sum);
        }
        return Image.wrap(size, size, out);
    }
}
