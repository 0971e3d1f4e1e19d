package dev.galebench.rt;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;

/**
 * The real-time loop's only view of a board: send one measurement frame, poll for a reply.
 * Both calls are non-blocking, allocate nothing and never throw on bad input from the wire:
 * a bad frame increments a named counter in {@link #counters()} and is dropped.
 *
 * <p>Threading: a link is owned by the real-time thread; {@link #send} and {@link #poll} are
 * called from that thread only. {@link #counters()} may be read from any thread (fields are
 * plain longs written by one thread; readers see eventually consistent values).
 */
public interface BoardLink extends AutoCloseable {
    /** {@link #poll} result: nothing (more) to read now. */
    int POLL_EMPTY = 0;
    /** {@link #poll} result: a valid reply was decoded into the command. */
    int POLL_REPLY = 1;
    /** {@link #poll} result: a frame arrived but was rejected (counted). */
    int POLL_REJECTED = 2;

    /**
     * Encodes {@code view} with {@code sequence} and sends it. Returns true if the frame left,
     * false if the link could not send now (counted as a send failure).
     */
    boolean send(long sequence, SensorView view);

    /**
     * Reads at most one reply. On {@link #POLL_REPLY} the decoded command, including
     * {@link BoardCommand#answeredSequence}, is in {@code out}; otherwise {@code out} is untouched.
     */
    int poll(BoardCommand out);

    /**
     * Frames that arrived at the transport so far, whatever became of them (accepted, rejected,
     * or withheld by fault injection); -1 if this link does not count them. The paced exchange
     * ({@code LoopConfig.replyWaitNs}) waits only while nothing at all has arrived since the
     * last send, so a reply that fault injection drops or delays on purpose is not waited for.
     */
    default long framesReceived() {
        return -1;
    }

    /** Counters of this link (CRC errors, malformed frames, ...). */
    LinkCounters counters();

    /** Releases the socket or port. Not called from the real-time thread while it runs. */
    @Override
    void close();
}
