package dev.galebench.runner;

import dev.galebench.plant.BoardCommand;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;

/**
 * The file of a board's replies, {@code board-replies.bin}: every reply the link delivered
 * during a run, with the exchange in which it was polled, so that {@code galebench replay} can
 * hand the same replies to the same supervision at the same exchanges and re-run the plant
 * offline bit for bit. Format version 1, little-endian:
 *
 * <pre>
 *  header, 32 bytes
 *   0  8 bytes  magic "GBREPLY1"
 *   8  int      format version (1)
 *  12  int      record size in bytes (88)
 *  16  long     plant step, ns
 *  24  int      plant steps per exchange (M)
 *  28  int      reserved (0)
 *  record, 88 bytes, one per reply, in the order polled
 *   0  long     exchange in which the reply was polled (0-based; = last sequence sent)
 *   8  long     answeredSequence
 *  16  double   mscDutyA, mscDutyB, mscDutyC      (16, 24, 32)
 *  40  double   gscDutyA, gscDutyB, gscDutyC      (40, 48, 56)
 *  64  double   chopperDuty
 *  72  double   pitchRefRad
 *  80  int      commandFlags
 *  84  int      boardStatus
 *  trailer, one record with exchange = -1 and answeredSequence = replies lost because the
 *  writer fell behind (0 in a complete file); the other fields are 0
 * </pre>
 *
 * Doubles are written as their raw IEEE-754 bits, so NaN payloads survive.
 */
public final class ReplyLog {
    /** File name inside a run folder. */
    public static final String FILE_NAME = "board-replies.bin";
    static final byte[] MAGIC = "GBREPLY1".getBytes(StandardCharsets.US_ASCII);
    static final int VERSION = 1;
    static final int HEADER_BYTES = 32;
    static final int RECORD_BYTES = 88;
    /** Longs per record in memory rings (same fields, ints packed in one long). */
    static final int RECORD_LONGS = 11;

    private ReplyLog() {
    }

    static void writeHeader(ByteBuffer b, long stepPeriodNs, int exchangeEverySteps) {
        b.order(ByteOrder.LITTLE_ENDIAN);
        b.put(MAGIC).putInt(VERSION).putInt(RECORD_BYTES).putLong(stepPeriodNs).putInt(exchangeEverySteps).putInt(0);
    }

    /** Packs {@code c} polled in {@code exchange} into {@code ring[at .. at + RECORD_LONGS)} (no allocation). */
    static void pack(long[] ring, int at, long exchange, BoardCommand c) {
        ring[at] = exchange;
        ring[at + 1] = c.answeredSequence;
        ring[at + 2] = Double.doubleToRawLongBits(c.mscDutyA);
        ring[at + 3] = Double.doubleToRawLongBits(c.mscDutyB);
        ring[at + 4] = Double.doubleToRawLongBits(c.mscDutyC);
        ring[at + 5] = Double.doubleToRawLongBits(c.gscDutyA);
        ring[at + 6] = Double.doubleToRawLongBits(c.gscDutyB);
        ring[at + 7] = Double.doubleToRawLongBits(c.gscDutyC);
        ring[at + 8] = Double.doubleToRawLongBits(c.chopperDuty);
        ring[at + 9] = Double.doubleToRawLongBits(c.pitchRefRad);
        ring[at + 10] = ((long) c.boardStatus << 32) | (c.commandFlags & 0xFFFFFFFFL);
    }

    /** Unpacks a ring record into {@code c}; returns its exchange. */
    static long unpack(long[] ring, int at, BoardCommand c) {
        c.answeredSequence = ring[at + 1];
        c.mscDutyA = Double.longBitsToDouble(ring[at + 2]);
        c.mscDutyB = Double.longBitsToDouble(ring[at + 3]);
        c.mscDutyC = Double.longBitsToDouble(ring[at + 4]);
        c.gscDutyA = Double.longBitsToDouble(ring[at + 5]);
        c.gscDutyB = Double.longBitsToDouble(ring[at + 6]);
        c.gscDutyC = Double.longBitsToDouble(ring[at + 7]);
        c.chopperDuty = Double.longBitsToDouble(ring[at + 8]);
        c.pitchRefRad = Double.longBitsToDouble(ring[at + 9]);
        c.commandFlags = (int) ring[at + 10];
        c.boardStatus = (int) (ring[at + 10] >>> 32);
        return ring[at];
    }

    /** Writes a packed ring record as one 88-byte file record. */
    static void putRecord(ByteBuffer b, long[] ring, int at) {
        for (int i = 0; i < 10; i++) {
            b.putLong(ring[at + i]);
        }
        b.putInt((int) ring[at + 10]);
        b.putInt((int) (ring[at + 10] >>> 32));
    }

    /** Reads one file record into a ring slot. */
    static void getRecord(ByteBuffer b, long[] ring, int at) {
        for (int i = 0; i < 10; i++) {
            ring[at + i] = b.getLong();
        }
        long flags = b.getInt() & 0xFFFFFFFFL;
        long status = b.getInt() & 0xFFFFFFFFL;
        ring[at + 10] = (status << 32) | flags;
    }

    /** Header of a reply file, read and checked. */
    public record Header(long stepPeriodNs, int exchangeEverySteps) {
    }

    /**
     * Reads and checks the header.
     *
     * @throws IOException naming what is wrong (not a reply file, other version)
     */
    public static Header readHeader(InputStream in) throws IOException {
        byte[] h = new DataInputStream(in).readNBytes(HEADER_BYTES);
        if (h.length < HEADER_BYTES) {
            throw new IOException(FILE_NAME + ": truncated header");
        }
        ByteBuffer b = ByteBuffer.wrap(h).order(ByteOrder.LITTLE_ENDIAN);
        byte[] magic = new byte[8];
        b.get(magic);
        if (!java.util.Arrays.equals(magic, MAGIC)) {
            throw new IOException(FILE_NAME + ": not a galebench reply file (bad magic)");
        }
        int version = b.getInt(), size = b.getInt();
        if (version != VERSION || size != RECORD_BYTES) {
            throw new IOException(FILE_NAME + ": format version " + version + " (record " + size + " bytes) is not "
                    + "supported; this galebench reads version " + VERSION);
        }
        return new Header(b.getLong(), b.getInt());
    }
}
