package dev.nitid.restore;

import dev.nitid.image.Image;
import java.util.List;

/**
 * The restored image and how each plane's restoration went.
 *
 * @param image  the restored image, same shape as the input; masked pixels filled by the restoration
 * @param planes one report per plane (unmodifiable)
 */
public record RestorationResult(Image image, List<PlaneReport> planes) {
    /** Copies the reports into an unmodifiable list. */
    public RestorationResult {
        planes = List.copyOf(planes);
    }

    /** @return iterations run on plane 0 */
    public int iterations() {
        return planes.get(0).iterations();
    }

    /** @return why plane 0 stopped */
    public StopReason stopReason() {
        return planes.get(0).stopReason();
    }
}
