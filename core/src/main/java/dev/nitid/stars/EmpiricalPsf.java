package dev.nitid.stars;

import dev.nitid.image.Image;

/**
 * An effective PSF stacked from star stamps (Anderson &amp; King 2000, PASP 112, 1360): each star's pixels,
 * background-subtracted and divided by its flux, are placed on an oversampled grid at their offsets from
 * the star's fitted centre; each grid node takes the 3σ-clipped mean of its samples, weighted by each star's
 * inverse variance (flux/σ)² (see {@code EmpiricalPsfBuilder}). Because the detector's
 * pixels already integrated the light, the grid holds the pixel-integrated PSF at sub-pixel offsets.
 *
 * @param sampled      the PSF at the detector's sampling, (2r+1)² pixels, centred on the middle pixel,
 *                     non-negative, sum 1: what the restorers use
 * @param oversampled  the oversampled grid, (2·r·k+1)² nodes spaced 1/k pixel, scaled so that its nodes at
 *                     whole-pixel offsets sum to 1 (the whole grid then sums to about k²); not clipped
 * @param oversampling k, nodes per pixel
 * @param starsUsed    stars stacked
 * @param noiseToPeak  RMS noise of the core pixels of {@code sampled} (those at or above half its peak), over
 *                     the peak; from the split-half estimate (NaN with a single star)
 * @param noise        per-pixel 1σ noise of {@code sampled}: half the difference of the PSFs stacked from
 *                     the two halves of the stars
 */
public record EmpiricalPsf(Image sampled, Image oversampled, int oversampling, int starsUsed, double noiseToPeak,
                           Image noise) {
}
