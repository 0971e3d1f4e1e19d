package dev.galebench.link;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.FrameLayout;
import dev.galebench.wire.FrameStatus;
import dev.galebench.wire.MeasurementFrame;
import dev.galebench.wire.WireProfile;
import java.nio.ByteBuffer;

/**
 * What every plant-side link shares: encoding into a pre-allocated transmit buffer, decoding
 * and validating replies, the wire-level counters and the fault-injection delay line. A
 * transport only moves bytes ({@link #transmit}, {@link #receive}).
 *
 * <p>Cost per exchange without faults: one encode and one decode of each reply, about 0.15 us
 * for a FULL measurement frame encoded and decoded, CRC included (JMH, WireCodecBenchmark). With faults active each reply is also copied once into the delay
 * line (64 slots of 128 bytes, allocated when the link opens).
 */
abstract class FrameLink implements BoardLink {
    private static final int DELAY_SLOTS = 64;
    /** Bound on transport reads per poll when faults are active (keeps poll bounded). */
    private static final int MAX_READS_PER_POLL = 16;

    final LinkCounters counters = new LinkCounters();
    final LinkFaults faults;
    final WireProfile profile;
    /** Frame to send, at index 0; filled by {@link #send}. */
    final ByteBuffer txFrame;
    /** Received frame, at index 0; filled by {@link #receive}. */
    final ByteBuffer rxFrame;

    private final MeasurementFrame measurement = new MeasurementFrame();
    private final CommandFrame command = new CommandFrame();
    private final CommandFrame delayedCommand = new CommandFrame();
    private final ByteBuffer delayLine;
    private final int[] delayLength = new int[DELAY_SLOTS];
    private final long[] delayDue = new long[DELAY_SLOTS];
    private final long[] delayOrder = new long[DELAY_SLOTS];
    private long admitted;
    private int stored;
    private long lastSentSequence = -1;
    private long sends;
    private long received;

    FrameLink(WireProfile profile, LinkFaults faults, ByteBuffer txFrame, ByteBuffer rxFrame) {
        this.profile = profile;
        this.faults = faults;
        this.txFrame = txFrame;
        this.rxFrame = rxFrame;
        measurement.wrap(txFrame, 0);
        command.wrap(rxFrame, 0);
        delayLine = ByteBuffer.allocateDirect(DELAY_SLOTS * FrameLayout.MAX_FRAME_LENGTH);
        delayedCommand.wrap(delayLine, 0);
        for (int i = 0; i < DELAY_SLOTS; i++) {
            delayLength[i] = -1;
        }
    }

    /** Sends {@code length} bytes of {@link #txFrame}; false if the frame did not leave. */
    abstract boolean transmit(int length);

    /**
     * Moves at most one received frame into {@link #rxFrame}. Returns its length, 0 if
     * nothing is there, -1 if the transport saw a malformed frame (bad framing), already gone.
     */
    abstract int receive();

    @Override
    public final boolean send(long sequence, SensorView view) {
        final int length = measurement.encode(profile, sequence, view);
        lastSentSequence = sequence;
        sends++;
        if (transmit(length)) {
            counters.framesSent++;
            return true;
        }
        counters.sendFailures++;
        return false;
    }

    @Override
    public final int poll(BoardCommand out) {
        final LinkFaults f = faults;
        if (!f.active() && !delayLineBusy()) {
            final int length = receive();
            if (length == 0) {
                return POLL_EMPTY;
            }
            received++;
            if (length < 0) {
                counters.malformedFrames++;
                return POLL_REJECTED;
            }
            return account(command.decode(length, lastSentSequence, out));
        }
        int rejected = 0;
        for (int i = 0; i < MAX_READS_PER_POLL; i++) {
            final int length = receive();
            if (length == 0) {
                break;
            }
            received++;
            if (length < 0) {
                counters.malformedFrames++;
                rejected++;
                continue;
            }
            admit(f, length);
        }
        final int slot = nextDue();
        if (slot < 0) {
            return rejected > 0 ? POLL_REJECTED : POLL_EMPTY;
        }
        final int length = delayLength[slot];
        delayLength[slot] = -1;
        stored--;
        delayedCommand.wrap(delayLine, slot * FrameLayout.MAX_FRAME_LENGTH);
        return account(delayedCommand.decode(length, lastSentSequence, out));
    }

    @Override
    public final long framesReceived() {
        return received;
    }

    @Override
    public final LinkCounters counters() {
        return counters;
    }

    /** Newest sequence sent, -1 before the first send. */
    final long lastSentSequence() {
        return lastSentSequence;
    }

    private int account(int status) {
        switch (status) {
            case FrameStatus.OK:
                counters.repliesAccepted++;
                return POLL_REPLY;
            case FrameStatus.CRC_ERROR:
                counters.crcErrors++;
                return POLL_REJECTED;
            case FrameStatus.INVALID_REFERENCE:
                counters.invalidReferences++;
                return POLL_REJECTED;
            default:
                counters.malformedFrames++;
                return POLL_REJECTED;
        }
    }

    private void admit(LinkFaults f, int length) {
        if (f.silent) {
            f.silencedReplies++;
            return;
        }
        if (f.dropRate > 0 && f.nextDouble() < f.dropRate) {
            f.injectedDrops++;
            return;
        }
        long due = sends;
        if (f.delayRate > 0 && f.nextDouble() < f.delayRate) {
            due += Math.max(0, f.delayExchanges);
            f.injectedDelays++;
        }
        final boolean corrupt = f.corruptRate > 0 && f.nextDouble() < f.corruptRate;
        if (f.truncateRate > 0 && f.nextDouble() < f.truncateRate && length > 1) {
            length -= 1 + (int) ((f.nextLong() >>> 1) % Math.max(1, length / 2));
            if (isFrameLength(length)) {
                length--; // never cut to another valid length: a truncation shows as malformed
            }
            f.injectedTruncations++;
        }
        final boolean duplicate = f.duplicateRate > 0 && f.nextDouble() < f.duplicateRate;
        final int slot = store(length, due);
        if (slot < 0) {
            return;
        }
        if (corrupt) {
            final int at = slot * FrameLayout.MAX_FRAME_LENGTH + (int) ((f.nextLong() >>> 1) % length);
            final int mask = 1 + (int) ((f.nextLong() >>> 1) % 255);
            delayLine.put(at, (byte) (delayLine.get(at) ^ mask));
            f.injectedCorruptions++;
        }
        if (duplicate) {
            final int copy = store(length, due);
            if (copy >= 0) {
                final int from = slot * FrameLayout.MAX_FRAME_LENGTH;
                final int to = copy * FrameLayout.MAX_FRAME_LENGTH;
                for (int i = 0; i < length; i++) {
                    delayLine.put(to + i, delayLine.get(from + i));
                }
                f.injectedDuplicates++;
            }
        }
    }

    private static boolean isFrameLength(int length) {
        return length == FrameLayout.FULL_MEASUREMENT_LENGTH || length == FrameLayout.FULL_COMMAND_LENGTH
                || length == FrameLayout.COMPACT_MEASUREMENT_LENGTH || length == FrameLayout.COMPACT_COMMAND_LENGTH;
    }

    private int store(int length, long due) {
        if (length > FrameLayout.MAX_FRAME_LENGTH) {
            // cannot be a valid frame: keep only the first bytes, the decoder rejects it by length
            length = FrameLayout.MAX_FRAME_LENGTH + 1;
        }
        for (int slot = 0; slot < DELAY_SLOTS; slot++) {
            if (delayLength[slot] < 0) {
                final int base = slot * FrameLayout.MAX_FRAME_LENGTH;
                final int n = Math.min(length, FrameLayout.MAX_FRAME_LENGTH);
                for (int i = 0; i < n; i++) {
                    delayLine.put(base + i, rxFrame.get(i));
                }
                delayLength[slot] = length;
                delayDue[slot] = due;
                delayOrder[slot] = admitted++;
                stored++;
                return slot;
            }
        }
        faults.delayLineOverflows++;
        return -1;
    }

    private int nextDue() {
        int best = -1;
        long bestOrder = Long.MAX_VALUE;
        final long now = sends;
        for (int slot = 0; slot < DELAY_SLOTS; slot++) {
            if (delayLength[slot] >= 0 && delayDue[slot] <= now && delayOrder[slot] < bestOrder) {
                best = slot;
                bestOrder = delayOrder[slot];
            }
        }
        return best;
    }

    private boolean delayLineBusy() {
        return stored > 0;
    }
}
