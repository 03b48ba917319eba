package dev.nitid.psf;

import java.util.Arrays;

/**
 * The wavelengths a diffraction PSF is summed over, with their photon weights.
 *
 * <p>Convention (project choice, stated because it changes the result): each monochromatic PSF is
 * normalised to unit flux, then the PSFs are added with the given weights, which count photons; a band
 * made by {@link #band} samples it at equal steps with equal weights, i.e. a flat photon spectrum per nm
 * integrated by the midpoint rule.
 *
 * @param wavelengthsNm wavelengths, nm, each in (0, 100000]
 * @param weights       photon weights, same length, ≥ 0, positive sum (normalised to sum 1 here)
 */
public record Spectrum(double[] wavelengthsNm, double[] weights) {

    /** Fewest wavelengths a band is sampled with (the issue asks for at least 5). */
    public static final int MIN_BAND_SAMPLES = 5;

    /** Band sampling step used by {@link #band(double, double)}: one wavelength per 20 nm at least (project choice). */
    public static final double DEFAULT_BAND_STEP_NM = 20;

    /** Validates and normalises the weights; copies the arrays. */
    public Spectrum {
        if (wavelengthsNm == null || weights == null || wavelengthsNm.length == 0
                || wavelengthsNm.length != weights.length) {
            throw new IllegalArgumentException("a spectrum needs as many weights as wavelengths, at least one");
        }
        wavelengthsNm = wavelengthsNm.clone();
        weights = weights.clone();
        double sum = 0;
        for (int i = 0; i < wavelengthsNm.length; i++) {
            double l = wavelengthsNm[i];
            if (!(l > 0 && l <= 100_000)) {
                throw new IllegalArgumentException("wavelength " + l + " nm is out of range: give 0 < λ ≤ 100000 nm");
            }
            if (!(weights[i] >= 0) || !Double.isFinite(weights[i])) {
                throw new IllegalArgumentException("weight " + weights[i] + " at " + l
                        + " nm must be finite and ≥ 0");
            }
            sum += weights[i];
        }
        if (!(sum > 0)) {
            throw new IllegalArgumentException("spectrum weights sum to " + sum + ": give at least one positive weight");
        }
        for (int i = 0; i < weights.length; i++) {
            weights[i] /= sum;
        }
    }

    /** @return a single wavelength, nm */
    public static Spectrum monochromatic(double nm) {
        return new Spectrum(new double[] {nm}, new double[] {1});
    }

    /**
     * A flat band sampled at {@code count} equal steps (bin centres), equal photon weights.
     *
     * @param loNm  short edge, nm
     * @param hiNm  long edge, nm, &gt; loNm
     * @param count wavelengths, ≥ {@value #MIN_BAND_SAMPLES}
     * @return the spectrum
     */
    public static Spectrum band(double loNm, double hiNm, int count) {
        if (!(hiNm > loNm) || !(loNm > 0)) {
            throw new IllegalArgumentException("band " + loNm + "-" + hiNm
                    + " nm is empty or negative: give the short edge first, e.g. 500-600");
        }
        if (count < MIN_BAND_SAMPLES) {
            throw new IllegalArgumentException("band sampled with " + count + " wavelengths: use at least "
                    + MIN_BAND_SAMPLES);
        }
        double[] l = new double[count];
        double[] w = new double[count];
        for (int i = 0; i < count; i++) {
            l[i] = loNm + (i + 0.5) * (hiNm - loNm) / count;
            w[i] = 1;
        }
        return new Spectrum(l, w);
    }

    /** @return a flat band with one wavelength per {@value #DEFAULT_BAND_STEP_NM} nm, at least 5 */
    public static Spectrum band(double loNm, double hiNm) {
        int n = (int) Math.max(MIN_BAND_SAMPLES, Math.ceil((hiNm - loNm) / DEFAULT_BAND_STEP_NM));
        return band(loNm, hiNm, n);
    }

    /** @return number of wavelengths */
    public int size() {
        return wavelengthsNm.length;
    }

    /** @return the wavelengths, nm (a copy) */
    @Override
    public double[] wavelengthsNm() {
        return wavelengthsNm.clone();
    }

    /** @return the normalised weights (a copy) */
    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** @return wavelength i, nm */
    public double wavelength(int i) {
        return wavelengthsNm[i];
    }

    /** @return weight i (weights sum to 1) */
    public double weight(int i) {
        return weights[i];
    }

    /** @return shortest wavelength, nm */
    public double shortestNm() {
        return Arrays.stream(wavelengthsNm).min().orElseThrow();
    }

    /** @return longest wavelength, nm */
    public double longestNm() {
        return Arrays.stream(wavelengthsNm).max().orElseThrow();
    }

    /**
     * The band the samples stand for: for equally spaced samples with equal weights (as {@link #band} makes),
     * the edges half a step beyond the outer samples; otherwise the shortest and longest wavelength.
     *
     * @return {short edge, long edge}, nm
     */
    public double[] edgesNm() {
        int n = wavelengthsNm.length;
        if (n < 2) {
            return new double[] {wavelengthsNm[0], wavelengthsNm[0]};
        }
        double step = (wavelengthsNm[n - 1] - wavelengthsNm[0]) / (n - 1);
        boolean even = step > 0;
        for (int i = 1; i < n && even; i++) {
            even = Math.abs(wavelengthsNm[i] - wavelengthsNm[i - 1] - step) <= 1e-9 * wavelengthsNm[i]
                    && Math.abs(weights[i] - weights[0]) <= 1e-12;
        }
        return even ? new double[] {wavelengthsNm[0] - step / 2, wavelengthsNm[n - 1] + step / 2}
                : new double[] {shortestNm(), longestNm()};
    }

    /** @return photon-weighted mean wavelength, nm */
    public double meanNm() {
        double m = 0;
        for (int i = 0; i < wavelengthsNm.length; i++) {
            m += weights[i] * wavelengthsNm[i];
        }
        return m;
    }

    /** @return the band centre (mean of the extremes), nm: the wavelength Zernike coefficients refer to */
    public double centreNm() {
        return 0.5 * (shortestNm() + longestNm());
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Spectrum s && Arrays.equals(wavelengthsNm, s.wavelengthsNm)
                && Arrays.equals(weights, s.weights);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(wavelengthsNm) + Arrays.hashCode(weights);
    }

    @Override
    public String toString() {
        return size() == 1 ? "Spectrum[" + wavelengthsNm[0] + " nm]"
                : "Spectrum[" + size() + " wavelengths " + shortestNm() + "-" + longestNm() + " nm]";
    }
}
