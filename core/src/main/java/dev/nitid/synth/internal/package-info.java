/**
 * Kernels behind {@link dev.nitid.synth}: random deviates (Poisson, Gaussian), analytic PSF profiles
 * integrated over pixels, and the renderer of extended structure. Not exported; no API guarantees.
 */
package dev.nitid.synth.internal;
