package dev.nitid.fits;

/**
 * What to read from a FITS file.
 *
 * @param hdu           the HDU to read, 0 = primary; −1 (the default) = the first HDU holding image data,
 *                      which skips the empty primary HDU common in files whose image sits in an extension
 * @param workingCopies how many float32 copies of the image the whole job will hold at once (≥ 1; default 1).
 *                      The reader refuses the file with {@link FitsException.Kind#TOO_LARGE} before
 *                      allocating anything when {@code workingCopies × planes × width × height × 4} bytes
 *                      exceed the share of the heap it allows, so a job fails at once with a clear message
 *                      instead of running out of memory half-way
 */
public record ReadOptions(int hdu, int workingCopies) {
    /** Validates the HDU index and the copy count. */
    public ReadOptions {
        if (hdu < -1) {
            throw new IllegalArgumentException("hdu is " + hdu
                    + ": use 0 for the primary HDU, n for the n-th extension, or -1 for the first image");
        }
        if (workingCopies < 1) {
            throw new IllegalArgumentException("workingCopies is " + workingCopies
                    + ": a job holds at least the image itself, so give 1 or more");
        }
    }

    /**
     * Options for one HDU with one working copy.
     *
     * @param hdu the HDU index (0 = primary) or −1 for the first image
     */
    public ReadOptions(int hdu) {
        this(hdu, 1);
    }

    /** @return options reading the first HDU that holds image data, one working copy */
    public static ReadOptions defaults() {
        return new ReadOptions(-1, 1);
    }

    /**
     * @param hdu the HDU index (0 = primary) or −1
     * @return a copy reading that HDU
     */
    public ReadOptions withHdu(int hdu) {
        return new ReadOptions(hdu, workingCopies);
    }

    /**
     * @param copies float32 image copies the job will hold at once, ≥ 1
     * @return a copy with that memory budget
     */
    public ReadOptions withWorkingCopies(int copies) {
        return new ReadOptions(hdu, copies);
    }
}
