package dev.galebench.rt;

import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static dev.galebench.rt.support.LoopFixtures.STEP_NS;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Hand-off stress: the loop publishes offline as fast as it can (no back-pressure) into four
 * small rings read by consumers of different speeds. Every consumer must see strictly
 * increasing exchanges, each slot internally consistent (never a half-written sample), and
 * received + missed must equal the exchanges exactly. Run with {@code mvn -P soak}.
 */
@Tag("stress")
class RingStressTest {

    /** Checks each sample against what the loop wrote into it. */
    static final class CheckingConsumer implements SampleConsumer {
        final int spinPerSample;
        long received;
        long lastExchange = -1;
        String firstProblem;
        int xIndex;
        int ageIndex;

        CheckingConsumer(int spinPerSample) {
            this.spinPerSample = spinPerSample;
        }

        @Override
        public void onStart(String[] names, String[] units, long stepPeriodNs, int m) {
            xIndex = 0;
            ageIndex = names.length - 1;
        }

        @Override
        public void onSample(Sample s) {
            received++;
            if (s.exchangeIndex <= lastExchange && firstProblem == null) {
                firstProblem = "exchange " + s.exchangeIndex + " after " + lastExchange;
            }
            lastExchange = s.exchangeIndex;
            if (s.stepIndex != s.exchangeIndex + 1 || s.plantTimeNs != s.stepIndex * STEP_NS) {
                if (firstProblem == null) {
                    firstProblem = "torn indices at exchange " + s.exchangeIndex;
                }
            }
            if (s.values[4] != 0.0 || s.values[ageIndex] < 0.0 || !Double.isFinite(s.values[xIndex])) {
                if (firstProblem == null) {
                    firstProblem = "bad values at exchange " + s.exchangeIndex;
                }
            }
            for (int i = 0; i < spinPerSample; i++) {
                Thread.onSpinWait();
            }
        }

        @Override
        public void onEnd(long missed) {
        }
    }

    @Test
    void shouldHandOffEverySampleOrCountItUnderFullSpeedPublishing() throws Exception {
        final long exchanges = 3_000_000;
        List<CheckingConsumer> checkers = new ArrayList<>();
        int[] spins = {0, 10, 100, 1000};
        for (int s : spins) {
            checkers.add(new CheckingConsumer(s));
        }
        FirstOrderTestPlant plant = new FirstOrderTestPlant(STEP_NS);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, exchanges).ringSize(256).offlineBackpressure(false)
                        .watchdogNs(Long.MAX_VALUE / 4).build(), plant, new EchoBoardLink(), null,
                new ArrayList<>(checkers));
        assertEquals(exchanges, r.exchanges);
        for (int i = 0; i < checkers.size(); i++) {
            CheckingConsumer c = checkers.get(i);
            assertNull(c.firstProblem, "consumer " + i);
            assertEquals(exchanges, c.received + r.samplesMissed[i], "consumer " + i);
        }
        assertTrue(r.samplesMissed[3] > 0, "the slowest consumer cannot keep up at full speed");
    }
}
