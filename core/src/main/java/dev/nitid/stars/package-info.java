/**
 * Star measurement: background and noise maps, detection, rejection, profile fits
 * ({@link dev.nitid.stars.StarProfileFit}), robust aggregation, the measured (empirical) PSF and the
 * field map. The least-squares solver is in {@code dev.nitid.stars.fit}.
 */
package dev.nitid.stars;
