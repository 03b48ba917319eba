package dev.nitid.synth;

import dev.nitid.image.Image;
import java.util.List;

/**
 * A synthetic field and its exact truth.
 *
 * @param observed      what the detector delivers: the stack in ADU, noisy, with sky, saturated pixels
 *                      clipped per frame
 * @param truth         the unblurred scene without sky or noise: each star's flux in the pixel holding its
 *                      centre, plus the extended structure
 * @param extendedTruth the extended structure alone, unblurred (what restorers should recover between stars)
 * @param extendedLight the extended structure blurred by the PSF, noise-free, without sky
 * @param noiseless     the expected value of {@code observed} before noise and clipping: sky + PSF ⊛ truth
 * @param psf           the unit-sum PSF at the field centre (the "true PSF" to give a restorer)
 * @param catalogue     the stars, in the order they were drawn
 * @param settings      the settings that made the field
 */
public record SyntheticField(Image observed, Image truth, Image extendedTruth, Image extendedLight,
                             Image noiseless, Image psf,
                             List<TruthStar> catalogue, FieldSettings settings) {

    /** Copies the catalogue into an unmodifiable list. */
    public SyntheticField {
        catalogue = List.copyOf(catalogue);
    }
}
