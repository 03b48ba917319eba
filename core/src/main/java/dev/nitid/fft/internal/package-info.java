/**
 * Kernels behind {@link dev.nitid.fft.RealFft2d} and {@link dev.nitid.fft.Convolver}: the row/column
 * passes of a 2-D real FFT composed from JTransforms' 1-D plans, and a small fixed pool of daemon
 * worker threads that splits those passes deterministically. Not part of the public API.
 */
package dev.nitid.fft.internal;
