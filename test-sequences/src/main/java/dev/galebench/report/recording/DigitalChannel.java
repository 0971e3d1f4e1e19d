package dev.galebench.report.recording;

/**
 * One COMTRADE status (digital) channel: one bit of a recorded bit-flag signal, e.g. bit
 * {@code TRIP_DC_OVERVOLTAGE} of {@code trip_flags}, or the whole of a 0/1 signal such as
 * {@code frt_active} (mask 1). The bit is read from the signal value cast to a long.
 *
 * @param signalName  the recorded signal carrying the bit
 * @param bitMask     mask of the bit within the signal value (one bit set)
 * @param channelName channel id written to the .cfg (no commas)
 * @param normalState the state of the bit in normal operation (0 or 1), the .cfg {@code y} field
 */
public record DigitalChannel(String signalName, long bitMask, String channelName, int normalState) {
    public DigitalChannel {
        if (Long.bitCount(bitMask) != 1) {
            throw new IllegalArgumentException("digital channel '" + channelName + "' needs exactly one bit in its mask, got 0x" + Long.toHexString(bitMask));
        }
        if (normalState != 0 && normalState != 1) {
            throw new IllegalArgumentException("digital channel '" + channelName + "' normal state must be 0 or 1");
        }
        if (channelName.indexOf(',') >= 0 || signalName.indexOf(',') >= 0) {
            throw new IllegalArgumentException("digital channel names may not contain commas: '" + channelName + "'");
        }
    }
}
