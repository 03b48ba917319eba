package dev.nitid.stars.internal;

import java.util.concurrent.atomic.AtomicInteger;

/**
 * Runs independent tasks 0..n−1 on a few threads. Each task writes only its own outputs, so results do
 * not depend on the thread count or the schedule.
 */
public final class Parallel {
    private Parallel() {
    }

    /** One task, told which worker (0..threads−1) runs it so it can use that worker's scratch space. */
    @FunctionalInterface
    public interface Task {
        /**
         * @param index  task index
         * @param worker worker index
         */
        void run(int index, int worker);
    }

    /**
     * Runs {@code task} for every index in [0, n), dynamically shared among {@code threads} workers.
     *
     * @param n       task count
     * @param threads worker count, ≥ 1 (1 runs on the caller's thread)
     * @param task    the work
     */
    public static void forEach(int n, int threads, Task task) {
        int workers = Math.max(1, Math.min(threads, n));
        if (workers == 1) {
            for (int i = 0; i < n; i++) {
                task.run(i, 0);
            }
            return;
        }
        AtomicInteger next = new AtomicInteger();
        Thread[] pool = new Thread[workers - 1];
        RuntimeException[] failure = new RuntimeException[1];
        Error[] error = new Error[1];
        Runnable[] bodies = new Runnable[workers];
        for (int w = 0; w < workers; w++) {
            final int worker = w;
            bodies[w] = () -> {
                try {
                    for (int i = next.getAndIncrement(); i < n; i = next.getAndIncrement()) {
                        task.run(i, worker);
                    }
                } catch (RuntimeException e) {
                    synchronized (failure) {
                        failure[0] = e;
                    }
                    next.set(n);
                } catch (Error e) {
                    synchronized (failure) {
                        error[0] = e;
                    }
                    next.set(n);
                }
            };
        }
        for (int w = 1; w < workers; w++) {
            pool[w - 1] = new Thread(bodies[w], "nitid-stars-" + w);
            pool[w - 1].setDaemon(true);
            pool[w - 1].start();
        }
        bodies[0].run();
        for (Thread t : pool) {
            try {
                t.join();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while waiting for star-measurement workers", e);
            }
        }
        synchronized (failure) {
            if (error[0] != null) {
                throw error[0];
            }
            if (failure[0] != null) {
                throw failure[0];
            }
        }
    }
}
