package dev.nitid.fits;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * Runs the outside checkers when they are installed: {@code fitsverify} (HEASARC, built on CFITSIO;
 * Debian package fitsverify 4.20) and Python with astropy (Debian python3-astropy 5.2.1) and tifffile
 * (python3-tifffile). Tests that need one call {@link #assumeFitsverify()} / {@link #assumePython()}, so they
 * are skipped, not failed, where the tool is absent; {@code .ci/run} installs them, so CI runs them.
 */
final class ExternalTools {
    private static final long TIMEOUT_S = 60;
    private static Boolean fitsverify;
    private static String python;
    private static boolean pythonProbed;

    private ExternalTools() {
    }

    /** Output and exit code of a finished process. */
    record Result(int exit, String out) {
    }

    static Result run(List<String> cmd) throws IOException, InterruptedException {
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).start();
        byte[] out = p.getInputStream().readAllBytes();
        if (!p.waitFor(TIMEOUT_S, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new IOException("timed out: " + cmd);
        }
        return new Result(p.exitValue(), new String(out, StandardCharsets.UTF_8));
    }

    static synchronized boolean hasFitsverify() {
        if (fitsverify == null) {
            try {
                run(List.of("fitsverify", "-h"));
                fitsverify = true;
            } catch (IOException | InterruptedException e) {
                fitsverify = false;
            }
        }
        return fitsverify;
    }

    /**
     * A Python interpreter that can import astropy, numpy and tifffile. Debian's /usr/bin/python3 comes
     * first because another python3 earlier on PATH may lack the Debian packages.
     */
    static synchronized String python() {
        if (!pythonProbed) {
            pythonProbed = true;
            for (String candidate : new String[] {"/usr/bin/python3", "python3"}) {
                try {
                    if (run(List.of(candidate, "-c", "import astropy, numpy, tifffile")).exit() == 0) {
                        python = candidate;
                        break;
                    }
                } catch (IOException | InterruptedException e) {
                    // try the next one
                }
            }
        }
        return python;
    }

    static void assumeFitsverify() {
        assumeTrue(hasFitsverify(), "fitsverify is not installed (Debian package fitsverify)");
    }

    static void assumePython() {
        assumeTrue(python() != null, "python3 with astropy, numpy and tifffile is not installed");
    }

    /**
     * Asserts fitsverify finds 0 errors and 0 warnings: run as {@code fitsverify -q FILE}, whose exit status
     * is the number of errors plus warnings (fitsverify -h); {@code -e} is not given, so warnings count too.
     */
    static void assertFitsverifyClean(Path file) throws Exception {
        assumeFitsverify();
        Result r = run(List.of("fitsverify", "-q", file.toString()));
        if (r.exit() != 0) {
            Result full = run(List.of("fitsverify", file.toString()));
            assertEquals(0, r.exit(), "fitsverify on " + file + ":\n" + full.out());
        }
    }

    /** Runs a Python snippet with {@code args} as sys.argv[1:]; fails on a non-zero exit. */
    static String python(String code, String... args) throws Exception {
        assumePython();
        List<String> cmd = new ArrayList<>(List.of(python(), "-c", code));
        cmd.addAll(List.of(args));
        Result r = run(cmd);
        assertEquals(0, r.exit(), "python failed:\n" + r.out());
        return r.out();
    }
}
