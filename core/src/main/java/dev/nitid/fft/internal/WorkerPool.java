package dev.nitid.fft.internal;

import java.lang.ref.Cleaner;

/**
 * A fixed set of worker threads that splits an index range into one contiguous chunk per worker.
 *
 * <p>Chunk {@code t} of {@code [0, n)} is {@code [⌊n·t/T⌋, ⌊n·(t+1)/T⌋)}. The caller's thread runs chunk
 * 0, so {@code T} threads use {@code T − 1} extra threads. Which thread runs an index never changes the
 * arithmetic done on it, so results are identical whatever {@code T} (the callers make every index
 * independent). Running a range allocates nothing.
 *
 * <p>The workers are daemon threads: they never keep the JVM alive. {@link #close()} stops them at once;
 * a pool that becomes unreachable without being closed stops them too (through a {@link Cleaner}).
 * One caller at a time: {@link #run} is not re-entrant and must not be called concurrently.
 */
public final class WorkerPool implements AutoCloseable {
    private static final Cleaner CLEANER = Cleaner.create(r -> {
        Thread t = new Thread(r, "nitid-fft-cleaner");
        t.setDaemon(true);
        return t;
    });

    private final State state;
    private final Cleaner.Cleanable cleanable;

    /**
     * Starts {@code threads − 1} daemon workers.
     *
     * @param threads total threads including the caller's, ≥ 1
     */
    public WorkerPool(int threads) {
        if (threads < 1) {
            throw new IllegalArgumentException("threads is " + threads + ": use at least 1");
        }
        this.state = new State(threads);
        for (int t = 1; t < threads; t++) {
            int id = t;
            Thread worker = new Thread(() -> state.loop(id), "nitid-fft-" + t);
            worker.setDaemon(true);
            worker.start();
        }
        this.cleanable = CLEANER.register(this, state::shutdown);
    }

    /** @return total threads, including the caller's */
    public int threads() {
        return state.threads;
    }

    /**
     * Runs {@code task} over {@code [0, n)}, one contiguous chunk per thread, and waits for all chunks.
     *
     * @param n    range length, ≥ 0
     * @param task the work (must treat every index independently)
     */
    public void run(int n, RangeTask task) {
        state.run(n, task);
    }

    /** Stops the workers. The pool must not be used afterwards. Idempotent. */
    @Override
    public void close() {
        cleanable.clean();
    }

    /** Everything the workers touch; it must not reference the pool, or the Cleaner would never fire. */
    private static final class State {
        final int threads;
        private RangeTask task;
        private int n;
        private long generation;
        private int pending;
        private Throwable failure;
        private boolean closed;

        State(int threads) {
            this.threads = threads;
        }

        static int chunkStart(int n, int t, int threads) {
            return (int) ((long) n * t / threads);
        }

        void run(int n, RangeTask task) {
            if (threads == 1 || n <= 1) {
                task.run(0, 0, n);
                return;
            }
            synchronized (this) {
                if (closed) {
                    throw new IllegalStateException("this FFT plan was closed: build a new one");
                }
                this.task = task;
                this.n = n;
                this.pending = threads - 1;
                this.failure = null;
                generation++;
                notifyAll();
            }
            Throwable mine = null;
            try {
                task.run(0, 0, chunkStart(n, 1, threads));
            } catch (RuntimeException | Error e) {
                mine = e;
            }
            boolean interrupted = false;
            Throwable theirs;
            synchronized (this) {
                while (pending > 0) {
                    try {
                        wait();
                    } catch (InterruptedException e) {
                        interrupted = true;
                    }
                }
                theirs = failure;
                this.task = null;
            }
            if (interrupted) {
                Thread.currentThread().interrupt();
            }
            Throwable first = mine != null ? mine : theirs;
            if (first instanceof RuntimeException re) {
                throw re;
            }
            if (first instanceof Error er) {
                throw er;
            }
        }

        void loop(int id) {
            long seen = 0;
            while (true) {
                RangeTask t;
                int len;
                synchronized (this) {
                    while (generation == seen && !closed) {
                        try {
                            wait();
                        } catch (InterruptedException e) {
                            return;
                        }
                    }
                    if (closed) {
                        return;
                    }
                    seen = generation;
                    t = task;
                    len = n;
                }
                try {
                    t.run(id, chunkStart(len, id, threads), chunkStart(len, id + 1, threads));
                } catch (RuntimeException | Error e) {
                    synchronized (this) {
                        if (failure == null) {
                            failure = e;
                        }
                    }
                }
                synchronized (this) {
                    if (--pending == 0) {
                        notifyAll();
                    }
                }
            }
        }

        synchronized void shutdown() {
            closed = true;
            notifyAll();
        }
    }
}
