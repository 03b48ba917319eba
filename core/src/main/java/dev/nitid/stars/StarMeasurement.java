package dev.nitid.stars;

import dev.nitid.image.Image;
import java.util.List;
import java.util.Map;

/**
 * The result of {@link StarMeasurer#measure}: accepted stars, rejections by reason, robust summaries of
 * both profile shapes, the field grid and the measured PSF.
 *
 * @param width          image width
 * @param height         image height
 * @param detections     every local maximum above the threshold, brightest first, with its fate
 * @param fitted         candidates that reached the profile fit (after cheap rejections, within maxStars)
 * @param stars          accepted stars
 * @param rejected       rejected detections by reason (every reason present, possibly 0)
 * @param skipped        candidates not fitted because of {@link MeasureSettings#maxStars()}
 * @param backgroundLevel median background level
 * @param backgroundNoise median background σ (1.4826·MAD)
 * @param gaussian       Gaussian summary
 * @param moffat         Moffat summary (count 0 if no Moffat fit converged)
 * @param bestShape      the shape with the lower total BIC (Gaussian when Moffat fits mostly fail)
 * @param regions        field grid, row-major
 * @param gridColumns    grid columns
 * @param gridRows       grid rows
 * @param empirical      the stacked PSF, or {@code null} when no star was usable
 * @param modelPsf       the best-fitting profile rendered as a PSF (sum 1), or {@code null} without stars
 * @param psfMismatch    RMS difference between the empirical and the model PSF over the core, in units of
 *                       the empirical PSF's noise (NaN when either is missing)
 * @param psfSource      which PSF is recommended
 * @param psfReason      one sentence saying why
 * @param timings        wall-clock milliseconds per stage ("background", "detection", "fits", "psf", "total")
 * @param enoughStars    true if at least {@link MeasureSettings#minStars()} stars were accepted
 * @param backgroundMap  the mesh background and noise map the stars were detected and fitted against
 *                       ({@link MeasureSettings#background()} on the measured plane); a caller that needs the
 *                       same map of the same plane (sharpen's figures, the preview) reuses it instead of
 *                       estimating it again, which costs about half a second at 24 megapixels
 */
public record StarMeasurement(int width, int height, List<Detection> detections, int fitted, List<MeasuredStar> stars,
                              Map<RejectReason, Integer> rejected, int skipped, double backgroundLevel,
                              double backgroundNoise, ProfileSummary gaussian, ProfileSummary moffat,
                              ProfileShape bestShape, List<RegionSummary> regions, int gridColumns, int gridRows,
                              EmpiricalPsf empirical, Image modelPsf, double psfMismatch, PsfSource psfSource, String psfReason,
                              Map<String, Long> timings, boolean enoughStars, BackgroundMap backgroundMap) {

    /** @return the summary of the best-fitting shape */
    public ProfileSummary best() {
        return bestShape == ProfileShape.MOFFAT ? moffat : gaussian;
    }

    /** @return the recommended PSF image (odd, centred, sum 1), or {@code null} without stars */
    public Image psf() {
        return psfSource == PsfSource.EMPIRICAL && empirical != null ? empirical.sampled() : modelPsf;
    }

    /** @return total rejected detections */
    public int rejectedTotal() {
        int n = 0;
        for (int v : rejected.values()) {
            n += v;
        }
        return n;
    }
}
