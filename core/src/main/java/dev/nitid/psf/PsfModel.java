package dev.nitid.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.internal.Grids;
import java.util.List;
import java.util.OptionalDouble;

/**
 * A point-spread function that can be rendered onto a detector grid.
 *
 * <p>The rendering rule (centre pixel, sub-pixel offset, pixel integration by oversampling, unit sum) is
 * written down once in the {@linkplain dev.nitid.psf package documentation}. Implementations only provide
 * {@link #renderOversampled}; {@link #render} bins and normalises.
 *
 * <p>Implementations are immutable and thread-safe: rendering allocates its own buffers.
 */
public interface PsfModel {

    /** Oversampling used when none is given: 5 × 5 samples per pixel (project choice). */
    int DEFAULT_OVERSAMPLE = 5;

    /** Largest accepted oversampling factor (keeps the fine grid within memory for 1025² stamps). */
    int MAX_OVERSAMPLE = 32;

    /**
     * Point samples of the PSF on the fine grid of {@code (size·oversample)²} sub-pixels, as flux per
     * sub-pixel (density × sub-pixel area), not renormalised: their sum is the energy inside the stamp.
     *
     * <p>Fine sample {@code (gx, gy)} lies at {@code x = (gx + ½)/k − ½ − c − dx} detector pixels from the
     * PSF centre (and likewise in y), with {@code k = oversample} and {@code c = size/2}.
     *
     * @param size       stamp side in detector pixels, odd, ≥ 1
     * @param oversample sub-pixels per pixel per axis, 1 … {@value #MAX_OVERSAMPLE}
     * @param dx         sub-pixel offset of the PSF centre in x, detector pixels
     * @param dy         sub-pixel offset of the PSF centre in y, detector pixels
     * @return a new {@code (size·oversample)²} single-plane image
     * @throws IllegalArgumentException if the size is even or not positive, or the oversampling is out of range
     */
    Image renderOversampled(int size, int oversample, double dx, double dy);

    /**
     * Renders the PSF on a detector stamp: pixel-integrated by {@code oversample × oversample} sub-pixels
     * (point-sampled when {@code oversample = 1}), centred on the centre pixel plus {@code (dx, dy)}, sum 1.
     *
     * @param size       stamp side in pixels, odd, ≥ 1
     * @param oversample sub-pixels per pixel per axis, 1 … {@value #MAX_OVERSAMPLE}
     * @param dx         offset of the PSF centre from the centre pixel in x, pixels
     * @param dy         offset of the PSF centre from the centre pixel in y, pixels
     * @return a new {@code size × size} float32 image summing to 1
     * @throws IllegalArgumentException if the size is even or not positive, the oversampling is out of range,
     *                                  an offset is not finite, or no energy falls on the stamp
     */
    default Image render(int size, int oversample, double dx, double dy) {
        Grids.checkRender(size, oversample, dx, dy);
        Image fine = renderOversampled(size, oversample, dx, dy);
        return Grids.binAndNormalise(fine, size, oversample);
    }

    /**
     * Renders the centred PSF with {@link #DEFAULT_OVERSAMPLE}.
     *
     * @param size stamp side in pixels, odd
     * @return a new {@code size × size} image summing to 1
     */
    default Image render(int size) {
        return render(size, DEFAULT_OVERSAMPLE, 0, 0);
    }

    /**
     * A short plain name of the model family, e.g. {@code "gaussian"}, {@code "moffat"}, {@code "airy"}.
     *
     * @return the name
     */
    String family();

    /**
     * A one-line plain description for people, e.g. {@code "Moffat, FWHM 3.2 px, beta 3"}.
     *
     * @return the description (the family name unless the model says more)
     */
    default String description() {
        return family();
    }

    /**
     * Every parameter of the model, in a stable order, as short keywords with values and comments
     * (ready to write into a FITS header; see {@code notes/psf.md} for the list).
     *
     * @return the parameters
     */
    List<PsfParameter> parameters();

    /**
     * The plate scale this model was built for, when it knows one (pupil models, models with seeing).
     *
     * @return arcsec per detector pixel, or empty
     */
    default OptionalDouble plateScaleArcsec() {
        return OptionalDouble.empty();
    }

    /**
     * Strehl ratio of the model relative to the same aperture without aberrations, when it has one.
     *
     * @return the Strehl ratio in (0, 1], or empty
     */
    default OptionalDouble strehl() {
        return OptionalDouble.empty();
    }

    /**
     * The detector pixel in units of the Nyquist pixel {@code λ/(2D)} at the shortest wavelength, when the
     * model knows its optics: above 1 the detector under-samples the optics.
     *
     * @return pixel size over Nyquist pixel, or empty
     */
    default OptionalDouble pixelOverNyquist() {
        return OptionalDouble.empty();
    }
}
