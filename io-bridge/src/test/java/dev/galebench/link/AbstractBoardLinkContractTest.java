package dev.galebench.link;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.board.BoardController;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;
import dev.galebench.support.SensorViews;
import dev.galebench.support.TestControllers;
import dev.galebench.wire.WireProfile;
import java.util.function.BooleanSupplier;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

/**
 * The one contract every {@link BoardLink} meets, run against each implementation by a
 * subclass that only says how to open a link to a board running a given controller
 * (in-process, UDP to a virtual board on a real socket, serial over a real pty pair).
 */
abstract class AbstractBoardLinkContractTest {
    /** Longest wait for anything to cross a real wire in these tests (generous for a loaded CI machine). */
    static final long WAIT_NS = 5_000_000_000L;

    private BoardLink link;

    /** Opens a link whose board runs {@code controller}; the fixture owns and closes the board. */
    abstract BoardLink open(BoardController controller, LinkOptions options) throws Exception;

    /** Releases the board side (socket, pty, thread). */
    abstract void closeBoard() throws Exception;

    @AfterEach
    void closeAll() throws Exception {
        if (link != null) {
            link.close();
            link = null;
        }
        closeBoard();
    }

    private BoardLink openLink(BoardController c, LinkOptions o) throws Exception {
        link = open(c, o);
        return link;
    }

    /** Spins on poll until it returns something other than EMPTY, or the wait ends (EMPTY). */
    static int awaitPoll(BoardLink l, BoardCommand out) {
        final long deadline = System.nanoTime() + WAIT_NS;
        while (System.nanoTime() < deadline) {
            final int r = l.poll(out);
            if (r != BoardLink.POLL_EMPTY) {
                return r;
            }
            Thread.onSpinWait();
        }
        return BoardLink.POLL_EMPTY;
    }

    /** Polls (results ignored) until {@code condition} holds or the wait ends. */
    static boolean pollUntil(BoardLink l, BoardCommand out, BooleanSupplier condition) {
        final long deadline = System.nanoTime() + WAIT_NS;
        while (System.nanoTime() < deadline) {
            l.poll(out);
            if (condition.getAsBoolean()) {
                return true;
            }
            Thread.onSpinWait();
        }
        return condition.getAsBoolean();
    }

    @Test
    void shouldAnswerEveryFrameWithTheSequenceItWasSent() throws Exception {
        final TestControllers.Echoing controller = new TestControllers.Echoing();
        final BoardLink l = openLink(controller, LinkOptions.defaults());
        final SensorView view = new SensorView();
        final BoardCommand out = new BoardCommand();
        for (long seq = 0; seq < 200; seq++) {
            SensorViews.fill(view, seq);
            assertTrue(l.send(seq, view), "send " + seq);
            assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out), "reply to " + seq);
            assertEquals(seq, out.answeredSequence);
            assertEquals(0.5 + (float) view.gridVoltageAV / 2000.0, out.mscDutyA, 1e-6, "reply computed from frame " + seq);
            assertEquals(0.25, out.mscDutyB, 1e-7);
            assertEquals(BoardCommand.CMD_BREAKER_CLOSE | BoardCommand.CMD_GSC_ENABLE, out.commandFlags);
            assertEquals(BoardCommand.BOARD_RUNNING | BoardCommand.BOARD_PLL_LOCKED, out.boardStatus);
        }
        final LinkCounters c = l.counters();
        assertEquals(200, c.framesSent);
        assertEquals(200, c.repliesAccepted);
        assertEquals(0, c.crcErrors + c.malformedFrames + c.invalidReferences + c.sendFailures);
        assertEquals(1, controller.starts, "controller started once, with the first frame");
    }

    @Test
    void shouldWidenSequencesBeyondThirtyTwoBits() throws Exception {
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults());
        final SensorView view = SensorViews.sample(1);
        final BoardCommand out = new BoardCommand();
        final long base = (1L << 32) - 2;
        for (long seq = base; seq < base + 5; seq++) {
            assertTrue(l.send(seq, view));
            assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
            assertEquals(seq, out.answeredSequence);
        }
    }

    @Test
    void shouldWorkWithTheCompactProfile() throws Exception {
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().profile(WireProfile.COMPACT));
        final SensorView view = new SensorView();
        final BoardCommand out = new BoardCommand();
        for (long seq = 0; seq < 50; seq++) {
            SensorViews.fill(view, seq);
            assertTrue(l.send(seq, view));
            assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
            assertEquals(seq, out.answeredSequence);
            // grid voltage travels with LSB 0.1 V, the duty back with LSB 1/65534
            assertEquals(0.5 + view.gridVoltageAV / 2000.0, out.mscDutyA, 0.05 / 2000.0 + 1.0 / 65534);
        }
        assertEquals(50, l.counters().repliesAccepted);
    }

    @Test
    void shouldCountCrcErrorWhenReplyIsCorrupted() throws Exception {
        final LinkFaults faults = new LinkFaults().reseed(7);
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        out.mscDutyA = -42;
        faults.corruptRate = 1.0;
        for (long seq = 0; seq < 20; seq++) {
            assertTrue(l.send(seq, SensorViews.sample(seq)));
            assertEquals(BoardLink.POLL_REJECTED, awaitPoll(l, out));
        }
        assertEquals(20, l.counters().crcErrors);
        assertEquals(20, faults.injectedCorruptions);
        assertEquals(0, l.counters().repliesAccepted);
        assertEquals(-42, out.mscDutyA, "a rejected reply leaves the command untouched");
        faults.clear();
        assertTrue(l.send(20, SensorViews.sample(20)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(20, out.answeredSequence);
    }

    @Test
    void shouldCountMalformedFrameWhenReplyIsTruncated() throws Exception {
        final LinkFaults faults = new LinkFaults().reseed(11);
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        faults.truncateRate = 1.0;
        for (long seq = 0; seq < 10; seq++) {
            assertTrue(l.send(seq, SensorViews.sample(seq)));
            assertEquals(BoardLink.POLL_REJECTED, awaitPoll(l, out));
        }
        assertEquals(10, l.counters().malformedFrames);
        assertEquals(0, l.counters().crcErrors);
    }

    @Test
    void shouldRejectNanReferenceAndKeepLastCommand() throws Exception {
        final TestControllers.Echoing controller = new TestControllers.Echoing();
        final BoardLink l = openLink(controller, LinkOptions.defaults());
        final BoardCommand out = new BoardCommand();
        assertTrue(l.send(0, SensorViews.sample(0)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        controller.writeNan = true;
        assertTrue(l.send(1, SensorViews.sample(1)));
        assertEquals(BoardLink.POLL_REJECTED, awaitPoll(l, out));
        assertEquals(0, out.answeredSequence, "the last good command is held");
        assertEquals(0.5, out.gscDutyA);
        controller.writeNan = false;
        controller.writeOutOfRange = true;
        assertTrue(l.send(2, SensorViews.sample(2)));
        assertEquals(BoardLink.POLL_REJECTED, awaitPoll(l, out));
        assertEquals(2, l.counters().invalidReferences);
        assertEquals(1, l.counters().repliesAccepted);
    }

    @Test
    void shouldDeliverNothingWhileSilentAndRecoverAfter() throws Exception {
        final LinkFaults faults = new LinkFaults();
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        faults.silent = true;
        // one frame at a time: a board answers only the newest of frames that queued up together
        for (long seq = 0; seq < 5; seq++) {
            assertTrue(l.send(seq, SensorViews.sample(seq)));
            final long silencedSoFar = seq + 1;
            assertTrue(pollUntil(l, out, () -> faults.silencedReplies == silencedSoFar), "reply " + seq + " silenced");
        }
        assertEquals(5, faults.silencedReplies, "5 replies silenced");
        assertEquals(-1, out.answeredSequence, "nothing delivered while silent");
        faults.silent = false;
        assertTrue(l.send(5, SensorViews.sample(5)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(5, out.answeredSequence);
        assertEquals(1, l.counters().repliesAccepted);
    }

    @Test
    void shouldCountEveryArrivingFrameEvenWhenFaultInjectionWithholdsIt() throws Exception {
        // the paced exchange ends its wait on framesReceived(): a reply withheld on purpose must count
        final LinkFaults faults = new LinkFaults();
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        assertEquals(0, l.framesReceived());
        assertTrue(l.send(0, SensorViews.sample(0)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(1, l.framesReceived());
        faults.silent = true;
        assertTrue(l.send(1, SensorViews.sample(1)));
        assertTrue(pollUntil(l, out, () -> faults.silencedReplies == 1), "reply 1 silenced");
        assertEquals(2, l.framesReceived(), "the silenced reply arrived and was counted");
        assertEquals(0, out.answeredSequence, "but it was not delivered");
    }

    @Test
    void shouldDeliverDuplicateRepliesTwice() throws Exception {
        final LinkFaults faults = new LinkFaults();
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        faults.duplicateRate = 1.0;
        assertTrue(l.send(0, SensorViews.sample(0)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(0, out.answeredSequence);
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(0, out.answeredSequence);
        assertEquals(2, l.counters().repliesAccepted);
        assertEquals(1, faults.injectedDuplicates);
    }

    @Test
    void shouldHoldDelayedReplyForTheGivenNumberOfExchanges() throws Exception {
        final LinkFaults faults = new LinkFaults();
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        faults.delayRate = 1.0;
        faults.delayExchanges = 2;
        assertTrue(l.send(0, SensorViews.sample(0)));
        assertTrue(pollUntil(l, out, () -> faults.injectedDelays == 1));
        faults.clear();
        assertEquals(-1, out.answeredSequence, "reply 0 is held back");
        assertTrue(l.send(1, SensorViews.sample(1)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(1, out.answeredSequence, "reply 1 overtakes the delayed reply 0");
        assertEquals(BoardLink.POLL_EMPTY, l.poll(out), "reply 0 still held: one exchange passed of two");
        assertTrue(l.send(2, SensorViews.sample(2)));
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(0, out.answeredSequence, "delayed reply 0 released after 2 further exchanges");
        assertEquals(BoardLink.POLL_REPLY, awaitPoll(l, out));
        assertEquals(2, out.answeredSequence);
    }

    @Test
    void shouldDropRepliesByRateDeterministically() throws Exception {
        final LinkFaults faults = new LinkFaults().reseed(1234);
        final BoardLink l = openLink(new TestControllers.Echoing(), LinkOptions.defaults().faults(faults));
        final BoardCommand out = new BoardCommand();
        faults.dropRate = 0.3;
        final int n = 300;
        for (long seq = 0; seq < n; seq++) {
            assertTrue(l.send(seq, SensorViews.sample(seq)));
            final long seen = seq + 1;
            assertTrue(pollUntil(l, out, () -> faults.injectedDrops + l.counters().repliesAccepted == seen),
                    "reply " + seq + " either dropped or accepted");
        }
        // same seed, same rate, same stream: the drop count is a property of the seed
        final LinkFaults replay = new LinkFaults().reseed(1234);
        long expectedDrops = 0;
        for (int i = 0; i < n; i++) {
            if (replay.nextDouble() < 0.3) {
                expectedDrops++;
            }
        }
        assertEquals(expectedDrops, faults.injectedDrops);
        assertTrue(expectedDrops > 60 && expectedDrops < 120, "about 30 % of 300 dropped: " + expectedDrops);
    }
}
