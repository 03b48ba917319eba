package dev.nitid.fft;

import dev.nitid.image.Image;
import org.junit.jupiter.api.Nested;

/** Runs the {@link ConvolverContract} on every path: whole plane and small tiles, 1 and 2 threads. */
class ConvolverPathsTest {
    @Nested
    class WholePlaneOneThread extends ConvolverContract {
        @Override
        Convolver plan(int w, int h, Image psf, Boundary b) {
            return Convolver.create(w, h, psf, new ConvolutionSettings(b, 1, Tiling.WHOLE_PLANE));
        }
    }

    @Nested
    class WholePlaneTwoThreads extends ConvolverContract {
        @Override
        Convolver plan(int w, int h, Image psf, Boundary b) {
            return Convolver.create(w, h, psf, new ConvolutionSettings(b, 2, Tiling.WHOLE_PLANE));
        }
    }

    /** Tiles barely larger than the PSF, so that every image is cut into many tiles with halos. */
    @Nested
    class SmallTilesOneThread extends ConvolverContract {
        @Override
        Convolver plan(int w, int h, Image psf, Boundary b) {
            return Convolver.createTiled(w, h, psf, new ConvolutionSettings(b, 1),
                    FftSizes.nextFast(psf.width() + 3), FftSizes.nextFast(psf.height() + 2));
        }
    }

    @Nested
    class SmallTilesTwoThreads extends ConvolverContract {
        @Override
        Convolver plan(int w, int h, Image psf, Boundary b) {
            return Convolver.createTiled(w, h, psf, new ConvolutionSettings(b, 2),
                    FftSizes.nextFast(psf.width() + 1), FftSizes.nextFast(psf.height() + 4));
        }
    }

    @Nested
    class AutoTilingTwoThreads extends ConvolverContract {
        @Override
        Convolver plan(int w, int h, Image psf, Boundary b) {
            return Convolver.create(w, h, psf, new ConvolutionSettings(b, 2, Tiling.TILED));
        }
    }
}
