package dev.nitid.psf;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.nitid.image.Image;
import dev.nitid.testdata.SeededCases;
import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * The pupil render runs on the thread count it is given and gives identical bits on 1 and 2 threads
 * (STYLE.md: results identical whatever the thread count, tested with explicit pairs).
 */
class PupilThreadsTest {
    static java.util.stream.Stream<Long> seeds() {
        return SeededCases.seeds("pupilThreads", 6);
    }

    /** A random invented telescope: obstruction, vanes, aberrations, a band or one wavelength, sub-pixel offset. */
    private static PupilPsf random(SplittableRandom r) {
        PupilPsf p = PupilPsf.of(r.nextDouble(80, 300), r.nextDouble(400, 2500), r.nextDouble(2.4, 9),
                        r.nextBoolean() ? Spectrum.monochromatic(r.nextDouble(400, 700)) : Spectrum.band(500, 600))
                .withObstruction(r.nextDouble(0, 0.45));
        if (r.nextBoolean()) {
            p = p.withVanes(r.nextInt(1, 5), 1.5, r.nextDouble(0, 90));
        }
        if (r.nextBoolean()) {
            p = p.withZernike(Zernike.single(r.nextInt(4, 12), r.nextDouble(-0.15, 0.15)));
        }
        return p;
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void oneAndTwoThreadsGiveIdenticalImages(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        PupilPsf p = random(r);
        int size = 2 * r.nextInt(5, 13) + 1;
        int os = r.nextInt(1, 5);
        double dx = r.nextDouble(-0.5, 0.5);
        double dy = r.nextDouble(-0.5, 0.5);
        Image one = p.withThreads(1).renderOversampled(size, os, dx, dy);
        Image two = p.withThreads(2).renderOversampled(size, os, dx, dy);
        assertArrayEquals(one.plane(0), two.plane(0), "seed " + seed + ": " + p.description());
        Image three = p.withThreads(3).render(size, os, dx, dy);
        assertArrayEquals(p.withThreads(1).render(size, os, dx, dy).plane(0), three.plane(0), "seed " + seed);
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void blurredPupilIsIdenticalOnOneAndTwoThreads(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        PupilPsf p = random(r);
        double scale = PupilPsf.plateScaleArcsec(p.pixelSizeUm(), p.focalLengthMm());
        ConvolvedPsf blurred = (ConvolvedPsf) Psfs.withSeeingAndJitter(p, Seeing.moffat(r.nextDouble(1, 3)),
                r.nextDouble(0, 0.8), scale);
        Image one = new ConvolvedPsf(p.withThreads(1), blurred.kernels(), blurred.blurParameters(),
                blurred.plateScale(), 1).render(21, 3, 0.2, -0.1);
        Image two = new ConvolvedPsf(p.withThreads(2), blurred.kernels(), blurred.blurParameters(),
                blurred.plateScale(), 2).render(21, 3, 0.2, -0.1);
        assertArrayEquals(one.plane(0), two.plane(0), "seed " + seed + ": " + blurred.description());
    }

    @ParameterizedTest(name = "seed {0}")
    @MethodSource("seeds")
    void threadsAreASettingNotAParameter(long seed) {
        PupilPsf p = random(new SplittableRandom(seed)).withThreads(1);
        assertEquals(1, p.threads());
        // the FITS description of the model does not change with the thread count
        assertEquals(p.withThreads(1).parameters(), p.withThreads(2).parameters());
        assertThrows(IllegalArgumentException.class, () -> p.withThreads(0));
    }
}
