package dev.nitid.bench.stars;

import dev.nitid.image.Image;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import java.util.SplittableRandom;
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
 * {@code StarMeasurer.measure} on an invented field: round Moffat stars (FWHM 3 px, β 3) on a sky of 500
 * with Gaussian noise of σ 22 (≈ √500), peaks log-uniform in 200…30 000. The target: a 24-megapixel
 * frame (6000×4000) with ~2000 stars in ≤ 5 s on 2 cores.
 *
 * <pre>
 * mvn -o -q -pl benchmarks -am package -DskipTests
 * java -jar benchmarks/target/benchmarks.jar MeasureBenchmark
 * </pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 2)
@Measurement(iterations = 3)
@Fork(value = 1, jvmArgs = {"-Xmx3g"})
public class MeasureBenchmark {

    /** Width x height x stars. 1500x1001 is a non-round smaller size. */
    @Param({"6000x4000x2000", "1500x1001x250"})
    public String field;

    /** Worker threads. */
    @Param({"2"})
    public int threads;

    private Image image;
    private MeasureSettings settings;

    /** Builds the field once. */
    @Setup
    public void setUp() {
        String[] p = field.split("x");
        int w = Integer.parseInt(p[0]);
        int h = Integer.parseInt(p[1]);
        int n = Integer.parseInt(p[2]);
        float[] px = new float[w * h];
        SplittableRandom rnd = new SplittableRandom(42);
        double alpha = 3.0 / (2 * Math.sqrt(Math.pow(2, 1 / 3.0) - 1));
        int r = 15;
        for (int s = 0; s < n; s++) {
            double x0 = rnd.nextDouble(20, w - 20);
            double y0 = rnd.nextDouble(20, h - 20);
            double peak = 200 * Math.pow(150, rnd.nextDouble());
            for (int y = (int) y0 - r; y <= (int) y0 + r; y++) {
                for (int x = (int) x0 - r; x <= (int) x0 + r; x++) {
                    double q = ((x - x0) * (x - x0) + (y - y0) * (y - y0)) / (alpha * alpha);
                    px[y * w + x] += (float) (peak * Math.pow(1 + q, -3));
                }
            }
        }
        for (int i = 0; i < px.length; i++) {
            px[i] += (float) (500 + 22 * rnd.nextGaussian());
        }
        image = Image.wrap(w, h, px);
        settings = MeasureSettings.defaults().withThreads(threads);
    }

    /** @return the measurement (consumed by JMH) */
    @Benchmark
    public StarMeasurement measure() {
        return StarMeasurer.measure(image, settings);
    }
}
