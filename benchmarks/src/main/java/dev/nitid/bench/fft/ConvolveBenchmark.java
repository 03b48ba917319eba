package dev.nitid.bench.fft;

import dev.nitid.fft.Boundary;
import dev.nitid.fft.ConvolutionSettings;
import dev.nitid.fft.Convolver;
import dev.nitid.fft.Tiling;
import dev.nitid.image.Image;
import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.openjdk.jmh.annotations.Warmup;

/**
 * Same-size convolution with the reflective boundary, one call per operation, plan and buffers made in
 * {@code @Setup}. Sizes include a raw camera size (4144×2822) that is not a fast FFT size.
 *
 * <p>Run (short, the machine is shared):
 * {@code java -jar benchmarks/target/benchmarks.jar ConvolveBenchmark -wi 1 -i 3 -r 2s -w 2s}
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgsAppend = {"-Xmx3g"})
@Warmup(iterations = 1, time = 2)
@Measurement(iterations = 3, time = 2)
public class ConvolveBenchmark {
    /** Image size, {@code WIDTHxHEIGHT}. */
    @Param({"1024x1024", "2048x2048", "4096x4096", "4144x2822"})
    public String size;

    /** PSF side in pixels (square PSF). */
    @Param({"31", "65"})
    public int psf;

    /** Worker threads. */
    @Param({"1", "2"})
    public int threads;

    /** Whole plane or overlap-save tiles. */
    @Param({"WHOLE_PLANE", "TILED"})
    public Tiling tiling;

    private Convolver convolver;
    private float[] in;
    private float[] out;

    /** Builds the plan and a random image. */
    @Setup(Level.Trial)
    public void setUp() {
        String[] wh = size.split("x");
        int w = Integer.parseInt(wh[0]);
        int h = Integer.parseInt(wh[1]);
        Image k = Image.create(psf, psf);
        k.fill(1f / (psf * psf));
        convolver = Convolver.create(w, h, k, new ConvolutionSettings(Boundary.REFLECT, threads, tiling));
        in = new float[w * h];
        out = new float[w * h];
        SplittableRandom rnd = new SplittableRandom(1);
        for (int i = 0; i < in.length; i++) {
            in[i] = (float) rnd.nextDouble();
        }
    }

    /** Stops the plan's worker threads. */
    @TearDown(Level.Trial)
    public void tearDown() {
        convolver.close();
    }

    /** @return the output, so that the call is not optimised away */
    @Benchmark
    public float[] convolve() {
        convolver.convolve(in, out);
        return out;
    }
}
