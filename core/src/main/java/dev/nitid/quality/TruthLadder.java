package dev.nitid.quality;

import dev.nitid.image.Image;
import dev.nitid.quality.internal.GaussianSmoothing;
import java.util.Arrays;

/**
 * The truth smoothed by Gaussians of FWHM t on a grid, kept only at the pixels of a mask: what the
 * error-vs-truth metric compares an image with. Built once per scene; immutable and thread-safe.
 */
public final class TruthLadder {
    private final int width;
    private final int height;
    private final int[] pixels;
    private final double[] fwhms;
    private final float[][] smoothed;

    private TruthLadder(int width, int height, int[] pixels, double[] fwhms, float[][] smoothed) {
        this.width = width;
        this.height = height;
        this.pixels = pixels;
        this.fwhms = fwhms;
        this.smoothed = smoothed;
    }

    /**
     * Smooths {@code truth} with each FWHM of the settings' grid and keeps the masked pixels.
     *
     * @param truth    the unblurred truth, plane 0 (input, not modified)
     * @param mask     pixels to compare on, row-major (input, not modified)
     * @param settings the t grid
     * @return the ladder
     * @throws IllegalArgumentException if the mask does not match the image or holds fewer than 10 pixels
     */
    public static TruthLadder build(Image truth, boolean[] mask, QualitySettings settings) {
        int n = truth.width() * truth.height();
        if (mask.length != n) {
            throw new IllegalArgumentException("mask has " + mask.length + " pixels but the truth has " + n
                    + ": build the mask on the same grid");
        }
        int count = 0;
        for (boolean b : mask) {
            count += b ? 1 : 0;
        }
        if (count < 10) {
            throw new IllegalArgumentException("the truth mask holds " + count
                    + " pixels: the scene needs extended structure away from stars (at least 10 pixels)");
        }
        int[] px = new int[count];
        for (int i = 0, k = 0; i < n; i++) {
            if (mask[i]) {
                px[k++] = i;
            }
        }
        int steps = (int) Math.floor((settings.truthFwhmMax() - settings.truthFwhmMin()) / settings.truthFwhmStep() + 1e-9) + 1;
        double[] t = new double[steps];
        float[][] sm = new float[steps][];
        for (int s = 0; s < steps; s++) {
            t[s] = settings.truthFwhmMin() + s * settings.truthFwhmStep();
            float[] full = GaussianSmoothing.smooth(truth.plane(0), truth.width(), truth.height(), t[s]);
            sm[s] = new float[count];
            for (int k = 0; k < count; k++) {
                sm[s][k] = full[px[k]];
            }
        }
        return new TruthLadder(truth.width(), truth.height(), px, t, sm);
    }

    /** @return the number of compared pixels */
    public int pixelCount() {
        return pixels.length;
    }

    /** @return the FWHM grid (a copy) */
    public double[] fwhms() {
        return fwhms.clone();
    }

    int width() {
        return width;
    }

    int height() {
        return height;
    }

    int[] pixels() {
        return pixels;
    }

    float[] smoothed(int step) {
        return smoothed[step];
    }

    @Override
    public String toString() {
        return "TruthLadder[" + pixels.length + " px, t " + Arrays.toString(fwhms) + "]";
    }
}
