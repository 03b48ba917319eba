package dev.nitid.synth;

/**
 * One star of the truth catalogue.
 *
 * @param x         column of the star's centre (pixel centres at integers)
 * @param y         row of the star's centre
 * @param flux      total flux in ADU of the stack (equal to the star's pixel in the truth image)
 * @param peak      the star's brightest pixel in the noise-free observed image, above sky and extended
 *                  light, in ADU
 * @param saturated true if that pixel, with sky and extended light, reaches the saturation level
 */
public record TruthStar(double x, double y, double flux, double peak, boolean saturated) {
}
