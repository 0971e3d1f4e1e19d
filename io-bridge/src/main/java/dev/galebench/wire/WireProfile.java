package dev.galebench.wire;

/**
 * The two frame profiles of wire version 1. Both carry the same header and CRC; they differ
 * in payload encoding. See {@link FrameLayout} for the byte layout of each frame kind.
 *
 * <table>
 *   <caption>Profiles</caption>
 *   <tr><th>profile</th><th>values</th><th>measurement frame</th><th>command frame</th><th>meant for</th></tr>
 *   <tr><td>FULL</td><td>IEEE-754 float32, SI units</td><td>128 B</td><td>56 B</td><td>UDP, bring-up (carries dq values)</td></tr>
 *   <tr><td>COMPACT</td><td>scaled int16/uint16</td><td>54 B</td><td>36 B</td><td>serial lines (no dq values)</td></tr>
 * </table>
 */
public enum WireProfile {
    /** float32 values, dq bring-up values included. */
    FULL(FrameLayout.KIND_MEASUREMENT_FULL, FrameLayout.KIND_COMMAND_FULL,
            FrameLayout.FULL_MEASUREMENT_LENGTH, FrameLayout.FULL_COMMAND_LENGTH),
    /** Scaled 16-bit values sized for serial lines. */
    COMPACT(FrameLayout.KIND_MEASUREMENT_COMPACT, FrameLayout.KIND_COMMAND_COMPACT,
            FrameLayout.COMPACT_MEASUREMENT_LENGTH, FrameLayout.COMPACT_COMMAND_LENGTH);

    /** Kind byte of this profile's measurement frame. */
    public final int measurementKind;
    /** Kind byte of this profile's command frame. */
    public final int commandKind;
    /** Measurement frame length in bytes, CRC included. */
    public final int measurementLength;
    /** Command frame length in bytes, CRC included. */
    public final int commandLength;

    WireProfile(int measurementKind, int commandKind, int measurementLength, int commandLength) {
        this.measurementKind = measurementKind;
        this.commandKind = commandKind;
        this.measurementLength = measurementLength;
        this.commandLength = commandLength;
    }

    /** Parses {@code full} or {@code compact} (case-insensitive). */
    public static WireProfile parse(String name) {
        if ("full".equalsIgnoreCase(name)) {
            return FULL;
        }
        if ("compact".equalsIgnoreCase(name)) {
            return COMPACT;
        }
        throw new IllegalArgumentException("unknown wire profile '" + name + "' (expected full or compact)");
    }
}
