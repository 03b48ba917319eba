package dev.nitid.psf.internal;

import dev.nitid.image.Image;

/**
 * The fine-grid geometry and the bin-and-normalise step shared by every PSF model (see the rendering
 * rule in {@code dev.nitid.psf}'s package documentation), and the argument checks that go with them.
 */
public final class Grids {
    /** Largest stamp side accepted (a 4097² float stamp is 64 MiB; larger PSFs are a caller mistake). */
    public static final int MAX_SIZE = 4097;
    /** Largest oversampling accepted (mirrors {@code PsfModel.MAX_OVERSAMPLE}). */
    public static final int MAX_OVERSAMPLE = 32;

    private Grids() {
    }

    /**
     * Checks render arguments.
     *
     * @throws IllegalArgumentException naming the bad value and the fix
     */
    public static void checkRender(int size, int oversample, double dx, double dy) {
        if (size < 1 || (size & 1) == 0 || size > MAX_SIZE) {
            throw new IllegalArgumentException("PSF size " + size + " must be odd, between 1 and " + MAX_SIZE
                    + " (try " + Math.max(1, Math.min(MAX_SIZE, size | 1)) + ")");
        }
        if (oversample < 1 || oversample > MAX_OVERSAMPLE) {
            throw new IllegalArgumentException("oversample " + oversample
                    + " must be between 1 (point sampling) and " + MAX_OVERSAMPLE);
        }
        if ((long) size * oversample > 16_385) {
            throw new IllegalArgumentException("size " + size + " × oversample " + oversample
                    + " gives a fine grid over 16385 samples per side: lower the oversampling or the size");
        }
        if (!Double.isFinite(dx) || !Double.isFinite(dy)) {
            throw new IllegalArgumentException("PSF offset (" + dx + ", " + dy + ") must be finite");
        }
    }

    /**
     * Position of fine sample {@code g} relative to the centre pixel's centre, in detector pixels:
     * {@code (g + ½)/k − ½ − c} with {@code c = size/2}. Computed from integers so that samples
     * symmetric about the centre get exactly opposite positions.
     */
    public static double fineOffset(int g, int size, int oversample) {
        int c = size / 2;
        // (2g + 1 − k − 2ck) / (2k): exact integer numerator, one rounding in the division
        long num = 2L * g + 1 - oversample - 2L * c * oversample;
        return num / (2.0 * oversample);
    }

    /**
     * Bins {@code k × k} fine samples into each pixel and normalises the stamp to sum 1 (sums in double).
     *
     * @param fine fine grid, {@code (size·k)²} (input, not modified)
     * @param size stamp side
     * @param k    oversampling
     * @return a new {@code size × size} image summing to 1
     * @throws IllegalArgumentException if the stamp holds no positive energy or a sample is not finite
     */
    public static Image binAndNormalise(Image fine, int size, int k) {
        int n = size * k;
        if (fine.width() != n || fine.height() != n) {
            throw new IllegalArgumentException("fine grid is " + fine.width() + "x" + fine.height()
                    + " but size " + size + " × oversample " + k + " needs " + n + "x" + n);
        }
        float[] f = fine.plane(0);
        double[] acc = new double[size * size];
        for (int gy = 0; gy < n; gy++) {
            int row = (gy / k) * size;
            for (int gx = 0; gx < n; gx++) {
                acc[row + gx / k] += f[gy * n + gx];
            }
        }
        return normalise(acc, size, size);
    }

    /**
     * Normalises double pixels to sum 1 and stores them as float.
     *
     * @throws IllegalArgumentException if the sum is not positive or not finite
     */
    public static Image normalise(double[] acc, int width, int height) {
        double sum = 0;
        for (double v : acc) {
            sum += v;
        }
        if (!(sum > 0) || !Double.isFinite(sum)) {
            throw new IllegalArgumentException("the PSF stamp holds energy " + sum
                    + ": the stamp is too small or the offset too large for this PSF");
        }
        float[] out = new float[acc.length];
        for (int i = 0; i < acc.length; i++) {
            out[i] = (float) (acc[i] / sum);
        }
        return Image.wrap(width, height, out);
    }

    /**
     * Checks that a value is finite and positive.
     *
     * @throws IllegalArgumentException naming the value and what to give instead
     */
    public static double positive(String name, double v, String unit) {
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new IllegalArgumentException(name + " is " + v + ": give a finite value above 0 " + unit);
        }
        return v;
    }

    /**
     * Checks that a value is finite.
     *
     * @throws IllegalArgumentException naming the value
     */
    public static double finite(String name, double v) {
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException(name + " is " + v + ": give a finite number");
        }
        return v;
    }
}
