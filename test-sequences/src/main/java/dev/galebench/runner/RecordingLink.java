package dev.galebench.runner;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.concurrent.locks.LockSupport;

/**
 * A board link that records every reply it delivers into {@link ReplyLog} format, for replay.
 * On the real-time thread it only copies primitives into a pre-allocated ring (no allocation,
 * no lock, no file); a thread named {@code galebench-reply-writer} drains the ring into the
 * file. If the writer ever falls behind by the ring's capacity, replies are counted as lost and
 * the trailer says so (replay then refuses to claim bit-exactness).
 *
 * <p>Exchange bookkeeping: the loop sends frame {@code k} at the end of exchange {@code k-1}
 * and polls the replies for exchange {@code k} afterwards, so a reply polled after
 * {@code send(k)} belongs to exchange {@code k}.
 */
public final class RecordingLink implements BoardLink {
    static final int RING_RECORDS = 1 << 16;
    private final BoardLink inner;
    private final RecordRing ring;
    private final Thread writer;
    private final Path file;
    private volatile boolean done;
    private volatile IOException failure;
    private long lastSent = -1;
    private long lost;
    private volatile long lostPublished;
    private long written;

    /** Starts recording the replies of {@code inner} into {@code file}. */
    public RecordingLink(BoardLink inner, Path file, long stepPeriodNs, int exchangeEverySteps) throws IOException {
        this(inner, file, stepPeriodNs, exchangeEverySteps, RING_RECORDS);
    }

    /** Same, with a ring of {@code ringRecords} (a power of two; tests use a small one). */
    RecordingLink(BoardLink inner, Path file, long stepPeriodNs, int exchangeEverySteps, int ringRecords)
            throws IOException {
        this.ring = new RecordRing(ringRecords, ReplyLog.RECORD_LONGS);
        this.inner = inner;
        this.file = file;
        OutputStream os = Files.newOutputStream(file);
        ByteBuffer header = ByteBuffer.allocate(ReplyLog.HEADER_BYTES);
        ReplyLog.writeHeader(header, stepPeriodNs, exchangeEverySteps);
        os.write(header.array());
        writer = new Thread(() -> drain(os), "galebench-reply-writer");
        writer.setDaemon(true);
        writer.start();
    }

    @Override
    public boolean send(long sequence, SensorView view) {
        lastSent = sequence;
        return inner.send(sequence, view);
    }

    @Override
    public int poll(BoardCommand out) {
        final int r = inner.poll(out);
        if (r == POLL_REPLY) {
            final int at = ring.claim();
            if (at < 0) {
                lost++;
                lostPublished = lost;
            } else {
                ReplyLog.pack(ring.slots, at, lastSent, out);
                ring.publish();
            }
        }
        return r;
    }

    @Override
    public LinkCounters counters() {
        return inner.counters();
    }

    @Override
    public long framesReceived() {
        return inner.framesReceived();
    }

    /** Closes the wrapped link (not the recording: see {@link #finish}). */
    @Override
    public void close() {
        inner.close();
    }

    private void drain(OutputStream os) {
        ByteBuffer buf = ByteBuffer.allocate(ReplyLog.RECORD_BYTES * 1024).order(ByteOrder.LITTLE_ENDIAN);
        try (os) {
            while (true) {
                final boolean last = done;
                long n = ring.available();
                if (n == 0) {
                    if (last) {
                        break;
                    }
                    LockSupport.parkNanos(500_000);
                    continue;
                }
                for (long i = 0; i < n; i++) {
                    if (buf.remaining() < ReplyLog.RECORD_BYTES) {
                        os.write(buf.array(), 0, buf.position());
                        buf.clear();
                    }
                    ReplyLog.putRecord(buf, ring.slots, ring.peek(i));
                }
                ring.release(n);
                written += n;
                os.write(buf.array(), 0, buf.position());
                buf.clear();
            }
            long[] trailer = new long[ReplyLog.RECORD_LONGS];
            trailer[0] = -1;
            trailer[1] = lostPublished;
            ReplyLog.putRecord(buf, trailer, 0);
            os.write(buf.array(), 0, buf.position());
        } catch (IOException e) {
            failure = e;
        }
    }

    /**
     * Ends the recording after the run: drains the ring, writes the trailer, closes the file.
     *
     * @return replies written
     * @throws UncheckedIOException if writing failed
     */
    public long finish() throws InterruptedException {
        done = true;
        writer.join();
        if (failure != null) {
            throw new UncheckedIOException(file + ": " + failure.getMessage(), failure);
        }
        return written;
    }

    /** Replies waiting in the ring for the writer (tests). */
    long pending() {
        return ring.available();
    }

    /** Replies lost because the writer fell behind (0 in a complete recording). */
    public long lost() {
        return lostPublished;
    }
}
