/**
 * Shared test helpers: seeded case generation for property tests, assertions that name the failing
 * pixel, and the bundled reference data from external libraries.
 */
package dev.nitid.testdata;
