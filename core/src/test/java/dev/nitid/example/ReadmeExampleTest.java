package dev.nitid.example;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.nitid.fits.FitsHeader;
import dev.nitid.fits.FitsImage;
import dev.nitid.fits.FitsReader;
import dev.nitid.fits.FitsWriter;
import dev.nitid.fits.WriteOptions;
import dev.nitid.image.Image;
import dev.nitid.psf.MoffatPsf;
import dev.nitid.restore.RestorationResult;
import dev.nitid.restore.RestoreSettings;
import dev.nitid.restore.Restorers;
import dev.nitid.stars.MeasureSettings;
import dev.nitid.stars.StarMeasurement;
import dev.nitid.stars.StarMeasurer;
import dev.nitid.synth.FieldGenerator;
import dev.nitid.synth.FieldSettings;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Keeps the README's ten-line Java example compiling and working (the lines between the markers). */
class ReadmeExampleTest {

    @Test
    void readmeExampleRuns(@TempDir Path dir) throws Exception {
        FitsWriter.write(dir.resolve("m42-stack.fits"),
                FieldGenerator.generate(FieldSettings.of(200, 160, 5)).observed(), FitsHeader.empty(),
                WriteOptions.defaults());
        Path m42 = dir.resolve("m42-stack.fits");
        Path sharp = dir.resolve("m42-sharp.fits");
        // README example: begin
        FitsImage in = FitsReader.read(m42);
        StarMeasurement stars = StarMeasurer.measure(in, MeasureSettings.defaults());
        Image psf = stars.enoughStars() ? stars.psf()                  // measured from the image...
                : MoffatPsf.ofFwhm(3.4, 3.0).render(41, 5, 0, 0);      // ...or a model
        RestorationResult out = Restorers.create(RestoreSettings.defaults()).restore(in.image(), psf);
        System.out.println(out.iterations() + " iterations, stopped: " + out.stopReason());
        FitsWriter.write(sharp, out.image(), in.header().withHistory("sharpened with Nitid"),
                WriteOptions.defaults());
        // README example: end
        FitsImage back = FitsReader.read(sharp);
        assertEquals(200, back.image().width());
        assertTrue(out.iterations() >= 1);
        assertTrue(back.header().cards().stream().anyMatch(c -> "sharpened with Nitid".equals(c.comment())
                || (c.value() != null && c.value().contains("sharpened with Nitid"))
                || String.valueOf(c).contains("sharpened with Nitid")), "HISTORY kept");
    }
}
