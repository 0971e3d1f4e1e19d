package dev.galebench.link;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.HoldController;
import dev.galebench.board.VirtualBoard;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.support.Allocations;
import dev.galebench.support.PtyPair;
import dev.galebench.support.SensorViews;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.FrameStatus;
import dev.galebench.wire.MeasurementFrame;
import dev.galebench.wire.WireProfile;
import java.net.InetSocketAddress;
import java.nio.ByteBuffer;
import org.junit.jupiter.api.Test;

/**
 * The real-time path allocates nothing: warm up, read the thread's allocated-bytes counter,
 * run a million iterations, read it again.
 */
class LinkAllocationTest {
    private static final int ITERATIONS = 1_000_000;

    @Test
    void shouldEncodeAndDecodeWithoutAllocating() {
        final ByteBuffer buffer = ByteBuffer.allocateDirect(256);
        final MeasurementFrame m = new MeasurementFrame().wrap(buffer, 0);
        final CommandFrame c = new CommandFrame().wrap(buffer, 0);
        final SensorView view = SensorViews.sample(3);
        final SensorView decoded = new SensorView();
        final BoardCommand command = new BoardCommand();
        command.block(true);
        final BoardCommand out = new BoardCommand();
        final long[] ok = new long[1];
        final Runnable body = () -> {
            for (int i = 0; i < ITERATIONS; i++) {
                final WireProfile p = (i & 1) == 0 ? WireProfile.FULL : WireProfile.COMPACT;
                view.plantTimeNs = i;
                int n = m.encode(p, i, view);
                if (m.decode(n, decoded) == FrameStatus.OK) {
                    ok[0]++;
                }
                n = c.encode(p, i, i, command);
                if (c.decode(n, i, out) == FrameStatus.OK) {
                    ok[0]++;
                }
            }
        };
        body.run(); // warm-up: JIT compiles the loop
        ok[0] = 0;
        final long allocated = Allocations.measure(body);
        assertEquals(2L * ITERATIONS, ok[0]);
        assertEquals(0, allocated, "bytes allocated by 1 M encode/decode pairs");
    }

    @Test
    void shouldExchangeInProcessWithoutAllocating() {
        final HoldController controller = new HoldController();
        controller.setSamplePeriod(50e-6);
        final LinkFaults faults = new LinkFaults().reseed(5);
        try (BoardLink link = BoardLinks.inProcess(controller, LinkOptions.defaults().faults(faults))) {
            final SensorView view = SensorViews.sample(1);
            final BoardCommand out = new BoardCommand();
            final long[] seq = new long[1];
            final Runnable body = () -> {
                for (int i = 0; i < ITERATIONS; i++) {
                    final long s = seq[0]++;
                    // flip fault settings as a sequence action would, on this thread
                    faults.corruptRate = (s & 0xFFFF) < 100 ? 1.0 : 0.0;
                    faults.duplicateRate = (s % 1000) == 7 ? 1.0 : 0.0;
                    view.plantTimeNs = s * 50_000L;
                    link.send(s, view);
                    while (link.poll(out) != BoardLink.POLL_EMPTY) {
                        // drain
                    }
                }
            };
            body.run();
            final long accepted = link.counters().repliesAccepted;
            final long allocated = Allocations.measure(body);
            assertEquals(0, allocated, "bytes allocated by 1 M in-process exchanges");
            assertTrue(link.counters().repliesAccepted - accepted > 900_000);
            assertTrue(link.counters().crcErrors > 0, "fault path ran too");
        }
    }

    @Test
    void shouldSendAndPollUdpWithoutAllocating() throws InterruptedException {
        final VirtualBoard board = VirtualBoard.udp(new InetSocketAddress("127.0.0.1", 0), WireProfile.FULL,
                new HoldController(), 50e-6);
        final Thread t = new Thread(board::run, "udp-board");
        t.setDaemon(true);
        t.start();
        try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + board.udpPort(), LinkOptions.defaults())) {
            final SensorView view = SensorViews.sample(1);
            final BoardCommand out = new BoardCommand();
            final long[] seq = new long[1];
            final Runnable body = () -> {
                for (int i = 0; i < ITERATIONS; i++) {
                    link.send(seq[0]++, view);
                    while (link.poll(out) != BoardLink.POLL_EMPTY) {
                        // drain whatever the board answered so far
                    }
                }
            };
            body.run(); // warm-up with the very same code
            final long acceptedBefore = link.counters().repliesAccepted;
            final long allocated = Allocations.measure(body);
            assertEquals(0, allocated, "bytes allocated by 1 M UDP sends and polls");
            assertTrue(link.counters().repliesAccepted - acceptedBefore > 0, "replies were read in the measured run");
            assertTrue(link.counters().framesSent >= ITERATIONS);
        } finally {
            board.close();
            t.join(5000);
        }
    }

    @Test
    void shouldSendAndPollSerialWithoutAllocating() throws Exception {
        try (PtyPair pty = PtyPair.open()) {
            final VirtualBoard board = VirtualBoard.serial(pty.second(), 921600, WireProfile.COMPACT, new HoldController(), 50e-6);
            final Thread t = new Thread(board::run, "serial-board");
            t.setDaemon(true);
            t.start();
            try (BoardLink link = BoardLinks.open("serial:" + pty.first(), LinkOptions.defaults().profile(WireProfile.COMPACT))) {
                final SensorView view = SensorViews.sample(1);
                final BoardCommand out = new BoardCommand();
                final long[] seq = new long[1];
                // one send per 8 polls: the pty and the blocking board keep up, so replies flow in the measured run
                final Runnable body = () -> {
                    for (int i = 0; i < ITERATIONS; i++) {
                        if ((i & 7) == 0) {
                            link.send(seq[0]++, view);
                        }
                        link.poll(out);
                    }
                };
                body.run();
                final long acceptedBefore = link.counters().repliesAccepted;
                final long allocated = Allocations.measure(body);
                assertEquals(0, allocated, "bytes allocated by 1 M serial polls and 125 k sends");
                assertTrue(link.counters().repliesAccepted - acceptedBefore > 1000, "replies were read in the measured run");
            } finally {
                board.close();
                t.join(5000);
            }
        }
    }
}
