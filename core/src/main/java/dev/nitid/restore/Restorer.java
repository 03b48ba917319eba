package dev.nitid.restore;

import dev.nitid.image.Image;
import java.util.function.BooleanSupplier;

/**
 * Restores an observed image given its PSF. Build one with {@link Restorers#create(RestoreSettings)}.
 *
 * <p>Implementations plan per image size (transfer function, scratch buffers) and allocate nothing inside
 * the iterations. A restorer holds no state between calls and may be shared between threads.
 */
public interface Restorer {
    /**
     * Restores every plane of {@code observed}.
     *
     * @param observed  the blurred, noisy image (input, not modified)
     * @param psf       one plane used for every image plane, or one plane per image plane; centre pixel
     *                  {@code (⌊w/2⌋, ⌊h/2⌋)}; normalised to unit sum internally (input, not modified)
     * @param listener  called after every iteration
     * @param cancelled polled once per iteration; when it returns true the restoration stops with
     *                  {@link StopReason#CANCELLED} and the last completed iterate
     * @return the restored image and the reports
     * @throws IllegalArgumentException if the PSF does not fit the image or is not usable
     */
    RestorationResult restore(Image observed, Image psf, ProgressListener listener, BooleanSupplier cancelled);

    /** Restores without progress reports or cancellation; see {@link #restore(Image, Image, ProgressListener, BooleanSupplier)}. */
    default RestorationResult restore(Image observed, Image psf) {
        return restore(observed, psf, ProgressListener.NONE, () -> false);
    }

    /** @return the settings this restorer runs with */
    RestoreSettings settings();
}
