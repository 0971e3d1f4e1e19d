package dev.galebench.runner;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import java.io.BufferedInputStream;
import java.io.EOFException;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.locks.LockSupport;

/**
 * A board link that answers from a recorded {@link ReplyLog}: during exchange {@code k} (after
 * {@code send(k)}) {@link #poll} hands out exactly the replies recorded for exchange {@code k},
 * in their recorded order, then {@link #POLL_EMPTY}. The loop's supervision then takes the same
 * decisions as in the recorded run, so an offline replay reproduces the plant bit for bit.
 *
 * <p>Offline only: a thread named {@code galebench-reply-reader} reads the file ahead into a
 * ring; if the loop is faster, {@link #poll} spins until the reader caught up (no allocation, no
 * lock, no file access on the loop thread).
 */
public final class ReplayLink implements BoardLink {
    private final RecordRing ring = new RecordRing(1 << 14, ReplyLog.RECORD_LONGS);
    private final LinkCounters counters = new LinkCounters();
    private final Thread reader;
    private final ReplyLog.Header header;
    private volatile boolean eof;
    private volatile long lostInRecording = -1;
    private volatile IOException failure;
    private long current = -1;
    private long replayed;
    private long skipped;

    public ReplayLink(Path file) throws IOException {
        InputStream in = new BufferedInputStream(Files.newInputStream(file), 1 << 16);
        try {
            header = ReplyLog.readHeader(in);
        } catch (IOException e) {
            in.close();
            throw e;
        }
        reader = new Thread(() -> fill(in), "galebench-reply-reader");
        reader.setDaemon(true);
        reader.start();
    }

    /** Step and M of the recorded run. */
    public ReplyLog.Header header() {
        return header;
    }

    private void fill(InputStream in) {
        byte[] rec = new byte[ReplyLog.RECORD_BYTES];
        ByteBuffer b = ByteBuffer.wrap(rec).order(ByteOrder.LITTLE_ENDIAN);
        long[] tmp = new long[ReplyLog.RECORD_LONGS];
        try (in) {
            while (true) {
                int n = in.readNBytes(rec, 0, rec.length);
                if (n < rec.length) {
                    throw new EOFException("reply file ends without its trailer (truncated recording)");
                }
                b.clear();
                ReplyLog.getRecord(b, tmp, 0);
                if (tmp[0] == -1) {
                    lostInRecording = tmp[1];
                    break;
                }
                int at;
                while ((at = ring.claim()) < 0) {
                    LockSupport.parkNanos(100_000);
                    if (Thread.currentThread().isInterrupted()) {
                        return;
                    }
                }
                System.arraycopy(tmp, 0, ring.slots, at, ReplyLog.RECORD_LONGS);
                ring.publish();
            }
        } catch (IOException e) {
            failure = e;
        } finally {
            eof = true;
        }
    }

    @Override
    public boolean send(long sequence, SensorView view) {
        current = sequence;
        counters.framesSent++;
        return true;
    }

    @Override
    public int poll(BoardCommand out) {
        while (true) {
            if (ring.available() > 0) {
                final int at = ring.peek(0);
                final long exchange = ring.slots[at];
                if (exchange > current) {
                    return POLL_EMPTY;
                }
                ReplyLog.unpack(ring.slots, at, out);
                ring.release(1);
                replayed++;
                if (exchange < current) {
                    skipped++;
                    continue;
                }
                return POLL_REPLY;
            }
            if (eof && ring.available() == 0) {
                return POLL_EMPTY;
            }
            Thread.onSpinWait();
        }
    }

    @Override
    public LinkCounters counters() {
        return counters;
    }

    @Override
    public void close() {
        reader.interrupt();
    }

    /** Recorded replies that could not be handed out in their exchange (0 in a faithful replay). */
    public long skipped() {
        return skipped;
    }

    /** Replies handed out. */
    public long replayed() {
        return replayed;
    }

    /**
     * After the replay: replies the recording itself had lost (-1 if the trailer was not reached).
     *
     * @throws IOException if the file could not be read to its end
     */
    public long lostInRecording() throws IOException, InterruptedException {
        reader.join(10_000);
        if (failure != null) {
            throw failure;
        }
        return lostInRecording;
    }
}
