package dev.nitid.synth;

/**
 * The detector and the stack: the noise model of a synthetic field.
 *
 * <p>Each of {@code frames} frames records, per pixel, {@code Poisson(gain · s)} electrons plus Gaussian read
 * noise of σ = {@code readNoise} electrons, where {@code s} is the noise-free signal in ADU (sky included);
 * the frame is converted back to ADU by dividing by the gain, clipped at {@code saturation}, and the frames
 * are averaged. The variance of a sky pixel in the stack is therefore
 * <pre>  σ² = (sky/gain + (readNoise/gain)²) / frames   [ADU²]</pre>
 * (shot noise plus read noise in quadrature, common practice; Howell, <i>Handbook of CCD Astronomy</i>,
 * 2nd ed. 2006, ch. 4 — the CCD equation).
 *
 * @param sky        sky level in ADU per pixel per frame, ≥ 0
 * @param gain       electrons per ADU, &gt; 0
 * @param readNoise  read noise in electrons per frame, ≥ 0
 * @param frames     frames averaged into the stack, ≥ 1
 * @param saturation level in ADU where one frame clips; {@code Double.POSITIVE_INFINITY} for none
 */
public record DetectorSettings(double sky, double gain, double readNoise, int frames, double saturation) {

    /** Validates the settings. */
    public DetectorSettings {
        if (!(sky >= 0) || Double.isInfinite(sky)) {
            throw new IllegalArgumentException("sky level is " + sky + ": use a finite value ≥ 0 ADU");
        }
        if (!(gain > 0) || Double.isInfinite(gain)) {
            throw new IllegalArgumentException("gain is " + gain + ": use a finite value > 0 electrons per ADU");
        }
        if (!(readNoise >= 0) || Double.isInfinite(readNoise)) {
            throw new IllegalArgumentException("read noise is " + readNoise + ": use a finite value ≥ 0 electrons");
        }
        if (frames < 1) {
            throw new IllegalArgumentException("frames is " + frames + ": a stack has at least 1 frame");
        }
        if (!(saturation > 0)) {
            throw new IllegalArgumentException("saturation is " + saturation
                    + ": use a level > 0 ADU, or infinity for none");
        }
    }

    /** @return sky 100 ADU, gain 1 e⁻/ADU, read noise 5 e⁻, 1 frame, no saturation */
    public static DetectorSettings defaults() {
        return new DetectorSettings(100, 1, 5, 1, Double.POSITIVE_INFINITY);
    }

    /** @return the expected noise σ of a pure-sky pixel of the stack, in ADU (formula above) */
    public double skySigma() {
        return Math.sqrt((sky / gain + (readNoise / gain) * (readNoise / gain)) / frames);
    }

    /** @return these settings with another sky level */
    public DetectorSettings withSky(double s) {
        return new DetectorSettings(s, gain, readNoise, frames, saturation);
    }

    /** @return these settings with another gain */
    public DetectorSettings withGain(double g) {
        return new DetectorSettings(sky, g, readNoise, frames, saturation);
    }

    /** @return these settings with another read noise */
    public DetectorSettings withReadNoise(double r) {
        return new DetectorSettings(sky, gain, r, frames, saturation);
    }

    /** @return these settings with another frame count */
    public DetectorSettings withFrames(int n) {
        return new DetectorSettings(sky, gain, readNoise, n, saturation);
    }

    /** @return these settings with another saturation level */
    public DetectorSettings withSaturation(double s) {
        return new DetectorSettings(sky, gain, readNoise, frames, s);
    }
}
