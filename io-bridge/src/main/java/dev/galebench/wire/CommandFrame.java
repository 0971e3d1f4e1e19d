package dev.galebench.wire;

import dev.galebench.plant.BoardCommand;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;

/**
 * Flyweight over one command frame (board to plant) in a caller-owned buffer: the board side
 * {@link #encode}s, the plant side {@link #decode}s and validates. Absolute little-endian
 * access, no allocation, status codes instead of exceptions. One instance per thread.
 *
 * <p>Sequence numbers are 32 bits on the wire. The plant side widens the echoed
 * ("answered") sequence to the 64-bit sequence it sent, relative to the newest sequence it
 * sent: {@code answered = lastSent - ((lastSent - raw) mod 2^32)}. A raw value that would
 * lie in the future (more than 2^31 behind) is a frame answering nothing that was sent:
 * {@link FrameStatus#MALFORMED}.
 */
public final class CommandFrame {
    private final Crc32c crc = new Crc32c();
    private ByteBuffer buffer;
    private int offset;

    /** Points this flyweight at {@code buffer[offset ..]}; sets the buffer to little-endian. */
    public CommandFrame wrap(ByteBuffer buffer, int offset) {
        buffer.order(ByteOrder.LITTLE_ENDIAN);
        this.buffer = buffer;
        this.offset = offset;
        return this;
    }

    /**
     * Writes a complete command frame. {@code replySequence} is the board's own reply counter,
     * {@code answeredSequence} the sequence of the measurement frame answered (low 32 bits are
     * sent). COMPACT saturates duties into 0..1 and pitch into +/-3.2767 rad; NaN travels as
     * the NaN raw so the plant rejects it. Returns the frame length.
     */
    public int encode(WireProfile profile, long replySequence, long answeredSequence, BoardCommand c) {
        final ByteBuffer b = buffer;
        final int o = offset;
        b.put(o + FrameLayout.OFFSET_MAGIC, (byte) FrameLayout.MAGIC_0);
        b.put(o + FrameLayout.OFFSET_MAGIC + 1, (byte) FrameLayout.MAGIC_1);
        b.put(o + FrameLayout.OFFSET_VERSION, (byte) FrameLayout.VERSION);
        b.putInt(o + FrameLayout.OFFSET_SEQUENCE, (int) replySequence);
        if (profile == WireProfile.FULL) {
            b.put(o + FrameLayout.OFFSET_KIND, (byte) FrameLayout.KIND_COMMAND_FULL);
            b.putInt(o + FrameLayout.FC_ANSWERED_SEQUENCE, (int) answeredSequence);
            b.putFloat(o + FrameLayout.FC_MSC_DUTY_A, (float) c.mscDutyA);
            b.putFloat(o + FrameLayout.FC_MSC_DUTY_A + 4, (float) c.mscDutyB);
            b.putFloat(o + FrameLayout.FC_MSC_DUTY_A + 8, (float) c.mscDutyC);
            b.putFloat(o + FrameLayout.FC_GSC_DUTY_A, (float) c.gscDutyA);
            b.putFloat(o + FrameLayout.FC_GSC_DUTY_A + 4, (float) c.gscDutyB);
            b.putFloat(o + FrameLayout.FC_GSC_DUTY_A + 8, (float) c.gscDutyC);
            b.putFloat(o + FrameLayout.FC_CHOPPER_DUTY, (float) c.chopperDuty);
            b.putFloat(o + FrameLayout.FC_PITCH_REF, (float) c.pitchRefRad);
            b.putInt(o + FrameLayout.FC_COMMAND_FLAGS, c.commandFlags);
            b.putInt(o + FrameLayout.FC_BOARD_STATUS, c.boardStatus);
            b.putInt(o + FrameLayout.FC_CRC, crc.of(b, o, FrameLayout.FC_CRC));
            return FrameLayout.FULL_COMMAND_LENGTH;
        }
        b.put(o + FrameLayout.OFFSET_KIND, (byte) FrameLayout.KIND_COMMAND_COMPACT);
        b.putInt(o + FrameLayout.CC_ANSWERED_SEQUENCE, (int) answeredSequence);
        final double lsb = FrameLayout.LSB_DUTY;
        b.putShort(o + FrameLayout.CC_MSC_DUTY_A, Scaled.toUint16(c.mscDutyA, lsb));
        b.putShort(o + FrameLayout.CC_MSC_DUTY_A + 2, Scaled.toUint16(c.mscDutyB, lsb));
        b.putShort(o + FrameLayout.CC_MSC_DUTY_A + 4, Scaled.toUint16(c.mscDutyC, lsb));
        b.putShort(o + FrameLayout.CC_GSC_DUTY_A, Scaled.toUint16(c.gscDutyA, lsb));
        b.putShort(o + FrameLayout.CC_GSC_DUTY_A + 2, Scaled.toUint16(c.gscDutyB, lsb));
        b.putShort(o + FrameLayout.CC_GSC_DUTY_A + 4, Scaled.toUint16(c.gscDutyC, lsb));
        b.putShort(o + FrameLayout.CC_CHOPPER_DUTY, Scaled.toUint16(c.chopperDuty, lsb));
        b.putShort(o + FrameLayout.CC_PITCH_REF, Scaled.toInt16(c.pitchRefRad, FrameLayout.LSB_PITCH_RAD));
        b.putShort(o + FrameLayout.CC_COMMAND_FLAGS, (short) c.commandFlags);
        b.putShort(o + FrameLayout.CC_BOARD_STATUS, (short) c.boardStatus);
        b.putInt(o + FrameLayout.CC_CRC, crc.of(b, o, FrameLayout.CC_CRC));
        return FrameLayout.COMPACT_COMMAND_LENGTH;
    }

    /**
     * Checks, validates and decodes a command frame of {@code length} bytes (either profile).
     * {@code lastSentSequence} is the newest measurement sequence sent (-1 if none). On
     * {@link FrameStatus#OK} every field of {@code out} is written, {@code answeredSequence}
     * widened to 64 bits; on any other status {@code out} is untouched.
     *
     * <p>Validation: every duty and the chopper duty finite and in [0, 1]; pitch reference
     * finite and |pitch| &le; {@link FrameLayout#PITCH_REF_LIMIT_RAD}; no command flag outside
     * {@link FrameLayout#COMMAND_FLAGS_MASK}. Otherwise {@link FrameStatus#INVALID_REFERENCE}.
     */
    public int decode(int length, long lastSentSequence, BoardCommand out) {
        final ByteBuffer b = buffer;
        final int o = offset;
        final int kind = FrameChecks.checkFrame(crc, b, o, length);
        if (kind < 0) {
            return -kind;
        }
        final double ma;
        final double mb;
        final double mc;
        final double ga;
        final double gb;
        final double gc;
        final double ch;
        final double pitch;
        final int flags;
        final int status;
        final long raw;
        if (kind == FrameLayout.KIND_COMMAND_FULL) {
            raw = b.getInt(o + FrameLayout.FC_ANSWERED_SEQUENCE) & 0xFFFFFFFFL;
            ma = b.getFloat(o + FrameLayout.FC_MSC_DUTY_A);
            mb = b.getFloat(o + FrameLayout.FC_MSC_DUTY_A + 4);
            mc = b.getFloat(o + FrameLayout.FC_MSC_DUTY_A + 8);
            ga = b.getFloat(o + FrameLayout.FC_GSC_DUTY_A);
            gb = b.getFloat(o + FrameLayout.FC_GSC_DUTY_A + 4);
            gc = b.getFloat(o + FrameLayout.FC_GSC_DUTY_A + 8);
            ch = b.getFloat(o + FrameLayout.FC_CHOPPER_DUTY);
            pitch = b.getFloat(o + FrameLayout.FC_PITCH_REF);
            flags = b.getInt(o + FrameLayout.FC_COMMAND_FLAGS);
            status = b.getInt(o + FrameLayout.FC_BOARD_STATUS);
        } else if (kind == FrameLayout.KIND_COMMAND_COMPACT) {
            final double lsb = FrameLayout.LSB_DUTY;
            raw = b.getInt(o + FrameLayout.CC_ANSWERED_SEQUENCE) & 0xFFFFFFFFL;
            ma = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_MSC_DUTY_A), lsb);
            mb = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_MSC_DUTY_A + 2), lsb);
            mc = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_MSC_DUTY_A + 4), lsb);
            ga = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_GSC_DUTY_A), lsb);
            gb = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_GSC_DUTY_A + 2), lsb);
            gc = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_GSC_DUTY_A + 4), lsb);
            ch = Scaled.fromUint16(b.getShort(o + FrameLayout.CC_CHOPPER_DUTY), lsb);
            pitch = Scaled.fromInt16(b.getShort(o + FrameLayout.CC_PITCH_REF), FrameLayout.LSB_PITCH_RAD);
            flags = b.getShort(o + FrameLayout.CC_COMMAND_FLAGS) & 0xFFFF;
            status = b.getShort(o + FrameLayout.CC_BOARD_STATUS) & 0xFFFF;
        } else {
            return FrameStatus.MALFORMED;
        }
        if (lastSentSequence < 0) {
            return FrameStatus.MALFORMED;
        }
        final long behind = (lastSentSequence - raw) & 0xFFFFFFFFL;
        if (behind >= 0x80000000L || behind > lastSentSequence) {
            return FrameStatus.MALFORMED;
        }
        if (!duty(ma) || !duty(mb) || !duty(mc) || !duty(ga) || !duty(gb) || !duty(gc) || !duty(ch)
                || !(pitch >= -FrameLayout.PITCH_REF_LIMIT_RAD && pitch <= FrameLayout.PITCH_REF_LIMIT_RAD)
                || (flags & ~FrameLayout.COMMAND_FLAGS_MASK) != 0) {
            return FrameStatus.INVALID_REFERENCE;
        }
        out.mscDutyA = ma;
        out.mscDutyB = mb;
        out.mscDutyC = mc;
        out.gscDutyA = ga;
        out.gscDutyB = gb;
        out.gscDutyC = gc;
        out.chopperDuty = ch;
        out.pitchRefRad = pitch;
        out.commandFlags = flags;
        out.boardStatus = status;
        out.answeredSequence = lastSentSequence - behind;
        return FrameStatus.OK;
    }

    /** The board's reply counter (header sequence) of the wrapped frame, unsigned 32 bits. */
    public long replySequence() {
        return buffer.getInt(offset + FrameLayout.OFFSET_SEQUENCE) & 0xFFFFFFFFL;
    }

    /** The answered sequence as on the wire (unsigned 32 bits), for either profile (same offset). */
    public long answeredSequenceRaw() {
        return buffer.getInt(offset + FrameLayout.FC_ANSWERED_SEQUENCE) & 0xFFFFFFFFL;
    }

    private static boolean duty(double d) {
        return d >= 0.0 && d <= 1.0;
    }
}
