/** JMH benchmarks of star measurement. */
package dev.nitid.bench.stars;
