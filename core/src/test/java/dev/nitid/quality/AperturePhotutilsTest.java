package dev.nitid.quality;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.nitid.image.Image;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Aperture photometry against photutils 1.6.0 (Debian 12 python3-photutils): {@code aperture_photometry} with
 * {@code method='center'} for the sum and {@code ApertureStats(...).median} of a {@code CircularAnnulus} for the
 * sky (ApertureStats computes medians over centre-in pixels). Skipped when /usr/bin/python3 lacks photutils.
 */
class AperturePhotutilsTest {
    @TempDir
    Path dir;

    /** float32 pixels summed in double on both sides; the medians are of the same float values. */
    static final double RTOL = 1e-6;

    private static final String SCRIPT = String.join("\n",
            "import sys, numpy as np",
            "from photutils.aperture import CircularAperture, CircularAnnulus, aperture_photometry, ApertureStats",
            "w, h, r, gap, width = int(sys.argv[2]), int(sys.argv[3]), float(sys.argv[4]), float(sys.argv[5]), float(sys.argv[6])",
            "d = np.fromfile(sys.argv[1], dtype='<f4').reshape(h, w).astype(np.float64)",
            "xy = np.loadtxt(sys.argv[7], delimiter=',', ndmin=2)",
            "for x, y in xy:",
            "    ap = CircularAperture((x, y), r=r)",
            "    s = aperture_photometry(d, ap, method='center')['aperture_sum'][0]",
            "    npx = ap.to_mask(method='center').to_image(d.shape).sum()",
            "    sky = ApertureStats(d, CircularAnnulus((x, y), r_in=r + gap, r_out=r + gap + width)).median",
            "    print(repr(float(s - npx * sky)))");

    @Test
    void matchesPhotutilsCentreMethod() throws Exception {
        Path py = Path.of("/usr/bin/python3");
        assumeTrue(Files.isExecutable(py), "no /usr/bin/python3");
        Process probe = new ProcessBuilder(py.toString(), "-c", "import photutils").redirectErrorStream(true).start();
        assumeTrue(probe.waitFor() == 0, "photutils not installed");

        int w = 120;
        int h = 100;
        SplittableRandom rnd = new SplittableRandom(31);
        Image img = Image.create(w, h);
        List<StarSite> stars = List.of(new StarSite(35.37, 40.81), new StarSite(80.62, 55.13), new StarSite(60.29, 60.71));
        for (int y = 0; y < h; y++) {
            for (int x = 0; x < w; x++) {
                double v = 100 + 3 * rnd.nextGaussian();
                for (StarSite s : stars) {
                    double r2 = (x - s.x()) * (x - s.x()) + (y - s.y()) * (y - s.y());
                    v += 2000 * Math.exp(-r2 / 8.0);
                }
                img.set(x, y, (float) v);
            }
        }
        ByteBuffer buf = ByteBuffer.allocate(4 * w * h).order(ByteOrder.LITTLE_ENDIAN);
        for (float f : img.plane(0)) {
            buf.putFloat(f);
        }
        Path raw = dir.resolve("img.f32");
        Files.write(raw, buf.array());
        List<String> lines = new ArrayList<>();
        for (StarSite s : stars) {
            lines.add(s.x() + "," + s.y());
        }
        Path xy = dir.resolve("xy.csv");
        Files.write(xy, lines);
        Path script = dir.resolve("ap.py");
        Files.writeString(script, SCRIPT);
        QualitySettings q = QualitySettings.defaults();
        double radius = 10.3;
        Process p = new ProcessBuilder(py.toString(), script.toString(), raw.toString(), String.valueOf(w),
                String.valueOf(h), String.valueOf(radius), String.valueOf(q.annulusGap()),
                String.valueOf(q.annulusWidth()), xy.toString()).redirectErrorStream(true).start();
        String out = new String(p.getInputStream().readAllBytes()).trim();
        assertEquals(0, p.waitFor(), out);
        String[] got = out.split("\\R");
        assertEquals(stars.size(), got.length, out);
        for (int i = 0; i < stars.size(); i++) {
            double expected = Double.parseDouble(got[i]);
            double actual = QualityMetrics.aperture(img, stars.get(i), radius, q);
            assertEquals(expected, actual, RTOL * Math.abs(expected), "star " + stars.get(i));
        }
    }
}
