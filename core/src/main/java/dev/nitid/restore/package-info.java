/**
 * Image restoration by PSF deconvolution: Richardson–Lucy (plain, accelerated, total-variation and damped
 * forms) and the frequency-domain Wiener and Tikhonov filters, with a noise model, masks for bad and
 * saturated pixels, edge handling, automatic stopping and protection against dark rings around bright stars.
 *
 * <p>Start with {@link dev.nitid.restore.Restorers#create(dev.nitid.restore.RestoreSettings)} and
 * {@link dev.nitid.restore.RestoreSettings#defaults()}; the result is a
 * {@link dev.nitid.restore.RestorationResult} that says how many iterations ran and why it stopped.
 *
 * <p>Restored images are meant for viewing and morphology. Photometry on them needs its own validation.
 */
package dev.nitid.restore;
