package dev.nitid.restore.internal;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Runs element-wise passes over a row-major grid in a fixed number of row blocks, on up to {@code threads}
 * threads. The blocks do not depend on the thread count and every per-block partial sum is added in block
 * order, so results are bit-for-bit the same whatever the thread count. Close it to stop its threads.
 */
public final class BlockPasses implements AutoCloseable {
    /** Row blocks per grid (our choice: enough to balance 2 to 16 threads, few enough to keep sums cheap). */
    public static final int MAX_BLOCKS = 64;

    /** One pass over the pixels {@code [from, to)} of block {@code block}. */
    @FunctionalInterface
    public interface Kernel {
        /**
         * @param block block index, 0-based, for per-block partial sums
         * @param from  first pixel index (a row start)
         * @param to    one past the last pixel index (a row start)
         */
        void run(int block, int from, int to);
    }

    private final int width;
    private final int height;
    private final int blocks;
    private final int threads;
    private final ExecutorService pool;

    /**
     * @param width   grid columns
     * @param height  grid rows
     * @param threads worker threads, ≥ 1 (1: everything runs on the caller's thread)
     */
    public BlockPasses(int width, int height, int threads) {
        this.width = width;
        this.height = height;
        this.blocks = Math.min(MAX_BLOCKS, height);
        this.threads = Math.max(1, Math.min(threads, blocks));
        this.pool = this.threads > 1 ? Executors.newFixedThreadPool(this.threads - 1, r -> {
            Thread t = new Thread(r, "nitid-restore-pass");
            t.setDaemon(true);
            return t;
        }) : null;
    }

    /** @return the number of blocks, the length of partial-sum arrays */
    public int blocks() {
        return blocks;
    }

    /**
     * Runs {@code k} over every block and returns when all are done.
     *
     * @param k the pass
     */
    public void run(Kernel k) {
        if (pool == null) {
            for (int b = 0; b < blocks; b++) {
                k.run(b, start(b), start(b + 1));
            }
            return;
        }
        List<Future<?>> futures = new ArrayList<>(threads - 1);
        for (int t = 1; t < threads; t++) {
            final int first = t;
            futures.add(pool.submit(() -> {
                for (int b = first; b < blocks; b += threads) {
                    k.run(b, start(b), start(b + 1));
                }
            }));
        }
        for (int b = 0; b < blocks; b += threads) {
            k.run(b, start(b), start(b + 1));
        }
        for (Future<?> f : futures) {
            try {
                f.get();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while restoring", e);
            } catch (ExecutionException e) {
                Throwable c = e.getCause();
                if (c instanceof RuntimeException re) {
                    throw re;
                }
                if (c instanceof Error er) {
                    throw er;
                }
                throw new IllegalStateException(c);
            }
        }
    }

    private int start(int b) {
        return (int) ((long) height * b / blocks) * width;
    }

    /**
     * @param parts per-block partial sums (input, not modified)
     * @return their sum, added in block order
     */
    public static double sum(double[] parts) {
        double s = 0;
        for (double v : parts) {
            s += v;
        }
        return s;
    }

    @Override
    public void close() {
        if (pool != null) {
            pool.shutdownNow();
        }
    }
}
