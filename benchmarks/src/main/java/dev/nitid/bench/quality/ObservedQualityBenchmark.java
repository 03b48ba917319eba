package dev.nitid.bench.quality;

import dev.nitid.image.Image;
import dev.nitid.quality.ObservedQuality;
import dev.nitid.quality.QualityReport;
import dev.nitid.quality.QualitySettings;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import dev.nitid.synth.DetectorSettings;
import dev.nitid.synth.ExtendedSettings;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import dev.nitid.synth.FluxLaw;
import dev.nitid.synth.SyntheticModelPsf;
import dev.nitid.synth.Placement;
import dev.nitid.synth.StarSettings;
import dev.nitid.synth.SyntheticField;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Time of {@code nitid sharpen}'s before/after figures on an invented field: {@link ObservedQuality#of}
 * (background map, sky mask, input sky σ, input star fits) and {@link ObservedQuality#evaluate} (output side
 * only). The field (stars, a faint nebula, Poisson and read noise) and its star measurement are made once in
 * {@code @Setup}; the "restoration" scored is the field itself, which costs the same as any output.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx4g"})
@Warmup(iterations = 1)
@Measurement(iterations = 3)
public class ObservedQualityBenchmark {
    /** Frame width; 6000 × 4000 is a 24-megapixel sensor. */
    @Param({"6000"})
    public int width;

    /** Frame height. */
    @Param({"4000"})
    public int height;

    /** Worker threads. */
    @Param({"2"})
    public int threads;

    private Image observed;
    private StarMeasurement stars;
    private ObservedQuality reference;

    /** Generates the field, measures its stars and builds one reference for {@link #evaluate}. */
    @Setup
    public void setup() {
        SyntheticField f = FieldGenerator.generate(new FieldSettings(width, height, 24,
                new StarSettings(2000, FluxLaw.UNIFORM_MAGNITUDE, 5e3, 5e5, 1, Placement.RANDOM, 40),
                new ExtendedSettings(60, 6, 20, 3, 4, 80), SyntheticModelPsf.moffat(3.5, 3).withSize(41),
                new DetectorSettings(150, 1.5, 6, 4, Double.POSITIVE_INFINITY)));
        observed = f.observed();
        stars = StarMeasurer.measure(observed, MeasureSettings.defaults().withThreads(threads));
        reference = ObservedQuality.of(observed, stars, Double.NaN, QualitySettings.defaults(), threads);
    }

    /** @return the reference (kept alive for JMH) */
    @Benchmark
    public ObservedQuality of() {
        return ObservedQuality.of(observed, stars, Double.NaN, QualitySettings.defaults(), threads);
    }

    /** @return the figures (kept alive for JMH) */
    @Benchmark
    public QualityReport evaluate() {
        return reference.evaluate(observed);
    }
}
