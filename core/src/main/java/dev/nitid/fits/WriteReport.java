package dev.nitid.fits;

import java.nio.file.Path;

/**
 * What a write did.
 *
 * @param file          the file published
 * @param clippedPixels pixels outside the integer output range (or NaN) that were clipped; 0 for float output
 * @param rounded       true if integer output had to round at least one non-integer value
 */
public record WriteReport(Path file, long clippedPixels, boolean rounded) {
}
