package dev.nitid.synth;

import dev.nitid.image.Image;

/**
 * The PSF of a synthetic field: renders the unit-sum image of a point source at any field position and
 * sub-pixel phase onto a square stamp.
 *
 * <p>Implementations: {@link SyntheticModelPsf} (an analytic model, optionally varying linearly across the field)
 * and {@link ImagePsf} (a given PSF image, constant, used at whole-pixel positions). Implementations are
 * immutable and thread-safe.
 */
public interface FieldPsf {

    /** @return the stamp side in pixels, odd */
    int size();

    /**
     * @return true if the PSF can be drawn at any sub-pixel phase; false if stars must sit on pixel
     *         centres (the generator then rounds their positions)
     */
    boolean subPixel();

    /**
     * Renders the unit-sum PSF of a point source on a {@code size() × size()} stamp whose centre pixel is
     * {@code (⌊size/2⌋, ⌊size/2⌋)}, the source at {@code (centre + dx, centre + dy)}.
     *
     * @param u   field position along x, {@code (x − width/2)/width}, in [−½, ½]
     * @param v   field position along y, {@code (y − height/2)/height}, in [−½, ½]
     * @param dx  sub-pixel offset along x, in [−½, ½]
     * @param dy  sub-pixel offset along y, in [−½, ½]
     * @param out the stamp, {@code size()²} values (output, modified)
     */
    void render(double u, double v, double dx, double dy, float[] out);

    /** @return a one-line description for file headers and logs */
    String describe();

    /** @return the PSF at the field centre with no sub-pixel offset, as a new image (the "true PSF") */
    default Image centre() {
        Image img = Image.create(size(), size());
        render(0, 0, 0, 0, img.plane(0));
        return img;
    }
}
