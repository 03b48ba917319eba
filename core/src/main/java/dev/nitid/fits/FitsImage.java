package dev.nitid.fits;

import dev.nitid.image.Image;

/**
 * An image read from a FITS file.
 *
 * @param image        the pixels as float32 physical values ({@code BZERO + BSCALE × stored}); BLANK pixels
 *                     are NaN; one plane per NAXIS3 slice
 * @param header       every card of the HDU read, in file order, structural ones included
 * @param hdu          the HDU the image came from, 0 = primary
 * @param bitpix       the BITPIX of the stored data (8, 16, 32, 64, −32 or −64)
 * @param maskedPixels pixels that are NaN or ±infinity after decoding (BLANK included), over all planes
 */
public record FitsImage(Image image, FitsHeader header, int hdu, int bitpix, long maskedPixels) {
    /** Checks the components are present. */
    public FitsImage {
        if (image == null || header == null) {
            throw new IllegalArgumentException("image and header must not be null");
        }
    }
}
