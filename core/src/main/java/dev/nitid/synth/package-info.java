/**
 * Synthetic star fields with exact truth, for testing restorers and other software.
 *
 * <p>{@link dev.nitid.synth.FieldGenerator#generate(FieldSettings)} turns a {@link dev.nitid.synth.FieldSettings}
 * (size, seed, {@link dev.nitid.synth.StarSettings stars}, {@link dev.nitid.synth.ExtendedSettings extended
 * structure}, a {@link dev.nitid.synth.FieldPsf PSF} and a {@link dev.nitid.synth.DetectorSettings detector})
 * into a {@link dev.nitid.synth.SyntheticField}: the observed image, the truth image, the truth catalogue and
 * the PSF. The same settings give the same field, bit for bit.
 *
 * <h2>Coordinates and units</h2>
 * Pixel {@code (x, y)} has its centre at integer coordinates {@code (x, y)}, so a star at {@code (10.0, 20.0)}
 * sits on the centre of pixel 10 of row 20 (FITS pixel (11, 21)). Image values are ADU of the stacked
 * (averaged) frame; the detector converts with its gain (e⁻/ADU).
 */
package dev.nitid.synth;
