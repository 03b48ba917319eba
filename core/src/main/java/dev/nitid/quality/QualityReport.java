package dev.nitid.quality;

/**
 * The five metrics of one restoration (definitions in {@link QualityMetrics}).
 *
 * @param fwhm       FWHM ratio (output/input) and the FWHMs behind it
 * @param ring       ring depth in input sky σ
 * @param inputError error-vs-truth figure of the input
 * @param outputError error-vs-truth figure of the output
 * @param errorRatio output figure / input figure
 * @param flux       aperture flux ratio
 * @param noiseIn    input sky σ
 * @param noiseOut   output sky σ
 * @param noiseRatio noiseOut / noiseIn
 */
public record QualityReport(QualityMetrics.FwhmComparison fwhm, QualityMetrics.RingDepth ring,
                            QualityMetrics.TruthError inputError, QualityMetrics.TruthError outputError,
                            double errorRatio, QualityMetrics.FluxComparison flux, double noiseIn,
                            double noiseOut, double noiseRatio) {

    /** @return the FWHM ratio */
    public double fwhmRatio() {
        return fwhm.ratio();
    }

    /** @return the ring depth in input sky σ */
    public double ringDepth() {
        return ring.depth();
    }

    /** @return the flux ratio */
    public double fluxRatio() {
        return flux.ratio();
    }
}
