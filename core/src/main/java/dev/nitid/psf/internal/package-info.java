/**
 * Kernels behind the PSF models: the fine-grid geometry shared by every model and the pupil-FFT engine.
 * Not part of the public API.
 */
package dev.nitid.psf.internal;
