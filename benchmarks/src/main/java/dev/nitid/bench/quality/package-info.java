/**
 * The restoration quality harness: builds two invented synthetic scenes (seeing-limited Moffat,
 * diffraction-limited obstructed Airy with vanes), restores each with every available method and with
 * scikit-image's Richardson–Lucy (through {@code benchmarks/scripts/quality/skimage_rl.py}), and prints one
 * table of the five {@link dev.nitid.quality.QualityMetrics} per scene. Run it with
 * {@code benchmarks/scripts/quality/run.sh}.
 */
package dev.nitid.bench.quality;
