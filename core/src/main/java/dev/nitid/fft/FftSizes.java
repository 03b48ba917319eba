package dev.nitid.fft;

/**
 * Chooses FFT lengths that are fast to transform.
 *
 * <p>Mixed-radix FFTs are fastest on lengths whose prime factors are all small. We choose the smallest
 * even length ≥ n with factors 2, 3 and 5 only: a raw camera size like 4144×2822 (2822 = 2·17·83) costs
 * several times more than the slightly larger 4320×2880 (common practice, no source; see
 * {@code benchmarks/README.md} for our measurements).
 */
public final class FftSizes {
    private FftSizes() {
    }

    /**
     * The smallest even number ≥ {@code n} whose only prime factors are 2, 3 and 5.
     *
     * @param n required length, ≥ 1
     * @return the fast length
     * @throws IllegalArgumentException if {@code n} is not positive or too large
     */
    public static int nextFast(int n) {
        if (n < 1 || n > (1 << 30)) {
            throw new IllegalArgumentException("FFT length " + n + " must be between 1 and 2^30");
        }
        for (int m = Math.max(2, n + (n & 1)); ; m += 2) {
            if (isSmooth235(m)) {
                return m;
            }
        }
    }

    /**
     * @param n a positive length
     * @return true if {@code n} has no prime factor other than 2, 3 and 5
     */
    public static boolean isSmooth235(int n) {
        if (n < 1) {
            return false;
        }
        for (int f : new int[] {2, 3, 5}) {
            while (n % f == 0) {
                n /= f;
            }
        }
        return n == 1;
    }
}
