package dev.galebench.rt;

import com.lmax.disruptor.BatchEventProcessor;
import com.lmax.disruptor.BatchEventProcessorBuilder;
import com.lmax.disruptor.EventHandler;
import com.lmax.disruptor.ExceptionHandler;
import com.lmax.disruptor.RingBuffer;
import com.lmax.disruptor.SleepingWaitStrategy;

import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;

/**
 * One consumer's pre-allocated Disruptor ring and the thread that drains it. Each consumer has
 * its own ring, so a slow dashboard costs the recorder nothing and the missed count is exact
 * per consumer; the price is one copy of the sample per consumer per exchange (a few hundred
 * bytes, tens of ns).
 *
 * <p>Publishing never blocks and never throws: {@link #tryPublish} first asks the sequencer
 * whether a slot is free against the consumer's gating sequence
 * ({@code hasAvailableCapacity(1)}, which reads sequences and allocates nothing); only then does
 * it claim with {@code next()}, which therefore cannot wait. A full ring is a counted miss.
 * ({@code tryNext()} would signal a full ring by throwing {@code InsufficientCapacityException};
 * we keep exceptions off the real-time path.)
 *
 * <p>Consumers wait with a {@link SleepingWaitStrategy}: its producer side does nothing on
 * publish (no lock, no signal); an idle consumer parks for 1 ms at once (no spin, no yield): on a
 * two-core machine the other core belongs to the board, and a ring of 16 384 slots holds 0.8 s
 * of 50 us exchanges, so waking 1 000 times a second per consumer is plenty.
 * Note: with assertions enabled, Disruptor 4's single-producer {@code next()} checks the
 * producer thread under a monitor; run the loop with assertions off for
 * {@code com.lmax.disruptor} (the rt-plant tests do).
 */
final class ConsumerRing {
    private static final long PARK_NS = 1_000_000;

    final SampleConsumer consumer;
    final RingBuffer<Sample> ring;
    private final BatchEventProcessor<Sample> processor;
    private final Thread thread;
    /** Samples this consumer missed (ring full); written by the real-time thread. */
    final AtomicLong missed = new AtomicLong();
    /** Exceptions thrown by the consumer (each costs that sample). */
    final AtomicLong errors = new AtomicLong();
    private volatile Throwable firstError;

    ConsumerRing(SampleConsumer consumer, int ringSize, int signalCount, String threadName) {
        this.consumer = consumer;
        this.ring = RingBuffer.createSingleProducer(() -> new Sample(signalCount), ringSize,
                new SleepingWaitStrategy(0, PARK_NS));
        EventHandler<Sample> handler = (sample, sequence, endOfBatch) -> consumer.onSample(sample);
        this.processor = new BatchEventProcessorBuilder().build(ring, ring.newBarrier(), handler);
        this.processor.setExceptionHandler(new ExceptionHandler<Sample>() {
            @Override
            public void handleEventException(Throwable ex, long sequence, Sample event) {
                note(ex);
            }

            @Override
            public void handleOnStartException(Throwable ex) {
                note(ex);
            }

            @Override
            public void handleOnShutdownException(Throwable ex) {
                note(ex);
            }
        });
        ring.addGatingSequences(processor.getSequence());
        this.thread = new Thread(processor, threadName);
        this.thread.setDaemon(true);
    }

    private void note(Throwable ex) {
        if (firstError == null) {
            firstError = ex;
        }
        errors.incrementAndGet();
    }

    void start() {
        thread.start();
    }

    /**
     * Real-time thread: copies {@code values} and the indices into the next slot and publishes
     * it, or counts a miss if the ring is full. With {@code waitIfFull} (offline back-pressure)
     * it spins until the consumer frees a slot, the consumer thread died, or {@code abortFlag}
     * says stop. Returns true if published.
     */
    boolean tryPublish(long exchangeIndex, long stepIndex, long plantTimeNs, double[] values, boolean waitIfFull,
                       RealTimeLoop abortSource) {
        final RingBuffer<Sample> r = ring;
        if (!r.hasAvailableCapacity(1)) {
            if (!waitIfFull) {
                missed.lazySet(missed.get() + 1);
                return false;
            }
            while (!r.hasAvailableCapacity(1)) {
                if (!thread.isAlive() || abortSource.abortRequested()) {
                    missed.lazySet(missed.get() + 1);
                    return false;
                }
                Thread.onSpinWait();
            }
        }
        final long seq = r.next();
        try {
            final Sample s = r.get(seq);
            s.exchangeIndex = exchangeIndex;
            s.stepIndex = stepIndex;
            s.plantTimeNs = plantTimeNs;
            System.arraycopy(values, 0, s.values, 0, values.length);
        } finally {
            r.publish(seq);
        }
        return true;
    }

    /**
     * After the loop: lets the consumer drain what was published (up to {@code drainTimeoutNs}),
     * stops its thread, counts what it never got as missed, then calls {@code onEnd}.
     */
    void finish(long drainTimeoutNs) throws InterruptedException {
        final long cursor = ring.getCursor();
        final long until = System.nanoTime() + drainTimeoutNs;
        while (processor.getSequence().get() < cursor && thread.isAlive() && System.nanoTime() < until) {
            TimeUnit.MILLISECONDS.sleep(1);
        }
        final long undelivered = cursor - processor.getSequence().get();
        if (undelivered > 0) {
            missed.addAndGet(undelivered);
        }
        processor.halt();
        thread.join(TimeUnit.NANOSECONDS.toMillis(drainTimeoutNs) + 1000);
        try {
            consumer.onEnd(missed.get());
        } catch (RuntimeException e) {
            note(e);
        }
    }

    Throwable firstError() {
        return firstError;
    }

    String name() {
        return thread.getName();
    }
}
