package dev.galebench.check;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.rt.Sample;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceChecks;
import dev.galebench.sequence.SequenceLibrary;
import dev.galebench.testsupport.Allocations;
import dev.galebench.testsupport.Layouts;
import org.junit.jupiter.api.Test;

/** Checks stream: feeding samples allocates nothing, so a 10-minute run at 20 kHz keeps memory flat. */
class CheckMemoryTest {

    @Test
    void shouldAllocateNothingPerSampleForEveryLibraryCheck() throws Exception {
        SignalIndex layout = Layouts.documented();
        int checks = 0;
        for (String name : SequenceLibrary.names()) {
            Sequence seq = SequenceLibrary.load(name);
            CheckSet set = SequenceChecks.bind(seq, layout);
            checks += seq.checks().size();
            Sample s = new Sample(layout.size());
            int v = layout.of("v_term_pu"), p = layout.of("v_poc_pu"), st = layout.of("status_flags");
            long samples = Math.round(seq.durationS() / 50e-6);
            // warm up (JIT) with three passes, then the fewest bytes of three measured passes
            Allocations.Body pass = () -> {
                for (long k = 0; k < samples; k++) {
                    s.plantTimeNs = (k + 1) * 50_000L;
                    double t = s.plantTimeNs * 1e-9;
                    s.values[v] = 1.0 - 0.5 * Math.sin(t);
                    s.values[p] = s.values[v];
                    s.values[st] = 1;
                    set.onSample(s);
                }
            };
            for (int w = 0; w < 3; w++) {
                pass.run();
            }
            assertEquals(0, Allocations.minOverWindows(3, pass), name + ": bytes allocated over " + samples + " samples");
        }
        assertTrue(checks > 40, "every library check exercised: " + checks);
    }
}
