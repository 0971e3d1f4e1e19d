package dev.galebench.wire;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Arrays;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class CobsTest {
    private static byte[] bytes(int... v) {
        final byte[] b = new byte[v.length];
        for (int i = 0; i < v.length; i++) {
            b[i] = (byte) v[i];
        }
        return b;
    }

    private static byte[] encode(byte[] src) {
        final byte[] dst = new byte[Cobs.maxEncodedLength(src.length)];
        final int n = Cobs.encode(src, 0, src.length, dst, 0);
        return Arrays.copyOf(dst, n);
    }

    private static byte[] decode(byte[] src) {
        final byte[] dst = new byte[1024];
        final int n = Cobs.decode(src, 0, src.length, dst, 0, dst.length);
        return n < 0 ? null : Arrays.copyOf(dst, n);
    }

    @Test
    void shouldEncodeTheClassicExamples() {
        // examples of Cheshire and Baker (1999) as tabulated in common COBS references (from memory)
        assertArrayEquals(bytes(0x01, 0x01), encode(bytes(0x00)));
        assertArrayEquals(bytes(0x01, 0x01, 0x01), encode(bytes(0x00, 0x00)));
        assertArrayEquals(bytes(0x03, 0x11, 0x22, 0x02, 0x33), encode(bytes(0x11, 0x22, 0x00, 0x33)));
        assertArrayEquals(bytes(0x05, 0x11, 0x22, 0x33, 0x44), encode(bytes(0x11, 0x22, 0x33, 0x44)));
        assertArrayEquals(bytes(0x02, 0x11, 0x01, 0x01, 0x01), encode(bytes(0x11, 0x00, 0x00, 0x00)));
    }

    @Test
    void shouldSplitRunsOf254NonZeroBytes() {
        final byte[] run = new byte[254];
        for (int i = 0; i < 254; i++) {
            run[i] = (byte) (i + 1);
        }
        final byte[] e = encode(run);
        assertEquals(255, e.length);
        assertEquals((byte) 0xFF, e[0]);
        final byte[] run255 = Arrays.copyOf(run, 255);
        run255[254] = (byte) 0xFF;
        final byte[] e2 = encode(run255);
        assertEquals(257, e2.length);
        assertEquals((byte) 0xFF, e2[0]);
        assertEquals((byte) 0x02, e2[255]);
        assertArrayEquals(run255, decode(e2));
    }

    @Test
    void shouldRoundTripRandomFramesWithoutZerosInTheEncoding() {
        final SplittableRandom random = new SplittableRandom(3);
        for (int n = 0; n < 2000; n++) {
            final byte[] src = new byte[random.nextInt(0, 600)];
            for (int i = 0; i < src.length; i++) {
                src[i] = random.nextInt(4) == 0 ? 0 : (byte) random.nextInt(256);
            }
            final byte[] e = encode(src);
            for (byte b : e) {
                assertEquals(false, b == 0, "encoded block holds no delimiter");
            }
            assertArrayEquals(src, decode(e));
        }
    }

    @Test
    void shouldRejectBlocksThatAreNotCobs() {
        assertEquals(Cobs.INVALID, Cobs.decode(bytes(0x05, 0x11), 0, 2, new byte[16], 0, 16), "code points past the end");
        assertEquals(Cobs.INVALID, Cobs.decode(bytes(0x03, 0x00, 0x11), 0, 3, new byte[16], 0, 16), "zero inside a block");
        assertEquals(Cobs.INVALID, Cobs.decode(bytes(0x00), 0, 1, new byte[16], 0, 16), "zero code");
        assertEquals(Cobs.INVALID, Cobs.decode(bytes(0x05, 1, 2, 3, 4), 0, 5, new byte[2], 0, 2), "does not fit");
    }
}
