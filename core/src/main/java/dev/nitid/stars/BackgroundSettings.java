package dev.nitid.stars;

/**
 * Settings of the mesh background estimate ({@link BackgroundMap#estimate}).
 *
 * @param meshSize       side of each mesh cell in pixels, ≥ 8; larger than a star, smaller than the
 *                       gradients to follow (64 is common practice, no source)
 * @param clipSigma      sigma-clipping threshold k: values farther than k·σ from the median are dropped, &gt; 0
 * @param clipIterations clipping passes, ≥ 1
 * @param filterSize     side of the median filter applied to the mesh of cell values (odd, 1 = none)
 */
public record BackgroundSettings(int meshSize, double clipSigma, int clipIterations, int filterSize) {

    /** Validates the settings. */
    public BackgroundSettings {
        if (meshSize < 8) {
            throw new IllegalArgumentException("meshSize is " + meshSize
                    + ": use at least 8 pixels (64 suits most frames)");
        }
        if (!(clipSigma > 0)) {
            throw new IllegalArgumentException("clipSigma is " + clipSigma + ": use a value > 0, e.g. 3");
        }
        if (clipIterations < 1) {
            throw new IllegalArgumentException("clipIterations is " + clipIterations + ": use at least 1");
        }
        if (filterSize < 1 || filterSize % 2 == 0) {
            throw new IllegalArgumentException("filterSize is " + filterSize + ": use an odd size ≥ 1, e.g. 3");
        }
    }

    /** @return 64-pixel cells, 3σ clipping, 5 passes, 3×3 median filter of the mesh (common practice, no source) */
    public static BackgroundSettings defaults() {
        return new BackgroundSettings(64, 3.0, 5, 3);
    }

    /** @return these settings with another cell size */
    public BackgroundSettings withMeshSize(int size) {
        return new BackgroundSettings(size, clipSigma, clipIterations, filterSize);
    }
}
