/**
 * JMH benchmarks of the restorers: Richardson–Lucy per-iteration time on large frames, and the memory
 * check of a long run at 4096². Run through {@code benchmarks/scripts/restore_speed/restore_speed.py}, which
 * measures scikit-image and a numpy peer in the same run.
 */
package dev.nitid.bench.restore;
