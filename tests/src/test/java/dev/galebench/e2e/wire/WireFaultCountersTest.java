package dev.galebench.e2e.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import dev.galebench.support.PtyPair;
import dev.galebench.support.SensorViews;
import dev.galebench.wire.Cobs;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.Crc32c;
import dev.galebench.wire.FrameLayout;
import dev.galebench.wire.WireProfile;
import java.io.FileOutputStream;
import java.io.IOException;
import java.net.InetSocketAddress;
import java.net.SocketAddress;
import java.nio.ByteBuffer;
import java.nio.channels.DatagramChannel;
import java.util.Arrays;
import org.junit.jupiter.api.Test;

/**
 * Every wire fault a real peer can produce reaches its named counter. The test itself plays
 * a misbehaving board on a real UDP socket and on the far end of a real pty pair.
 */
class WireFaultCountersTest {
    private static final long WAIT_NS = 5_000_000_000L;

    private static byte[] validReply(WireProfile profile, long answered) {
        final ByteBuffer b = ByteBuffer.allocate(FrameLayout.MAX_FRAME_LENGTH);
        final BoardCommand c = new BoardCommand();
        c.block(true);
        final int n = new CommandFrame().wrap(b, 0).encode(profile, 0, answered, c);
        return Arrays.copyOf(b.array(), n);
    }

    private static byte[] withCrc(byte[] frame) {
        final ByteBuffer b = ByteBuffer.wrap(frame).order(java.nio.ByteOrder.LITTLE_ENDIAN);
        b.putInt(frame.length - 4, Crc32c.compute(frame, 0, frame.length - 4));
        return frame;
    }

    private static int await(BoardLink link, BoardCommand out) {
        final long deadline = System.nanoTime() + WAIT_NS;
        int r;
        while ((r = link.poll(out)) == BoardLink.POLL_EMPTY && System.nanoTime() < deadline) {
            Thread.onSpinWait();
        }
        return r;
    }

    @Test
    void shouldCountEveryFaultOfAMisbehavingUdpBoard() throws Exception {
        try (DatagramChannel rawBoard = DatagramChannel.open().bind(new InetSocketAddress("127.0.0.1", 0));
             BoardLink link = BoardLinks.open("udp://127.0.0.1:" + ((InetSocketAddress) rawBoard.getLocalAddress()).getPort(),
                     LinkOptions.defaults())) {
            final BoardCommand out = new BoardCommand();
            assertTrue(link.send(0, SensorViews.sample(0)));
            final ByteBuffer rx = ByteBuffer.allocate(2048);
            final SocketAddress plant = rawBoard.receive(rx);
            final LinkCounters c = link.counters();

            rawBoard.send(ByteBuffer.wrap(validReply(WireProfile.FULL, 0)), plant);
            assertEquals(BoardLink.POLL_REPLY, await(link, out));
            assertEquals(1, c.repliesAccepted);

            final byte[] badCrc = validReply(WireProfile.FULL, 0);
            badCrc[30] ^= 0x04;
            rawBoard.send(ByteBuffer.wrap(badCrc), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(1, c.crcErrors);

            rawBoard.send(ByteBuffer.wrap(new byte[] {1, 2, 3, 4, 5, 6, 7, 8, 9, 10}), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            rawBoard.send(ByteBuffer.wrap(new byte[200]), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            final byte[] version2 = validReply(WireProfile.COMPACT, 0);
            version2[FrameLayout.OFFSET_VERSION] = 2;
            rawBoard.send(ByteBuffer.wrap(withCrc(version2)), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            rawBoard.send(ByteBuffer.wrap(validReply(WireProfile.FULL, 5)), plant); // answers a frame never sent
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(4, c.malformedFrames);

            final byte[] nanDuty = validReply(WireProfile.FULL, 0);
            ByteBuffer.wrap(nanDuty).order(java.nio.ByteOrder.LITTLE_ENDIAN).putFloat(FrameLayout.FC_GSC_DUTY_A + 4, Float.NaN);
            rawBoard.send(ByteBuffer.wrap(withCrc(nanDuty)), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            final byte[] pitch = validReply(WireProfile.FULL, 0);
            ByteBuffer.wrap(pitch).order(java.nio.ByteOrder.LITTLE_ENDIAN).putFloat(FrameLayout.FC_PITCH_REF, 3.0f);
            rawBoard.send(ByteBuffer.wrap(withCrc(pitch)), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            final byte[] flags = validReply(WireProfile.FULL, 0);
            ByteBuffer.wrap(flags).order(java.nio.ByteOrder.LITTLE_ENDIAN).putInt(FrameLayout.FC_COMMAND_FLAGS, 0x100);
            rawBoard.send(ByteBuffer.wrap(withCrc(flags)), plant);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(3, c.invalidReferences);

            // a datagram from anyone but the board never reaches the link (connected socket)
            try (DatagramChannel stranger = DatagramChannel.open().bind(new InetSocketAddress("127.0.0.1", 0))) {
                stranger.send(ByteBuffer.wrap(validReply(WireProfile.FULL, 0)), plant);
            }
            rawBoard.send(ByteBuffer.wrap(validReply(WireProfile.FULL, 0)), plant);
            assertEquals(BoardLink.POLL_REPLY, await(link, out));
            assertEquals(BoardLink.POLL_EMPTY, link.poll(out));
            assertEquals(2, c.repliesAccepted, "the stranger's datagram was not delivered");
            assertEquals(1, c.crcErrors);
            assertEquals(4, c.malformedFrames);
            assertEquals(0, c.sendFailures);
        }
    }

    @Test
    void shouldCountSendFailuresWhenNoBoardListens() throws Exception {
        final int closedPort;
        try (DatagramChannel probe = DatagramChannel.open().bind(new InetSocketAddress("127.0.0.1", 0))) {
            closedPort = ((InetSocketAddress) probe.getLocalAddress()).getPort();
        }
        try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + closedPort, LinkOptions.defaults())) {
            final BoardCommand out = new BoardCommand();
            final long deadline = System.nanoTime() + WAIT_NS;
            long seq = 0;
            while (link.counters().sendFailures == 0 && System.nanoTime() < deadline) {
                link.send(seq++, SensorViews.sample(seq));
                link.poll(out);
            }
            assertTrue(link.counters().sendFailures > 0, "ICMP port unreachable surfaced as a send failure");
            assertEquals(0, link.counters().repliesAccepted);
        }
    }

    @Test
    void shouldCountEveryFaultOfAMisbehavingSerialBoard() throws Exception {
        try (PtyPair pty = PtyPair.open();
             BoardLink link = BoardLinks.open("serial:" + pty.first(), LinkOptions.defaults().profile(WireProfile.COMPACT));
             FileOutputStream rawBoard = new FileOutputStream(pty.second())) {
            final BoardCommand out = new BoardCommand();
            final LinkCounters c = link.counters();
            assertTrue(link.send(0, SensorViews.sample(0)));

            writeFramed(rawBoard, validReply(WireProfile.COMPACT, 0));
            assertEquals(BoardLink.POLL_REPLY, await(link, out));

            rawBoard.write(new byte[] {0, 0, 0}); // empty frames: ignored
            rawBoard.write(new byte[] {5, 1, 2, 0}); // COBS code points past the delimiter
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            final byte[] noise = new byte[300];
            Arrays.fill(noise, (byte) 0x55);
            rawBoard.write(noise); // far too long without a delimiter
            rawBoard.write(0);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(2, c.malformedFrames);

            final byte[] badCrc = validReply(WireProfile.COMPACT, 0);
            badCrc[14] ^= 0x40;
            writeFramed(rawBoard, badCrc);
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(1, c.crcErrors);

            final byte[] nan = validReply(WireProfile.COMPACT, 0);
            ByteBuffer.wrap(nan).order(java.nio.ByteOrder.LITTLE_ENDIAN).putShort(FrameLayout.CC_PITCH_REF, (short) FrameLayout.INT16_NAN);
            writeFramed(rawBoard, withCrc(nan));
            assertEquals(BoardLink.POLL_REJECTED, await(link, out));
            assertEquals(1, c.invalidReferences);

            // a frame split across two writes still arrives whole
            final byte[] whole = validReply(WireProfile.COMPACT, 0);
            final byte[] enc = new byte[Cobs.maxEncodedLength(whole.length) + 1];
            final int n = Cobs.encode(whole, 0, whole.length, enc, 0);
            rawBoard.write(enc, 0, 10);
            rawBoard.flush();
            assertEquals(BoardLink.POLL_EMPTY, link.poll(out));
            rawBoard.write(enc, 10, n - 10);
            rawBoard.write(0);
            assertEquals(BoardLink.POLL_REPLY, await(link, out));
            assertEquals(2, c.repliesAccepted);
            assertEquals(2, c.malformedFrames);
        }
    }

    @Test
    void shouldAccountForEveryFuzzedDatagramInTheLinkCounters() throws Exception {
        final java.util.SplittableRandom random = new java.util.SplittableRandom(99);
        try (DatagramChannel rawBoard = DatagramChannel.open().bind(new InetSocketAddress("127.0.0.1", 0));
             BoardLink link = BoardLinks.open("udp://127.0.0.1:" + ((InetSocketAddress) rawBoard.getLocalAddress()).getPort(),
                     LinkOptions.defaults())) {
            final BoardCommand out = new BoardCommand();
            final long lastSent = 1000;
            assertTrue(link.send(lastSent, SensorViews.sample(0)));
            final SocketAddress plant = rawBoard.receive(ByteBuffer.allocate(2048));
            final LinkCounters c = link.counters();
            final int fed = 50_000;
            long replies = 0;
            for (int i = 0; i < fed; i++) {
                final WireProfile profile = random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT;
                byte[] d = validReply(profile, random.nextLong(lastSent + 3));
                switch (random.nextInt(5)) {
                    case 0:
                        d[random.nextInt(d.length)] ^= (byte) (1 << random.nextInt(8));
                        break;
                    case 1:
                        d = Arrays.copyOf(d, random.nextInt(1, 300));
                        break;
                    case 2:
                        d[4 + random.nextInt(d.length - 8)] = (byte) random.nextInt(256);
                        withCrc(d);
                        break;
                    default:
                        break;
                }
                rawBoard.send(ByteBuffer.wrap(d), plant);
                if (i % 64 == 63) {
                    // pace: let the link drain so the kernel never drops a datagram
                    final long target = i + 1;
                    final long deadline = System.nanoTime() + WAIT_NS;
                    while (c.repliesAccepted + c.crcErrors + c.malformedFrames + c.invalidReferences < target
                            && System.nanoTime() < deadline) {
                        if (link.poll(out) == BoardLink.POLL_REPLY) {
                            replies++;
                        }
                    }
                }
            }
            final long deadline = System.nanoTime() + WAIT_NS;
            while (c.repliesAccepted + c.crcErrors + c.malformedFrames + c.invalidReferences < fed && System.nanoTime() < deadline) {
                if (link.poll(out) == BoardLink.POLL_REPLY) {
                    replies++;
                }
            }
            assertEquals(BoardLink.POLL_EMPTY, link.poll(out));
            assertEquals(fed, c.repliesAccepted + c.crcErrors + c.malformedFrames + c.invalidReferences,
                    "accepted + every rejection counter = datagrams fed");
            assertEquals(replies, c.repliesAccepted, "POLL_REPLY exactly for the accepted ones");
            assertTrue(c.crcErrors > 1000 && c.malformedFrames > 1000 && c.repliesAccepted > 10_000,
                    "each outcome occurred: " + c.repliesAccepted + " / " + c.crcErrors + " / " + c.malformedFrames);
        }
    }

    private static void writeFramed(FileOutputStream out, byte[] frame) throws IOException {
        final byte[] enc = new byte[Cobs.maxEncodedLength(frame.length) + 1];
        final int n = Cobs.encode(frame, 0, frame.length, enc, 0);
        enc[n] = 0;
        out.write(enc, 0, n + 1);
        out.flush();
    }
}
