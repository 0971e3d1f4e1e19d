package dev.galebench.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.testsupport.Allocations;
import dev.galebench.testsupport.InputRecorder;
import dev.galebench.testsupport.SequenceTexts;
import org.junit.jupiter.api.Test;

class ScheduleTest {
    private static final long STEP_NS = 50_000;
    private static final Schedule.Start START = new Schedule.Start(10.0, 1.0, 50.0, 10.0, 8.0);

    private static Schedule compile(String actions, double durationS, LinkFaultControl link) {
        String text = SequenceTexts.with(actions, SequenceTexts.NO_TRIP).replace("duration_s: 3.0",
                "duration_s: " + durationS);
        return Schedule.compile(SequenceParser.parse("t.yaml", text, null), STEP_NS, START, link);
    }

    @Test
    void shouldApplyAStepAtExactlyItsPlantStep() {
        Schedule s = compile("  - at_s: 1.0\n    wind_step: {to_m_s: 12}\n", 3.0, null);
        InputRecorder p = new InputRecorder();
        for (long k = 0; k < 20_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(0, p.windCalls, "nothing applied before 1.0 s (step 20000)");
        s.beforeStep(20_000, p);
        assertEquals(12.0, p.wind);
        for (long k = 20_001; k < 60_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(1, p.windCalls, "a step change calls the setter once");
    }

    @Test
    void shouldRampLinearlyAndHoldTheEndValue() {
        Schedule s = compile("  - at_s: 1.0\n    wind_ramp: {to_m_s: 14, duration_s: 2.0}\n", 3.0, null);
        assertEquals(10.0, s.windAt(20_000), 1e-12);
        assertEquals(12.0, s.windAt(40_000), 1e-12);
        assertEquals(14.0, s.windAt(60_000), 1e-12);
        assertEquals(10.0 + 4.0 * 12_345 / 40_000.0, s.windAt(20_000 + 12_345), 1e-12);
    }

    @Test
    void shouldDipEachPhaseToItsDepthAndRecoverAlongTheRamp() {
        Schedule s = compile("  - at_s: 1.0\n    grid_dip: {depth_pu: [0.6, 0.6, 0.0], duration_s: 0.2, recovery_s: 0.4}\n",
                3.0, null);
        InputRecorder p = new InputRecorder();
        for (long k = 0; k <= 20_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(0.4, p.va, 1e-12);
        assertEquals(0.4, p.vb, 1e-12);
        assertEquals(1.0, p.vc, 1e-12);
        for (long k = 20_001; k <= 24_000 + 4_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(0.4 + 0.6 * 4_000 / 8_000.0, p.va, 1e-12, "half-way through the recovery ramp... at 1/2");
        for (long k = 28_001; k <= 40_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(1.0, p.va, 1e-12);
    }

    @Test
    void shouldShapeTheGustAsTheIecExtremeOperatingGust() {
        // IEC 61400-1 ed. 3 EOG (from memory): V(t) = V - 0.37 Vg sin(3 pi t/T)(1 - cos(2 pi t/T)); peak +0.74 Vg at T/2
        Schedule s = compile("  - at_s: 1.0\n    wind_gust: {amplitude_m_s: 5.0, duration_s: 1.0}\n", 3.0, null);
        long k0 = 20_000, n = 20_000;
        assertEquals(10.0 + 0.74 * 5.0, s.windAt(k0 + n / 2), 1e-9);
        double dipT = 0.0;
        double min = Double.MAX_VALUE;
        for (long k = k0; k < k0 + n; k++) {
            if (s.windAt(k) < min) {
                min = s.windAt(k);
                dipT = (k - k0) / (double) n;
            }
        }
        double expectedDip = -0.37 * 5.0 * Math.sin(3 * Math.PI * dipT) * (1 - Math.cos(2 * Math.PI * dipT));
        assertEquals(10.0 + expectedDip, min, 1e-9);
        assertTrue(min < 10.0 - 0.5, "the gust dips before its peak, min " + min);
        assertEquals(10.0, s.windAt(k0 + n), 1e-12, "back to the mean after T");
    }

    @Test
    void shouldSynthesiseTurbulenceWithTheRequestedSigmaReproducibly() {
        double[] a = Schedule.Turbulence.kaimal(600, 0.05, 1.2, 10.0, 340.2, 2.0, 42);
        double[] b = Schedule.Turbulence.kaimal(600, 0.05, 1.2, 10.0, 340.2, 2.0, 42);
        double[] c = Schedule.Turbulence.kaimal(600, 0.05, 1.2, 10.0, 340.2, 2.0, 43);
        assertTrue(java.util.Arrays.equals(a, b), "same seed, same series");
        assertNotEquals(a[6000], c[6000]);
        double mean = 0, var = 0;
        int n = 12_001;
        for (int i = 0; i < n; i++) {
            mean += a[i];
        }
        mean /= n;
        for (int i = 0; i < n; i++) {
            var += (a[i] - mean) * (a[i] - mean);
        }
        double sd = Math.sqrt(var / n);
        // scaled to sigma before the 1 s tapers at both ends, which remove a little variance
        assertEquals(1.2, sd, 0.01);
        assertEquals(0.0, mean, 0.05);
        assertEquals(0.0, a[0], 1e-12, "tapered: no jump where turbulence starts");
        // Kaimal: most variance at low frequency. Lag-1 s autocorrelation must be high (L/V = 34 s).
        double r = 0;
        for (int i = 0; i + 20 < n; i++) {
            r += (a[i] - mean) * (a[i + 20] - mean);
        }
        r /= (n - 20) * var / n;
        assertTrue(r > 0.8, "lag-1 s autocorrelation " + r);
    }

    @Test
    void shouldRampTheFrequencyAtTheGivenRate() {
        Schedule s = compile("  - at_s: 1.0\n    frequency_ramp: {to_hz: 49.0, rate_hz_s: 0.5}\n", 4.0, null);
        InputRecorder p = new InputRecorder();
        for (long k = 0; k <= 20_000 + 40_000; k++) {
            s.beforeStep(k, p);
        }
        assertEquals(49.0, p.frequencyHz, 1e-12, "1 Hz at 0.5 Hz/s takes 2 s");
        InputRecorder q = new InputRecorder();
        s.rewind();
        for (long k = 0; k <= 40_000; k++) {
            s.beforeStep(k, q);
        }
        assertEquals(49.5, q.frequencyHz, 1e-12);
    }

    @Test
    void shouldSwitchLinkFaultsAtExactSteps() {
        long[] events = new long[4];
        int[] kinds = new int[2];
        InputRecorder p = new InputRecorder();
        long[] now = new long[1];
        LinkFaultControl link = new LinkFaultControl() {
            @Override
            public void begin(LinkFaultKind kind, double rate, int delayExchanges) {
                events[0] = now[0];
                kinds[0] = kind.ordinal();
                kinds[1] = (int) Math.round(rate * 100);
            }

            @Override
            public void end() {
                events[1] = now[0];
            }
        };
        Schedule s = compile("  - at_s: 0.5\n    link_fault: {kind: drop, duration_s: 1.0, rate: 0.07}\n", 3.0, link);
        for (long k = 0; k < 60_000; k++) {
            now[0] = k;
            s.beforeStep(k, p);
        }
        assertEquals(10_000, events[0]);
        assertEquals(30_000, events[1]);
        assertEquals(LinkFaultKind.DROP.ordinal(), kinds[0]);
        assertEquals(7, kinds[1]);
    }

    @Test
    void shouldRefuseLinkFaultsWithoutALinkThatInjectsThem() {
        SequenceException e = assertThrows(SequenceException.class,
                () -> compile("  - at_s: 0.5\n    link_fault: {kind: silence, duration_s: 1.0}\n", 3.0, null));
        assertTrue(e.reason().contains("link faults need a link"), e.reason());
    }

    @Test
    void shouldRefuseActionsThatCollideOnceRoundedToCoarseSteps() {
        String text = SequenceTexts.with("  - at_s: 1.0006\n    wind_ramp: {to_m_s: 12, duration_s: 0.0015}\n"
                + "  - at_s: 1.0022\n    wind_step: {to_m_s: 9}\n", SequenceTexts.NO_TRIP);
        Sequence seq = SequenceParser.parse("t.yaml", text, null);
        Schedule.compile(seq, 50_000, START, null);
        SequenceException e = assertThrows(SequenceException.class,
                () -> Schedule.compile(seq, 1_000_000, START, null));
        assertTrue(e.reason().contains("overlaps the previous action"), e.reason());
    }

    @Test
    void shouldAllocateNothingPerStep() throws Exception {
        Schedule s = compile("  - at_s: 0.1\n    turbulence: {duration_s: 2.5, intensity: 0.1, seed: 7}\n"
                + "  - at_s: 0.2\n    grid_dip: {depth_pu: 0.5, duration_s: 0.1, recovery_s: 0.3}\n"
                + "  - at_s: 0.3\n    frequency_ramp: {to_hz: 49.5, rate_hz_s: 1}\n"
                + "  - at_s: 2.7\n    wind_gust: {amplitude_m_s: 3, duration_s: 0.25}\n"
                + "  - at_s: 0.5\n    phase_jump: {angle_deg: 10}\n"
                + "  - at_s: 0.6\n    voltage_ref_step: {deviation_pu: 0.02}\n"
                + "  - at_s: 0.7\n    grid_strength: {short_circuit_ratio: 3, x_over_r: 7}\n", 3.0, null);
        InputRecorder p = new InputRecorder();
        // warm-up: let the JIT settle (a one-off allocation of ~1.4 kB was seen during compilation)
        for (int rep = 0; rep < 10; rep++) {
            s.rewind();
            for (long k = 0; k < 60_000; k++) {
                s.beforeStep(k, p);
            }
        }
        long allocated = Allocations.minOverWindows(3, () -> {
            for (int rep = 0; rep < 17; rep++) {
                s.rewind();
                for (long k = 0; k < 60_000; k++) {
                    s.beforeStep(k, p);
                }
            }
        });
        assertEquals(0, allocated, "bytes allocated over 1.02 million steps (fewest of 3 windows)");
        assertTrue(p.windCalls > 17 * 50_000L, "turbulence sets the wind every step: " + p.windCalls);
        assertEquals(3.0, p.scr, "grid strength applied");
        assertEquals(Math.toRadians(10), p.phaseRad, 1e-12);
    }
}
