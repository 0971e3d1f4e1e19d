package dev.galebench.check;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.SensorView;
import dev.galebench.report.CheckOutcome;
import dev.galebench.testsupport.AnalyticFeed;
import dev.galebench.testsupport.Layouts;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Check logic fed with analytic signals whose answers are known in closed form. */
class ChecksTest {
    private static final long PERIOD_NS = 50_000;

    private static CheckOutcome run(StreamingCheck c, AnalyticFeed feed, double durationS) {
        CheckSet set = new CheckSet(List.of(c));
        feed.run(set, Math.round(durationS * 1e9 / PERIOD_NS), 0);
        return set.outcomes(new RunFacts()).get(0);
    }

    private static AnalyticFeed feed() {
        return new AnalyticFeed(Layouts.documented(), PERIOD_NS);
    }

    @Test
    void shouldPassABandThatHoldsAndFailOneThatIsLeft() {
        AnalyticFeed f = feed().with("v_dc_v", t -> 1100 + (t > 1.2 && t < 1.3 ? 80 : 0));
        CheckOutcome ok = run(new BandCheck("b", "v_dc_v", 1000, 1200, 0, 1.0), f, 2.0);
        assertTrue(ok.passed(), ok.toString());
        CheckOutcome bad = run(new BandCheck("b", "v_dc_v", 1000, 1150, 0, 2.0), f, 2.0);
        assertFalse(bad.passed());
        assertEquals("min 1100 V, max 1180 V", bad.measured());
        assertTrue(bad.message().startsWith("v_dc_v left the band at 1.2 s (1180 V)") || bad.message().startsWith(
                "v_dc_v left the band at 1.20005 s (1180 V)"), bad.message());
        assertEquals(1150, bad.bandHigh());
    }

    @Test
    void shouldMeasureSettlingOfAFirstOrderResponse() {
        // x(t) = 1 - exp(-(t - 1)/tau) enters 1 +/- 0.02 at tau ln 50 after the step (analytic)
        double tau = 0.05;
        AnalyticFeed f = feed().with("q_grid_pu", t -> t < 1 ? 0 : 1 - Math.exp(-(t - 1) / tau));
        CheckOutcome o = run(new SettleCheck("s", "q_grid_pu", 1.0, 0.02, 1.0, 1.25, 2.0, 0.1), f, 2.0);
        assertTrue(o.passed(), o.toString());
        double expected = tau * Math.log(50);
        assertEquals(Fmt.duration(Math.ceil(expected / 50e-6) * 50e-6), o.measured());
        CheckOutcome late = run(new SettleCheck("s", "q_grid_pu", 1.0, 0.02, 1.0, 1.15, 2.0, 0.1), f, 2.0);
        assertFalse(late.passed());
        assertTrue(late.message().contains("too late"), late.message());
        // back to the pre-step value: a dip from 0.7 that recovers as 0.7 - 0.3 exp(-(t - 1)/tau)
        AnalyticFeed back = feed().with("q_grid_pu", t -> t < 1 ? 0.7 : 0.7 - 0.3 * Math.exp(-(t - 1) / tau));
        CheckOutcome pre = run(new SettleCheck("s", "q_grid_pu", Double.NaN, 0.006, 1.0, 1.25, 2.0, 0.1), back, 2.0);
        assertTrue(pre.passed(), pre.toString());
        assertEquals(Fmt.duration(Math.ceil(expected / 50e-6) * 50e-6), pre.measured());
        assertEquals(0.7 - 0.006, pre.bandLow(), 1e-12);
    }

    @Test
    void shouldMeasureTheRiseTimeOfAFirstOrderLagAsTauLnNine() {
        // 10-90 % rise time of 1 - exp(-t/tau) is tau ln 9 (REFERENCES.md 3a: t_r = ln 9 / alpha)
        double tau = 0.01;
        AnalyticFeed f = feed().with("i_reactive_pu", t -> t <= 0.5 ? 0.1 : 0.1 + 0.7 * (1 - Math.exp(-(t - 0.5) / tau)));
        RiseTimeCheck c = new RiseTimeCheck("r", "i_reactive_pu", 0.5, Double.NaN, 0.8, 0.030, 1.0);
        CheckOutcome o = run(c, f, 1.0);
        assertTrue(o.passed(), o.toString());
        String ms = o.measured().replace(" ms", "");
        assertEquals(tau * Math.log(9) * 1e3, Double.parseDouble(ms), 0.02);
        CheckOutcome slow = run(new RiseTimeCheck("r", "i_reactive_pu", 0.5, Double.NaN, 0.8, 0.020, 1.0), f, 1.0);
        assertFalse(slow.passed());
        assertTrue(slow.message().contains("rose too slowly"), slow.message());
    }

    @Test
    void shouldMeasureTheOvershootOfASecondOrderStep() {
        // underdamped step response, zeta 0.5: overshoot exp(-zeta pi / sqrt(1 - zeta^2)) = 16.30 %
        // (standard second-order result, e.g. Ogata, Modern Control Engineering; from memory)
        double zeta = 0.5, wn = 60;
        double wd = wn * Math.sqrt(1 - zeta * zeta), phi = Math.acos(zeta);
        AnalyticFeed f = feed().with("q_grid_pu", t -> t <= 1 ? 0 : 0.2 * (1 - Math.exp(-zeta * wn * (t - 1))
                * Math.sin(wd * (t - 1) + phi) / Math.sqrt(1 - zeta * zeta)));
        CheckOutcome o = run(new OvershootCheck("o", "q_grid_pu", 1.0, Double.NaN, 0.2, 20, 2.0), f, 2.0);
        assertTrue(o.passed(), o.toString());
        double pct = Double.parseDouble(o.measured().replace(" %", ""));
        assertEquals(100 * Math.exp(-zeta * Math.PI / Math.sqrt(1 - zeta * zeta)), pct, 0.05);
        assertFalse(run(new OvershootCheck("o", "q_grid_pu", 1.0, Double.NaN, 0.2, 10, 2.0), f, 2.0).passed());
    }

    @Test
    void shouldTimeAnEventAfterItsTrigger() {
        AnalyticFeed f = feed().with("v_term_pu", t -> t >= 1.0 && t < 1.2 ? 0.5 : 1.0)
                .with("frt_active", t -> t >= 1.0123 && t < 1.4 ? 1 : 0);
        Condition dip = new Condition("v_term_pu", Condition.Kind.BELOW, 0.9);
        Condition frt = new Condition("frt_active", Condition.Kind.ABOVE, 0.5);
        CheckOutcome o = run(new EventAfterCheck("e", dip, 0.5, frt, 0.02), f, 2.0);
        assertTrue(o.passed(), o.toString());
        assertEquals(12.3, Double.parseDouble(o.measured().replace(" ms", "")), 0.051);
        CheckOutcome late = run(new EventAfterCheck("e", null, 1.0, frt.copy(), 0.01), f, 2.0);
        assertFalse(late.passed());
        assertTrue(late.message().contains("too late"), late.message());
        CheckOutcome never = run(new EventAfterCheck("e", null, 1.0,
                new Condition("trip_flags", Condition.Kind.BITS_SET, SensorView.TRIP_LINK_WATCHDOG), 0.05), f, 2.0);
        assertFalse(never.passed());
        assertEquals("no response", never.measured());
    }

    @Test
    void shouldFailRideThroughOnlyWhenDisconnectingAboveTheProfile() {
        double[] ts = {0, 0.15, 1.5}, vs = {0.05, 0.05, 0.85};
        int closed = SensorView.STATUS_BREAKER_CLOSED;
        AnalyticFeed tripsAbove = feed().with("v_poc_pu", t -> t >= 1 && t < 1.15 ? 0.3 : 1.0)
                .with("status_flags", t -> closed)
                .with("trip_flags", t -> t > 1.1 ? SensorView.TRIP_GSC_OVERCURRENT : 0);
        CheckOutcome bad = run(new EnvelopeCheck("env", "v_poc_pu", 1.0, ts, vs, true), tripsAbove, 3.0);
        assertFalse(bad.passed());
        assertTrue(bad.message().contains("trip flags 0x400") && bad.message().contains("above the profile"),
                bad.message());
        AnalyticFeed tripsBelow = feed().with("v_poc_pu", t -> t >= 1 && t < 1.15 ? 0.02 : 1.0)
                .with("status_flags", t -> closed)
                .with("trip_flags", t -> t > 1.1 ? SensorView.TRIP_GSC_OVERCURRENT : 0);
        CheckOutcome ok = run(new EnvelopeCheck("env", "v_poc_pu", 1.0, ts, vs, true), tripsBelow, 3.0);
        assertTrue(ok.passed(), ok.toString());
        assertTrue(ok.message().contains("fell below the profile"), ok.message());
        EnvelopeCheck e = new EnvelopeCheck("env", "v_poc_pu", 0, new double[] {0, 0.15, 0.15, 1.5},
                new double[] {0, 0, 0.5, 0.85}, true);
        assertEquals(0.0, e.profileAt(0.1));
        assertEquals(0.5, e.profileAt(0.15));
        assertEquals(0.5 + 0.35 * 0.5, e.profileAt(0.15 + 0.675), 1e-12);
    }

    @Test
    void shouldJudgeReactiveCurrentByTheKFactor() {
        // dip 1.0 -> 0.6 pu: k = 2 asks for 0.8 pu more capacitive current (delta i_q = k delta U)
        AnalyticFeed good = feed().with("v_term_pu", t -> t >= 1 && t < 1.2 ? 0.6 : 1.0)
                .with("i_reactive_pu", t -> t >= 1.01 && t < 1.2 ? 0.05 + 0.8 + 0.02 : 0.05);
        ReactiveCurrentCheck c = new ReactiveCurrentCheck("k", "v_term_pu", "i_reactive_pu", 1.0, 1.2, 2.0, 0.03,
                0.1, 0.2, 0.0, 1.1, 0.1, 1.0);
        CheckOutcome o = run(c, good, 2.0);
        assertTrue(o.passed(), o.toString());
        AnalyticFeed none = feed().with("v_term_pu", t -> t >= 1 && t < 1.2 ? 0.6 : 1.0)
                .with("i_reactive_pu", t -> 0.05);
        CheckOutcome bad = run(new ReactiveCurrentCheck("k", "v_term_pu", "i_reactive_pu", 1.0, 1.2, 2.0, 0.03,
                0.1, 0.2, 0.0, 1.1, 0.1, 1.0), none, 2.0);
        assertFalse(bad.passed());
        assertTrue(bad.message().startsWith("i_reactive_pu left the tolerance at 1.03") && bad.message().contains(
                "measured 0.05 pu, expected 0.85 pu"), bad.message());
        assertEquals(0.85 + 0.2, bad.bandHigh(), 1e-9);
        assertEquals(0.85 + 0.0, c.expected(0.6, 1.0, 0.05), 1e-12);
        // the same current recorded in a pu 1.25 times smaller: judged in pu of I_N it passes again
        AnalyticFeed scaled = feed().with("v_term_pu", t -> t >= 1 && t < 1.2 ? 0.6 : 1.0)
                .with("i_reactive_pu", t -> 1.25 * (t >= 1.01 && t < 1.2 ? 0.05 + 0.8 + 0.02 : 0.05));
        assertFalse(run(new ReactiveCurrentCheck("k", "v_term_pu", "i_reactive_pu", 1.0, 1.2, 2.0, 0.03,
                0.1, 0.2, 0.0, 1.1, 0.1, 1.0), scaled, 2.0).passed());
        assertTrue(run(new ReactiveCurrentCheck("k", "v_term_pu", "i_reactive_pu", 1.0, 1.2, 2.0, 0.03,
                0.1, 0.2, 0.0, 1.1, 0.1, 1.25), scaled, 2.0).passed());
        assertEquals(1.1, c.expected(0.1, 1.0, 0.05), 1e-12, "clipped at the current limit");
    }

    @Test
    void shouldTimeActivePowerRecovery() {
        AnalyticFeed f = feed().with("p_grid_pu", t -> t < 1 ? 0.9 : t < 1.15 ? 0.3 : Math.min(0.9, 0.3 + (t - 1.15) * 2));
        CheckOutcome o = run(new PowerRecoveryCheck("p", "p_grid_pu", 1.0, 1.15, 0.5, 0.9, 0.1), f, 3.0);
        // 0.81 pu is reached (0.81 - 0.3) / 2 = 0.255 s after clearance
        assertTrue(o.passed(), o.toString());
        assertEquals(0.255, Double.parseDouble(o.measured().replace(" ms", "")) / 1e3, 1e-4);
        assertFalse(run(new PowerRecoveryCheck("p", "p_grid_pu", 1.0, 1.15, 0.2, 0.9, 0.1), f, 3.0).passed());
    }

    @Test
    void shouldJudgeTimingOnlyForRealTimeRuns() {
        TimingCheck t = new TimingCheck("t", 20, 100, Double.NaN, 0);
        RunFacts offline = new RunFacts();
        assertTrue(t.finish(offline).passed());
        assertEquals("not applicable", t.finish(offline).measured());
        RunFacts rt = new RunFacts();
        rt.realTime = true;
        rt.latenessP99Us = 3;
        rt.latenessP999Us = 140;
        rt.overruns = 2;
        rt.exchanges = 100_000;
        CheckOutcome o = t.finish(rt);
        assertFalse(o.passed());
        assertTrue(o.message().contains("lateness p99.9 140 us > 100 us") && o.message().contains("2 overruns"),
                o.message());
    }

    @Test
    void shouldJudgeLinkCountersAndReplyAge() {
        LinkHealthCheck c = new LinkHealthCheck("l", 0, 0, -1, 1, 1);
        CheckSet set = new CheckSet(List.of(c));
        feed().with("reply_age", t -> t > 0.5 && t < 0.6 ? 2 : 0).run(set, 20_000, 0);
        RunFacts f = new RunFacts();
        f.link.missingReplies = 3;
        f.link.watchdogTrips = 1;
        CheckOutcome o = set.outcomes(f).get(0);
        assertFalse(o.passed());
        assertTrue(o.message().contains("missing replies 3 > 0") && o.message().contains("reply age reached 2"),
                o.message());
        assertFalse(o.message().contains("watchdog"), o.message());
    }

    @Test
    void shouldFlagForbiddenBitsOnly() {
        AnalyticFeed f = feed().with("trip_flags", t -> t > 0.5 ? SensorView.TRIP_LINK_WATCHDOG : 0);
        long allButWatchdog = SensorView.TRIP_MASK & ~SensorView.TRIP_LINK_WATCHDOG;
        assertTrue(run(new FlagsCheck("f", "trip_flags", allButWatchdog, 0, 1), f, 1.0).passed());
        CheckOutcome o = run(new FlagsCheck("f", "trip_flags", SensorView.TRIP_MASK, 0, 1), f, 1.0);
        assertFalse(o.passed());
        assertTrue(o.message().contains("0x800"), o.message());
    }

    @Test
    void shouldFailEveryVerdictWhenSamplesWereLostOrTheRunAborted() {
        CheckSet set = new CheckSet(List.of(new BandCheck("b", "v_dc_v", 0, 2000, 0, 2.0)));
        feed().with("v_dc_v", t -> 1100).run(set, 10_000, 17);
        RunFacts f = new RunFacts();
        f.aborted = true;
        f.abortReason = "hardware trip 0x100 (DC overvoltage)";
        List<CheckOutcome> out = set.outcomes(f);
        assertEquals(2, out.size());
        assertFalse(out.get(0).passed());
        assertTrue(out.get(0).message().contains("aborted at 0.5 s (hardware trip 0x100"), out.get(0).message());
        assertEquals("sample-stream", out.get(1).name());
        assertFalse(out.get(1).passed());
        assertEquals("17 samples lost", out.get(1).measured());
    }
}
