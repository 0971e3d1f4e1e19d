package dev.galebench.e2e.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.support.SensorViews;
import dev.galebench.wire.WireProfile;
import java.util.List;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/** The C example board (compiled with gcc) answers a real UDP exchange with the Java link. */
class BoardKitUdpExchangeTest {
    @ParameterizedTest
    @EnumSource(WireProfile.class)
    void shouldAnswerEveryFrameFromTheCExampleBoard(WireProfile profile) throws Exception {
        final String binary = BoardKit.build().resolve("udp_board").toString();
        try (Processes.Child board = new Processes.Child(List.of(binary, "0", profile.name().toLowerCase()))) {
            final int port = board.parse("listening on port (\\d+)");
            try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + port, LinkOptions.defaults().profile(profile))) {
                final SensorView view = new SensorView();
                final BoardCommand out = new BoardCommand();
                for (long seq = 0; seq < 1000; seq++) {
                    SensorViews.fill(view, seq);
                    view.statusFlags = (seq & 1) == 0 ? SensorView.STATUS_BREAKER_CLOSED : 0;
                    assertTrue(link.send(seq, view), () -> "send failed: sendFailures=" + link.counters().sendFailures + " sent=" + link.counters().framesSent);
                    assertEquals(BoardLink.POLL_REPLY, awaitReply(link, out), "reply to " + seq);
                    assertEquals(seq, out.answeredSequence);
                    assertEquals(0.5, out.mscDutyA, 1e-9);
                    assertEquals(0.5, out.gscDutyC, 1e-9);
                    assertEquals((seq & 1) == 0 ? BoardCommand.CMD_BREAKER_CLOSE : 0, out.commandFlags, "breaker kept as measured");
                    assertEquals(view.pitchAngleRad, out.pitchRefRad, 2e-4);
                }
                assertEquals(1000, link.counters().repliesAccepted);
                assertEquals(0, link.counters().crcErrors + link.counters().malformedFrames + link.counters().invalidReferences);
            }
            assertEquals(0, board.stop());
            assertTrue(board.stderr().contains("answered 1000, crc errors 0, malformed 0"), board.stderr());
        }
    }

    static int awaitReply(BoardLink link, BoardCommand out) {
        final long deadline = System.nanoTime() + 5_000_000_000L;
        int r;
        while ((r = link.poll(out)) == BoardLink.POLL_EMPTY && System.nanoTime() < deadline) {
            Thread.onSpinWait();
        }
        return r;
    }
}
