package dev.nitid.synth;

import java.util.List;
import java.util.Locale;

/** The truth catalogue as CSV text: the file format of {@code nitid simulate}'s star list. */
public final class TruthCatalogue {
    /** The CSV header line. */
    public static final String HEADER = "x,y,flux,peak,saturated";

    private TruthCatalogue() {
    }

    /**
     * Formats stars as CSV: the {@link #HEADER} line, then one line per star. {@code x, y} are 0-based pixel
     * coordinates with pixel centres at integers (FITS pixel = x + 1, y + 1); {@code flux} and {@code peak}
     * are ADU of the stack (see {@link TruthStar}); {@code saturated} is {@code true} or {@code false}.
     * Numbers are written with up to 10 significant digits and a dot as the decimal separator.
     *
     * @param stars the catalogue
     * @return the CSV text, lines ending in {@code \n}
     */
    public static String toCsv(List<TruthStar> stars) {
        StringBuilder sb = new StringBuilder(HEADER).append('\n');
        for (TruthStar s : stars) {
            sb.append(String.format(Locale.ROOT, "%.6f,%.6f,%.10g,%.10g,%b%n", s.x(), s.y(), s.flux(), s.peak(),
                    s.saturated()).replace(System.lineSeparator(), "\n"));
        }
        return sb.toString();
    }
}
