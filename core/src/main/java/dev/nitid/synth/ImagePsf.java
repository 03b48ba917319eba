package dev.nitid.synth;

import dev.nitid.image.Image;

/**
 * A given PSF image, the same everywhere in the field. It cannot be shifted by a fraction of a pixel without
 * resampling (which would blur it), so stars drawn with it sit on pixel centres.
 */
public final class ImagePsf implements FieldPsf {
    private final float[] kernel;
    private final int size;
    private final String name;

    private ImagePsf(float[] kernel, int size, String name) {
        this.kernel = kernel;
        this.size = size;
        this.name = name;
    }

    /**
     * Wraps a PSF image, normalised here to unit sum.
     *
     * @param psf  a square image with an odd side, finite, with a positive sum; plane 0 is used (input, copied)
     * @param name where it came from, for headers (for example the file name)
     * @return the PSF
     * @throws IllegalArgumentException if the image is not square and odd-sized or does not sum to a positive value
     */
    public static ImagePsf of(Image psf, String name) {
        if (psf.width() != psf.height() || psf.width() % 2 == 0) {
            throw new IllegalArgumentException("PSF image is " + psf.width() + "x" + psf.height()
                    + ": use a square PSF with an odd side, centred on the middle pixel");
        }
        float[] src = psf.plane(0);
        double sum = 0;
        for (float f : src) {
            if (!Float.isFinite(f)) {
                throw new IllegalArgumentException("PSF image has a non-finite pixel: replace NaN/Inf by 0");
            }
            sum += f;
        }
        if (!(sum > 0)) {
            throw new IllegalArgumentException("PSF image sums to " + sum + ": a PSF must have a positive total");
        }
        float[] k = new float[src.length];
        for (int i = 0; i < k.length; i++) {
            k[i] = (float) (src[i] / sum);
        }
        return new ImagePsf(k, psf.width(), name == null ? "PSF image" : name);
    }

    @Override
    public int size() {
        return size;
    }

    @Override
    public boolean subPixel() {
        return false;
    }

    /** Copies the PSF; the field position and the sub-pixel offsets are ignored (see the class comment). */
    @Override
    public void render(double u, double v, double dx, double dy, float[] out) {
        System.arraycopy(kernel, 0, out, 0, kernel.length);
    }

    @Override
    public String describe() {
        return "PSF image " + name + ", " + size + "x" + size + " px";
    }
}
