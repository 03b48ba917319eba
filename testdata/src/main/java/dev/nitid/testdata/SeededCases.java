package dev.nitid.testdata;

import java.util.SplittableRandom;
import java.util.function.Function;
import java.util.stream.IntStream;
import java.util.stream.Stream;

/**
 * Seeded cases for property tests: JUnit 5 parameterized tests take their arguments from
 * {@link #seeds(String, int)}, and each case draws from a {@link SplittableRandom} seeded with its seed.
 *
 * <p>Every case's display name carries its seed, so a failure says how to replay it:
 * {@code mvn verify -Dnitid.seed=SEED} runs only that seed in every property test.
 *
 * <pre>{@code
 * static Stream<Long> cases() { return SeededCases.seeds("convolve-adjoint", 40); }
 *
 * @ParameterizedTest(name = "seed {0}")
 * @MethodSource("cases")
 * void adjointIdentity(long seed) { var rnd = new SplittableRandom(seed); ... }
 * }</pre>
 */
public final class SeededCases {
    /** System property that replays one seed. */
    public static final String SEED_PROPERTY = "nitid.seed";

    private SeededCases() {
    }

    /**
     * The seeds for one property: {@code count} seeds derived from the property's name, or only the seed
     * given in {@code -Dnitid.seed}.
     *
     * @param property a stable name for the property (changes the seeds)
     * @param count    how many cases
     * @return the seeds
     */
    public static Stream<Long> seeds(String property, int count) {
        String replay = System.getProperty(SEED_PROPERTY, "").trim();
        if (!replay.isEmpty()) {
            return Stream.of(Long.parseLong(replay));
        }
        SplittableRandom root = new SplittableRandom(property.hashCode() * 0x9E3779B97F4A7C15L);
        return IntStream.range(0, count).mapToObj(i -> root.nextLong() & Long.MAX_VALUE);
    }

    /**
     * Maps seeds to cases built by {@code maker}.
     *
     * @param property a stable name for the property
     * @param count    how many cases
     * @param maker    builds one case from its random source
     * @param <T>      the case type
     * @return the cases, each remembering its seed
     */
    public static <T> Stream<Case<T>> cases(String property, int count, Function<SplittableRandom, T> maker) {
        return seeds(property, count).map(s -> new Case<>(s, maker.apply(new SplittableRandom(s))));
    }

    /**
     * One generated case and the seed that made it.
     *
     * @param seed  replay with {@code -Dnitid.seed=seed}
     * @param value the case
     * @param <T>   the case type
     */
    public record Case<T>(long seed, T value) {
        @Override
        public String toString() {
            return "seed " + seed + " (replay: -Dnitid.seed=" + seed + ")";
        }
    }
}
