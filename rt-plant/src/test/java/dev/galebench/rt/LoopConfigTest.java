package dev.galebench.rt;

import dev.galebench.rt.support.FirstOrderTestPlant;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class LoopConfigTest {

    @Test
    void shouldUseDocumentedDefaults() {
        LoopConfig c = LoopConfig.builder().build();
        assertEquals(50_000, c.stepPeriodNs);
        assertEquals(1, c.exchangeEverySteps);
        assertEquals(20_000_000, c.watchdogNs);
        assertEquals(-1, c.pinCpu);
        assertTrue(c.realTime);
        assertEquals(MissedTickPolicy.CATCH_UP, c.missedTickPolicy);
        assertEquals(400, c.watchdogExchanges());
    }

    @Test
    void shouldRoundWatchdogUpToWholeExchanges() {
        LoopConfig c = LoopConfig.builder().stepPeriodNs(50_000).exchangeEverySteps(3).watchdogNs(1_000_000).build();
        assertEquals(7, c.watchdogExchanges());
        assertEquals(150_000, c.exchangePeriodNs());
    }

    @Test
    void shouldRejectRingSizeNotPowerOfTwo() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> LoopConfig.builder().ringSize(1000).build());
        assertTrue(e.getMessage().contains("ringSize"), e.getMessage());
    }

    @Test
    void shouldRejectNonPositiveDurationAndBadStep() {
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LoopConfig.builder().durationSteps(0).build())
                .getMessage().contains("durationSteps"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LoopConfig.builder().stepPeriodNs(10).build())
                .getMessage().contains("stepPeriodNs"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LoopConfig.builder().exchangeEverySteps(0).build())
                .getMessage().contains("exchangeEverySteps"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> LoopConfig.builder().pinCpu(-2).build())
                .getMessage().contains("pinCpu"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> LoopConfig.builder().pitchRefLimitsRad(1.0, Double.NaN).build()).getMessage().contains("pitch"));
    }

    @Test
    void shouldLayOutPlantSignalsThenBoardAndTimingSignals() {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(50_000);
        SampleLayout l = SampleLayout.of(plant);
        assertEquals(plant.signalCount() + 15, l.signalCount());
        assertEquals("x_v", l.name(0));
        assertEquals("board_status", l.name(plant.signalCount()));
        assertEquals("reply_age", l.name(l.signalCount() - 1));
        assertEquals(plant.signalCount() + 10, l.indexOf("v_dev_ref_pu"));
        assertEquals("us", l.unit(l.indexOf("rtt_us")));
        assertEquals(-1, l.indexOf("nope"));
    }
}
