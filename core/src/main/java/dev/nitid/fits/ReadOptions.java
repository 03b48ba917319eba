package dev.nitid.fits;

/**
 * What to read from a FITS file.
 *
 * @param hdu the HDU to read, 0 = primary; −1 (the default) = the first HDU holding image data, which
 *            skips the empty primary HDU common in files whose image sits in an extension
 */
public record ReadOptions(int hdu) {
    /** Validates the HDU index. */
    public ReadOptions {
        if (hdu < -1) {
            throw new IllegalArgumentException("hdu is " + hdu
                    + ": use 0 for the primary HDU, n for the n-th extension, or -1 for the first image");
        }
    }

    /** @return options reading the first HDU that holds image data */
    public static ReadOptions defaults() {
        return new ReadOptions(-1);
    }

    /**
     * @param hdu the HDU index (0 = primary) or −1
     * @return a copy reading that HDU
     */
    public ReadOptions withHdu(int hdu) {
        return new ReadOptions(hdu);
    }
}
