/** Kernels behind {@link dev.nitid.quality}: Gaussian smoothing, robust statistics, annulus sums. Not exported. */
package dev.nitid.quality.internal;
