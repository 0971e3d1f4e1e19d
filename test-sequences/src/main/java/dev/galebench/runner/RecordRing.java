package dev.galebench.runner;

import java.util.concurrent.atomic.AtomicLong;

/**
 * A single-producer single-consumer ring of fixed-size records of longs, pre-allocated. The
 * producer never waits: a full ring is reported to it (it counts the loss). Used to move
 * board replies between the real-time thread and a file thread without allocation or locks.
 */
final class RecordRing {
    final long[] slots;
    final int recordLongs;
    final int capacity;
    private final int mask;
    private final AtomicLong head = new AtomicLong();
    private final AtomicLong tail = new AtomicLong();
    private long cachedTail;

    RecordRing(int capacityPowerOfTwo, int recordLongs) {
        if (Integer.bitCount(capacityPowerOfTwo) != 1) {
            throw new IllegalArgumentException("capacity must be a power of two");
        }
        this.capacity = capacityPowerOfTwo;
        this.mask = capacityPowerOfTwo - 1;
        this.recordLongs = recordLongs;
        this.slots = new long[capacityPowerOfTwo * recordLongs];
    }

    /** Producer: offset of a free slot to fill, or -1 if the ring is full. */
    int claim() {
        final long h = head.get();
        if (h - cachedTail >= capacity) {
            cachedTail = tail.get();
            if (h - cachedTail >= capacity) {
                return -1;
            }
        }
        return (int) (h & mask) * recordLongs;
    }

    /** Producer: publishes the slot filled after {@link #claim}. */
    void publish() {
        head.lazySet(head.get() + 1);
    }

    /** Consumer: records available to read. */
    long available() {
        return head.get() - tail.get();
    }

    /** Consumer: offset of the {@code i}-th unread record ({@code i < available()}). */
    int peek(long i) {
        return (int) ((tail.get() + i) & mask) * recordLongs;
    }

    /** Consumer: marks {@code n} records read. */
    void release(long n) {
        tail.lazySet(tail.get() + n);
    }
}
