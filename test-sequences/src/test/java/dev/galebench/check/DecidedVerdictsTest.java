package dev.galebench.check;

import dev.galebench.report.CheckOutcome;
import dev.galebench.rt.Sample;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Verdicts handed out as soon as a check's window has passed, for live consoles. */
class DecidedVerdictsTest {

    @Test
    void shouldPublishEachWindowedVerdictOnceWhenPlantTimePassesItsWindow() {
        BandCheck early = new BandCheck("early", "v", 0.0, 2.0, 0.0, 1.0);
        BandCheck late = new BandCheck("late", "v", 0.0, 2.0, 0.0, 3.0);
        CheckSet set = new CheckSet(List.of(early, late));
        set.onStart(new String[] {"v"}, new String[] {"V"}, 50_000, 1);
        List<CheckOutcome> seen = new ArrayList<>();
        List<Double> seenAtS = new ArrayList<>();
        double[] now = {0};
        set.onDecided(o -> {
            seen.add(o);
            seenAtS.add(now[0]);
        });
        Sample s = new Sample(1);
        for (int k = 1; k <= 40_000; k++) { // 2 s at 50 us
            s.plantTimeNs = k * 50_000L;
            now[0] = s.plantTimeNs * 1e-9;
            s.values[0] = k * 50e-6 < 1.5 ? 1.0 : 5.0; // leaves the band at 1.5 s, after the first window
            set.onSample(s);
        }
        assertEquals(1, seen.size(), "only the check whose window ended was published: " + seen);
        assertEquals("early", seen.get(0).name());
        assertTrue(seen.get(0).passed(), seen.get(0).toString());
        assertTrue(seenAtS.get(0) > 1.0 && seenAtS.get(0) < 1.001, "published right after 1.0 s: " + seenAtS.get(0));
        List<CheckOutcome> fin = set.outcomes(new RunFacts());
        assertTrue(fin.get(0).passed());
        assertFalse(fin.get(1).passed(), "the late window saw the excursion at 1.5 s");
    }
}
