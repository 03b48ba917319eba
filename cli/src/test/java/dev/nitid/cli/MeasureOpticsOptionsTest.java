package dev.nitid.cli;

import static dev.nitid.cli.CliRun.run;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;
import picocli.CommandLine.Model.OptionSpec;

/**
 * {@code measure} takes its telescope options from the same {@link OpticsOptions} as {@code psf},
 * {@code sharpen} and {@code simulate}: same names, same meaning, plus its own {@code --binning}.
 */
class MeasureOpticsOptionsTest {
    /** Every optics option, as documented for {@code nitid psf} (README) and {@code nitid measure}. */
    static final List<String> OPTICS = List.of("--aperture", "--obstruction", "--vanes", "--vane-width",
            "--vane-angle", "--focal-length", "--pixel-size", "--wavelength", "--band", "--zernike");

    @TempDir
    static Path dir;
    static Path field;

    /** An invented 256² field of 80 Moffat stars (FWHM 3 px, β 3), made by {@code nitid simulate}. */
    @BeforeAll
    static void makeField() {
        field = dir.resolve("field.fits");
        CliRun r = run("simulate", "-o", field.toString(), "--image-size", "256", "--stars", "80", "--model",
                "moffat", "--fwhm", "3", "--beta", "3", "--seed", "5", "-q");
        assertEquals(ExitCode.OK, r.exit(), r.err());
    }

    private static double number(String json, String key) {
        Matcher m = Pattern.compile("\"" + key + "\":\\s*(-?[0-9.eE+-]+|null)").matcher(json);
        assertTrue(m.find(), key + " in " + json);
        return m.group(1).equals("null") ? Double.NaN : Double.parseDouble(m.group(1));
    }

    @Test
    void sameOptionsSameDescriptionsInEveryCommand() {
        CommandLine cl = NitidCommand.commandLine();
        for (String name : OPTICS) {
            OptionSpec m = cl.getSubcommands().get("measure").getCommandSpec().findOption(name);
            assertNotNull(m, "measure " + name);
            for (String other : List.of("psf", "sharpen", "simulate")) {
                OptionSpec o = cl.getSubcommands().get(other).getCommandSpec().findOption(name);
                assertNotNull(o, other + " " + name);
                assertEquals(String.join(" ", o.description()), String.join(" ", m.description()), name);
                assertEquals(o.type(), m.type(), name);
            }
        }
        assertNotNull(cl.getSubcommands().get("measure").getCommandSpec().findOption("--binning"));
    }

    @Test
    void binningMultipliesThePixel() {
        // 206.264806 × p × binning / f (reference README §4: 3.76 µm at 1000 mm → 0.775556″/px)
        CliRun r = run("measure", field.toString(), "--json", "--focal-length", "1000", "--pixel-size", "3.76",
                "--binning", "2");
        assertEquals(ExitCode.OK, r.exit(), r.err());
        assertEquals(2 * 0.775556, number(r.out(), "plate_scale_arcsec"), 2e-6);
    }

    @Test
    void opticsSplitTakesTheSharedOptions() {
        CliRun plain = run("measure", field.toString(), "--json", "--aperture", "200", "--obstruction", "0.3",
                "--focal-length", "1000", "--pixel-size", "3.76", "--band", "500-600");
        assertEquals(ExitCode.OK, plain.exit(), plain.err());
        double optics = number(plain.out(), "optics_fwhm_px");
        assertTrue(optics > 0, plain.out());
        // options measure did not have before: vanes and aberrations widen the optics part
        CliRun more = run("measure", field.toString(), "--json", "--aperture", "200", "--obstruction", "0.3",
                "--focal-length", "1000", "--pixel-size", "3.76", "--band", "500-600", "--vanes", "4",
                "--vane-width", "3", "--zernike", "4=0.3", "--threads", "1");
        assertEquals(ExitCode.OK, more.exit(), more.err());
        assertTrue(number(more.out(), "optics_fwhm_px") > optics, more.out());
    }

    @Test
    void optionRulesAreOneLineUsageErrors() {
        CliRun noAperture = run("measure", field.toString(), "--obstruction", "0.3");
        assertEquals(ExitCode.USAGE, noAperture.exit(), noAperture.err());
        assertTrue(noAperture.err().startsWith("nitid: --obstruction describes the optics"), noAperture.err());
        CliRun both = run("measure", field.toString(), "--aperture", "200", "--focal-length", "1000",
                "--pixel-size", "3.76", "--wavelength", "550", "--band", "500-600");
        assertEquals(ExitCode.USAGE, both.exit(), both.err());
        assertTrue(both.err().contains("--wavelength and --band"), both.err());
        CliRun vanes = run("measure", field.toString(), "--aperture", "200", "--focal-length", "1000",
                "--pixel-size", "3.76", "--vanes", "4");
        assertEquals(ExitCode.USAGE, vanes.exit(), vanes.err());
        assertTrue(vanes.err().contains("--vane-width"), vanes.err());
        CliRun noFocal = run("measure", field.toString(), "--aperture", "200");
        assertEquals(ExitCode.USAGE, noFocal.exit(), noFocal.err());
        CliRun bin = run("measure", field.toString(), "--binning", "0");
        assertEquals(ExitCode.USAGE, bin.exit(), bin.err());
        assertFalse(bin.err().contains("Exception"), bin.err());
    }
}
