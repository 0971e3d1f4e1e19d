package dev.galebench.rt;

import dev.galebench.plant.SensorView;
import dev.galebench.rt.support.CollectingConsumer;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Test;

import java.util.List;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Supervision outcomes, driven by an in-test board that drops, duplicates, delays or corrupts
 * the replies to chosen frames. Frame k+1 is sent at the end of exchange k; its reply is due at
 * exchange k+1.
 */
class LinkSupervisionTest {
    private FirstOrderTestPlant plant;
    private CollectingConsumer samples;

    private LoopResult run(EchoBoardLink.ReplyScript script, long exchanges) throws Exception {
        return run(script, exchanges, LoopFixtures.offline(1, exchanges));
    }

    private LoopResult run(EchoBoardLink.ReplyScript script, long exchanges, LoopConfig.Builder cfg) throws Exception {
        plant = new FirstOrderTestPlant(STEP_NS);
        samples = new CollectingConsumer();
        return LoopFixtures.run(cfg.build(), plant, new EchoBoardLink(script), null, List.of(samples));
    }

    /** Each exchange checks the frame sent before it: answered in time, or missing. */
    private static void assertEveryExchangeAccounted(LoopResult r) {
        assertEquals(r.exchanges, r.linkCounters.missingReplies + r.repliesApplied - r.linkCounters.lateReplies);
    }

    private double at(int exchange, String signal) {
        return samples.values.get(exchange)[samples.column(signal)];
    }

    @Test
    void shouldAcceptEveryOnTimeReplyWithAgeZero() throws Exception {
        LoopResult r = run(null, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(100, r.linkCounters.repliesAccepted);
        assertEquals(100, r.repliesApplied);
        assertEquals(0, r.linkCounters.lateReplies + r.linkCounters.staleReplies + r.linkCounters.duplicateReplies
                + r.linkCounters.missingReplies + r.linkCounters.invalidReferences + r.linkCounters.watchdogTrips);
        assertEquals(0, r.replyAgeExchanges.getMaxValue());
        assertEquals(100, r.roundTripNs.getTotalCount());
    }

    @Test
    void shouldDropAndCountDuplicateReply() throws Exception {
        LoopResult r = run(seq -> seq == 10 ? EchoBoardLink.DUPLICATE : EchoBoardLink.NORMAL, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.duplicateReplies);
        @SuppressWarnings("unchecked")
        java.util.Map<String, Object> link = (java.util.Map<String, Object>) r.summary().get("link");
        assertEquals(1L, link.get("duplicate_replies"));
        assertEquals(101, r.linkCounters.repliesAccepted, "the link passed both copies");
        assertEquals(100, r.repliesApplied);
        assertEquals(0, r.linkCounters.staleReplies);
    }

    @Test
    void shouldDropAndCountStaleReplyAndCountItsMissingExchange() throws Exception {
        // reply to 20 held back until frame 23 left; 21 and 22 are answered meanwhile
        LoopResult r = run(seq -> seq == 20 ? EchoBoardLink.DELAY + 3 : EchoBoardLink.NORMAL, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.staleReplies);
        assertEquals(1, r.linkCounters.missingReplies, "exchange 20 ended without the reply to frame 20");
        assertEquals(100, r.linkCounters.repliesAccepted);
        assertEquals(99, r.repliesApplied);
        assertEquals(1.0, at(20, "reply_age"), "exchange 20 runs on the reply to frame 19");
        assertEquals(0.0, at(21, "reply_age"));
    }

    @Test
    void shouldApplyAndCountLateReplyNewerThanLastAccepted() throws Exception {
        // reply to 30 arrives one exchange late, reply to 31 never: the late one is the newest
        LoopResult r = run(seq -> seq == 30 ? EchoBoardLink.DELAY + 1
                : seq == 31 ? EchoBoardLink.DROP : EchoBoardLink.NORMAL, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.lateReplies);
        assertEquals(2, r.linkCounters.missingReplies);
        assertEquals(0, r.linkCounters.staleReplies);
        assertEquals(99, r.linkCounters.repliesAccepted);
        assertEquals(99, r.repliesApplied, "the late reply is applied");
        assertEquals(1.0, at(30, "reply_age"));
        assertEquals(1.0, at(31, "reply_age"), "exchange 31 applies the late reply to 30");
        assertEquals(0.0, at(32, "reply_age"));
        assertEquals(98, r.replyAgeExchanges.getCountAtValue(0), "98 exchanges on time");
    }

    @Test
    void shouldRejectNanAndOutOfRangeReferencesAndHoldLastGood() throws Exception {
        LoopResult r = run(seq -> seq == 40 ? EchoBoardLink.NAN_DUTY
                : seq == 41 ? EchoBoardLink.DUTY_OUT_OF_RANGE
                : seq == 42 ? EchoBoardLink.PITCH_OUT_OF_RANGE : EchoBoardLink.NORMAL, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(3, r.linkCounters.invalidReferences);
        assertEquals(97, r.repliesApplied);
        assertEquals(3, r.linkCounters.missingReplies, "a rejected reply is no reply");
        double dutyAt39 = at(39, "gsc_duty_a");
        for (int k = 40; k <= 42; k++) {
            assertEquals(dutyAt39, at(k, "gsc_duty_a"), "exchange " + k + " holds the last good duty");
            assertEquals(0.5, at(k, "msc_duty_b"));
            assertEquals(Math.toDegrees(EchoBoardLink.PITCH_REF_RAD), at(k, "pitch_ref_deg"), 1e-12);
            assertEquals(k - 39, at(k, "reply_age"));
        }
        assertNotEquals(dutyAt39, at(43, "gsc_duty_a"), "the board's next good reply applies again");
        assertEquals(0.0, at(43, "reply_age"));
        for (double[] v : samples.values) {
            assertTrue(Double.isFinite(v[samples.column("x_v")]));
        }
    }

    @Test
    void shouldRejectReplyToFrameNeverSent() throws Exception {
        LoopResult r = run(seq -> seq == 50 ? EchoBoardLink.FUTURE_SEQUENCE : EchoBoardLink.NORMAL, 100);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.invalidReferences);
        assertEquals(1, r.linkCounters.missingReplies);
    }

    @Test
    void shouldTripPlantAndBlockConvertersWhenBoardFallsSilent() throws Exception {
        // 20 ms watchdog at 50 us = 400 exchanges; the board stops answering after frame 100
        LoopResult r = run(seq -> seq > 100 ? EchoBoardLink.DROP : EchoBoardLink.NORMAL, 1000);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.watchdogTrips);
        assertEquals(1, plant.forceTripCalls);
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, r.tripFlags & SensorView.TRIP_LINK_WATCHDOG);
        assertEquals(899, r.linkCounters.missingReplies);
        // last valid reply accepted at exchange 100; the watchdog fires 400 exchanges later
        assertNotEquals(0.5, at(499, "gsc_duty_a"), "still the last good command before the watchdog time");
        for (int k = 500; k < 1000; k++) {
            assertEquals(0.5, at(k, "gsc_duty_a"), "blocked at " + k);
            assertEquals(0.5, at(k, "msc_duty_a"));
            assertEquals(0.0, at(k, "chopper_duty"));
        }
        assertEquals(SensorView.TRIP_LINK_WATCHDOG, (int) at(999, "trip_flags"));
        assertEquals(899.0, at(999, "reply_age"));
    }

    @Test
    void shouldStopOnWatchdogTripWhenStopOnTrip() throws Exception {
        LoopResult r = run(seq -> seq > 10 ? EchoBoardLink.DROP : EchoBoardLink.NORMAL, 10_000,
                LoopFixtures.offline(1, 10_000).stopOnTrip(true).watchdogNs(1_000_000));
        assertEveryExchangeAccounted(r);
        assertEquals(LoopResult.StopReason.PLANT_TRIP, r.stopReason);
        assertEquals(31, r.exchanges, "20 exchanges of 50 us after the last reply at exchange 10, then stop");
        assertEquals(1, r.linkCounters.watchdogTrips);
    }

    @Test
    void shouldTripWatchdogWhenBoardNeverAnswers() throws Exception {
        LoopResult r = run(seq -> EchoBoardLink.DROP, 1000);
        assertEveryExchangeAccounted(r);
        assertEquals(1, r.linkCounters.watchdogTrips);
        assertEquals(0, r.repliesApplied);
        assertEquals(1000, r.linkCounters.missingReplies);
        assertEquals(0.5, at(0, "gsc_duty_a"), "converters start blocked until the board answers");
    }
}
