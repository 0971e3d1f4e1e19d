package dev.galebench.check;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.report.CheckOutcome;
import dev.galebench.rt.Sample;
import dev.galebench.runner.WaveformDigest;
import dev.galebench.sequence.SequenceChecks;
import dev.galebench.sequence.SequenceParser;
import dev.galebench.testsupport.Allocations;
import dev.galebench.testsupport.Layouts;
import java.util.List;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Ten minutes at 20 kHz (12 million samples) through the checks of every kind and the waveform
 * digest: the checker thread allocates nothing per sample and the heap does not grow.
 * Run with {@code mvn -P soak verify}.
 */
@Tag("soak")
class CheckSoakTest {
    private static final String SEQUENCE = "name: soak\npurpose: Ten minutes.\ninitial: {wind_m_s: 10}\nduration_s: 600\n"
            + "checks:\n"
            + "  - name: band\n    band: {signal: v_dc_v, low: 1000, high: 1200}\n"
            + "  - name: settle\n    settle: {signal: v_term_pu, target: pre, tolerance: 0.05, after_s: 1, by_s: 2}\n"
            + "  - name: rise\n    rise_time: {signal: q_grid_pu, at_s: 1, final: 0.2, max_s: 1}\n"
            + "  - name: over\n    overshoot: {signal: q_grid_pu, at_s: 1, final: 0.2, max_percent: 50}\n"
            + "  - name: event\n    event_after: {trigger: {signal: v_term_pu, below: 0.5}, response: {signal: frt_active, above: 0.5}, within_s: 0.1}\n"
            + "  - name: env\n    envelope: {at_s: 1, points: [[0, 0], [599, 0.9]]}\n"
            + "  - name: kq\n    reactive_current: {at_s: 1, until_s: 600, k: 2, delay_s: 0.05, tolerance_pu: 0.5}\n"
            + "  - name: prec\n    power_recovery: {fault_at_s: 1, cleared_at_s: 2, within_s: 598}\n"
            + "  - name: flags\n    flags: {never_set: 65280}\n"
            + "  - name: link\n    link_health: {reply_age_max: 3}\n";

    @Test
    void shouldKeepMemoryFlatOverTenMinutesAtTwentyKilohertz() {
        SignalIndex layout = Layouts.documented();
        CheckSet set = SequenceChecks.bind(SequenceParser.parse("soak.yaml", SEQUENCE, null), layout);
        WaveformDigest digest = new WaveformDigest();
        String[] units = new String[layout.size()];
        java.util.Arrays.fill(units, "1");
        set.onStart(layout.names(), units, 50_000, 1);
        digest.onStart(layout.names(), units, 50_000, 1);
        Sample s = new Sample(layout.size());
        int v = layout.of("v_term_pu"), vp = layout.of("v_poc_pu"), dc = layout.of("v_dc_v"), q = layout.of("q_grid_pu");
        int st = layout.of("status_flags"), p = layout.of("p_grid_pu"), iq = layout.of("i_reactive_pu");
        final long total = 12_000_000L;
        long allocatedAt1M = 0, heapAt1M = 0;
        for (long k = 0; k < total; k++) {
            if (k == 1_000_000) {
                heapAt1M = usedHeapAfterGc();
                allocatedAt1M = Allocations.threadAllocatedBytes();
            }
            s.plantTimeNs = (k + 1) * 50_000L;
            double t = s.plantTimeNs * 1e-9;
            s.values[v] = 1.0 - 0.02 * Math.sin(t);
            s.values[vp] = s.values[v];
            s.values[dc] = 1100 + 10 * Math.sin(3 * t);
            s.values[q] = t < 1 ? 0 : 0.2;
            s.values[p] = 0.9;
            s.values[iq] = 0.0;
            s.values[st] = 1;
            set.onSample(s);
            digest.onSample(s);
        }
        long allocated = Allocations.threadAllocatedBytes() - allocatedAt1M;
        long heapGrowth = usedHeapAfterGc() - heapAt1M;
        // the digest keeps one boxed 8-byte value per second of plant time (about 16 B each)
        assertTrue(allocated < 600 * 64, "bytes allocated over 11 million samples: " + allocated);
        assertTrue(heapGrowth < 1_000_000, "heap growth after GC: " + heapGrowth + " B");
        set.onEnd(0);
        List<CheckOutcome> out = set.outcomes(new RunFacts());
        assertEquals(10, out.size());
    }

    private static long usedHeapAfterGc() {
        Runtime rt = Runtime.getRuntime();
        for (int i = 0; i < 3; i++) {
            System.gc();
        }
        return rt.totalMemory() - rt.freeMemory();
    }
}
