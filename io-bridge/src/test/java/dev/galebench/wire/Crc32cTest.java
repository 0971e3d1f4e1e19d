package dev.galebench.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.SplittableRandom;
import java.util.zip.CRC32C;
import org.junit.jupiter.api.Test;

class Crc32cTest {
    @Test
    void shouldMatchCatalogueCheckValue() {
        // CRC-32/ISCSI check value for "123456789": 0xE3069283 (RevEng CRC catalogue; RFC 3720 B.4)
        final byte[] ascii = "123456789".getBytes(StandardCharsets.US_ASCII);
        assertEquals(0xE3069283, Crc32c.compute(ascii, 0, ascii.length));
        assertEquals(0xE3069283, Crc32c.compute(ByteBuffer.wrap(ascii), 0, ascii.length));
    }

    @Test
    void shouldMatchRfc3720TestVectors() {
        // RFC 3720, appendix B.4: 32 bytes of zeros -> 0x8A9136AA, of 0xFF -> 0x62A8AB43,
        // incrementing 0..31 -> 0x46DD794E (the RFC lists the CRC bytes little-endian first)
        final byte[] zeros = new byte[32];
        final byte[] ones = new byte[32];
        final byte[] incrementing = new byte[32];
        for (int i = 0; i < 32; i++) {
            ones[i] = (byte) 0xFF;
            incrementing[i] = (byte) i;
        }
        assertEquals(0x8A9136AA, Crc32c.compute(zeros, 0, 32));
        assertEquals(0x62A8AB43, Crc32c.compute(ones, 0, 32));
        assertEquals(0x46DD794E, Crc32c.compute(incrementing, 0, 32));
    }

    @Test
    void shouldAgreeWithTheJdkImplementationOnRandomData() {
        // reference solution: java.util.zip.CRC32C (JDK 9+)
        final SplittableRandom random = new SplittableRandom(42);
        final CRC32C jdk = new CRC32C();
        final Crc32c intrinsic = new Crc32c();
        for (int n = 0; n < 300; n++) {
            final byte[] data = new byte[random.nextInt(0, 300)];
            for (int i = 0; i < data.length; i++) {
                data[i] = (byte) random.nextInt(256);
            }
            jdk.reset();
            jdk.update(data, 0, data.length);
            assertEquals((int) jdk.getValue(), Crc32c.compute(data, 0, data.length), "length " + data.length);
            // the intrinsic path over heap and direct buffers, at an offset, position and limit restored
            final ByteBuffer heap = ByteBuffer.allocate(data.length + 20);
            final ByteBuffer direct = ByteBuffer.allocateDirect(data.length + 20);
            heap.put(7, data);
            direct.put(7, data);
            heap.position(3).limit(5);
            assertEquals(Crc32c.compute(data, 0, data.length), intrinsic.of(heap, 7, data.length));
            assertEquals(Crc32c.compute(data, 0, data.length), intrinsic.of(direct, 7, data.length));
            assertEquals(3, heap.position());
            assertEquals(5, heap.limit());
        }
    }
}
