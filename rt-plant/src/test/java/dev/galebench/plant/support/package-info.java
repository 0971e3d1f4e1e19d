/**
 * Shared fixtures of the plant tests (exported in the rt-plant test jar): an open-loop
 * driver that holds an operating point's converter voltages, and a scripted input scenario.
 */
package dev.galebench.plant.support;
