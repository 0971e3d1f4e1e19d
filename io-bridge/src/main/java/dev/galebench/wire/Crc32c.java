package dev.galebench.wire;

import java.nio.ByteBuffer;

/**
 * CRC-32C (Castagnoli), the checksum every galebench frame ends with.
 *
 * <p>Parameters (catalogue name CRC-32/ISCSI): width 32, polynomial 0x1EDC6F41 (reflected
 * 0x82F63B78), init 0xFFFFFFFF, input and output reflected, final XOR 0xFFFFFFFF. Check value
 * for the ASCII bytes {@code "123456789"}: {@code 0xE3069283}. Chosen over a CRC-16 because
 * it detects every burst up to 32 bits and all 1-3 bit errors at our frame lengths, and the
 * same 1 KiB table serves the C kit on an MCU without a hardware CRC unit.
 *
 * <p>Two implementations of the same function. The static methods are table-driven, one
 * lookup per byte, like the C kit: the portable reference. The instance method
 * {@link #of(ByteBuffer, int, int)} runs {@link java.util.zip.CRC32C}, which the JVM compiles
 * to the CPU's CRC32 instruction where there is one (SSE4.2, ARMv8): several times faster on
 * a frame (see io-bridge/README.md). The codec flyweights use an instance each; both paths
 * allocate nothing and are tested against each other.
 */
public final class Crc32c {
    private final java.util.zip.CRC32C jdk = new java.util.zip.CRC32C();

    /**
     * CRC-32C of {@code length} bytes of {@code buffer} from absolute index {@code offset},
     * through the JDK's intrinsic. The buffer's position and limit are restored on return.
     * One instance per thread.
     */
    public int of(ByteBuffer buffer, int offset, int length) {
        final int position = buffer.position();
        final int limit = buffer.limit();
        buffer.limit(offset + length);
        buffer.position(offset);
        final java.util.zip.CRC32C c = jdk;
        c.reset();
        c.update(buffer);
        buffer.limit(limit);
        buffer.position(position);
        return (int) c.getValue();
    }

    private static final int[] TABLE = new int[256];

    static {
        for (int i = 0; i < 256; i++) {
            int c = i;
            for (int k = 0; k < 8; k++) {
                c = (c & 1) != 0 ? (c >>> 1) ^ 0x82F63B78 : c >>> 1;
            }
            TABLE[i] = c;
        }
    }

    /** An instance for {@link #of}; one per thread. */
    public Crc32c() {
        // the JDK CRC32C object is the only state
    }

    /** CRC-32C of {@code length} bytes of {@code buffer} starting at absolute index {@code offset}. */
    public static int compute(ByteBuffer buffer, int offset, int length) {
        int crc = 0xFFFFFFFF;
        final int end = offset + length;
        for (int i = offset; i < end; i++) {
            crc = (crc >>> 8) ^ TABLE[(crc ^ buffer.get(i)) & 0xFF];
        }
        return ~crc;
    }

    /** CRC-32C of {@code length} bytes of {@code bytes} starting at {@code offset}. */
    public static int compute(byte[] bytes, int offset, int length) {
        int crc = 0xFFFFFFFF;
        final int end = offset + length;
        for (int i = offset; i < end; i++) {
            crc = (crc >>> 8) ^ TABLE[(crc ^ bytes[i]) & 0xFF];
        }
        return ~crc;
    }
}
