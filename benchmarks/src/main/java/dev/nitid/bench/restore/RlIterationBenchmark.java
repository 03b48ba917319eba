package dev.nitid.bench.restore;

import dev.nitid.image.Image;
import dev.nitid.restore.EdgeHandling;
import dev.nitid.restore.Method;
import dev.nitid.restore.ProgressListener;
import dev.nitid.restore.Stopping;
import dev.nitid.restore.internal.RlPlan;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Time per Richardson–Lucy iteration: one call runs {@value #ITERATIONS} iterations of a plan built in
 * {@code @Setup} (transfer function and buffers made once), so the score is per iteration including a
 * fifth of the run's start-up passes (start estimate, mask scan, sensitivity check).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx3g"})
@Warmup(iterations = 1)
@Measurement(iterations = 3)
public class RlIterationBenchmark {
    static final int ITERATIONS = 5;

    /** Frame side; 2000 is not a power of two. */
    @Param({"2048", "4096"})
    public int size;

    /** PSF side. */
    @Param({"31", "65"})
    public int psfSize;

    /** FFT worker threads. */
    @Param({"2"})
    public int threads;

    /** Plain or accelerated. */
    @Param({"RICHARDSON_LUCY"})
    public String method;

    private RlPlan plan;
    private float[] data;
    private float[] out;
    private RlPlan.Params params;

    /** Builds the frame, the PSF and the plan. */
    @Setup
    public void setup() {
        SplittableRandom rnd = new SplittableRandom(1);
        data = new float[size * size];
        for (int i = 0; i < data.length; i++) {
            data[i] = (float) (100 + 10 * rnd.nextDouble());
        }
        for (int s = 0; s < 200; s++) {
            data[rnd.nextInt(data.length)] += 50000f;
        }
        Image psf = Image.create(psfSize, psfSize);
        double sigma = psfSize / 8.0;
        double sum = 0;
        int c = psfSize / 2;
        for (int y = 0; y < psfSize; y++) {
            for (int x = 0; x < psfSize; x++) {
                double v = Math.exp(-((x - c) * (x - c) + (y - c) * (y - c)) / (2 * sigma * sigma));
                psf.set(x, y, (float) v);
                sum += v;
            }
        }
        for (int i = 0; i < psf.pixelCount(); i++) {
            psf.plane(0)[i] /= (float) sum;
        }
        Method m = Method.valueOf(method);
        plan = new RlPlan(size, size, psf, EdgeHandling.REFLECT, m, threads);
        out = new float[size * size];
        params = new RlPlan.Params(m, 0, 1, 0, 1, 3);
    }

    /** Stops the plan's worker threads, so that trials do not accumulate pools. */
    @TearDown
    public void tearDown() {
        plan.close();
    }

    /** @return the restored frame (kept alive for JMH) */
    @Benchmark
    @OperationsPerInvocation(ITERATIONS)
    public float[] iterations() {
        plan.run(data, null, null, false, out, params, RlPlan.Conventions.standard(1e-3),
                Stopping.fixed(ITERATIONS).withRecordLikelihood(false), 0, ProgressListener.NONE, () -> false);
        return out;
    }
}
