/**
 * The FFT convolution engine: fast transform sizes, boundary handling, and {@link dev.nitid.fft.Convolver},
 * a plan that convolves images of one size with one PSF (and applies the exact adjoint) without
 * allocating per call.
 */
package dev.nitid.fft;
