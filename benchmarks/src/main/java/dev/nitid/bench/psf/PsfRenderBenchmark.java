package dev.nitid.bench.psf;

import dev.nitid.image.Image;
import dev.nitid.psf.GaussianPsf;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.psf.PsfModel;
import dev.nitid.psf.Psfs;
import dev.nitid.psf.PupilPsf;
import dev.nitid.psf.Seeing;
import dev.nitid.psf.Spectrum;
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
 * PSF rendering time. The target: an obstructed Airy with four vanes over a 5-wavelength band,
 * 129² pixels, oversample 5, in ≤ 1 s on 2 cores ({@link #airyBand}).
 *
 * <p>Invented optics: 200 mm aperture, ε = 0.33, four 2 mm vanes, 3.76 µm pixels, 500–600 nm; focal
 * length 1000 mm (f/5) or 2000 mm (f/10), which changes the pupil-FFT grid.
 *
 * <pre>
 * mvn -o -q -pl testdata,core,benchmarks -am package -DskipTests
 * java -jar benchmarks/target/benchmarks.jar 'dev.nitid.bench.psf.*'
 * </pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class PsfRenderBenchmark {
    @Param({"129", "65"})
    int size;

    @Param({"1000", "2000"})
    double focalLengthMm;

    PsfModel airy;
    PsfModel airySeeing;
    PsfModel moffat;
    PsfModel gaussian;

    @Setup
    public void setUp() {
        PupilPsf p = PupilPsf.of(200, focalLengthMm, 3.76, Spectrum.band(500, 600, 5))
                .withObstruction(0.33).withVanes(4, 2, 0);
        airy = p;
        airySeeing = Psfs.withSeeingAndJitter(p, Seeing.moffat(2.0), 0.3, p.plateScaleArcsec().orElseThrow());
        moffat = MoffatPsf.ofFwhm(4, 3);
        gaussian = GaussianPsf.ofFwhm(4);
    }

    /** The target case. */
    @Benchmark
    public Image airyBand() {
        return airy.render(size, 5, 0, 0);
    }

    /** The same with Moffat seeing of 2″ and 0.3 px jitter convolved on. */
    @Benchmark
    public Image airyBandSeeingJitter() {
        return airySeeing.render(size, 5, 0, 0);
    }

    /** Analytic Moffat, for scale. */
    @Benchmark
    public Image moffat() {
        return moffat.render(size, 5, 0.25, -0.25);
    }

    /** Analytic Gaussian, for scale. */
    @Benchmark
    public Image gaussian() {
        return gaussian.render(size, 5, 0.25, -0.25);
    }
}
