/**
 * PSF models and builders: analytic {@link dev.nitid.psf.GaussianPsf} and {@link dev.nitid.psf.MoffatPsf},
 * the diffraction pattern of an obstructed, spidered, aberrated aperture from the pupil FFT
 * ({@link dev.nitid.psf.PupilPsf}), seeing and tracking jitter convolved onto any model
 * ({@link dev.nitid.psf.ConvolvedPsf}), PSFs read from images ({@link dev.nitid.psf.Psfs#fromImage}),
 * derived figures ({@link dev.nitid.psf.PsfFigures}) and a preview picture ({@link dev.nitid.psf.PsfPreview}).
 *
 * <h2>The rendering rule (written down once, here)</h2>
 * Every model renders through {@link dev.nitid.psf.PsfModel#render(int, int, double, double)}: an odd
 * {@code size × size} float32 image whose centre pixel {@code (c, c) = (size/2, size/2)} holds the PSF centre
 * plus a sub-pixel offset {@code (dx, dy)}; pixel {@code (i, j)} covers {@code [i − c − ½, i − c + ½]} in x
 * (detector pixels, relative to the centre pixel). With {@code oversample = k} each pixel is the mean of
 * {@code k × k} point samples at the centres of its sub-pixels (pixel integration by the midpoint rule);
 * {@code k = 1} is point sampling at the pixel centre. The result is normalised to sum 1: the energy
 * falling outside the stamp is dropped, so choose a stamp that holds the wings you care about.
 *
 * <p>Angles are in degrees, counter-clockwise from the +x axis (columns) towards +y (rows); in a FITS
 * viewer, which draws row 0 at the bottom, that is counter-clockwise on screen.
 */
package dev.nitid.psf;
