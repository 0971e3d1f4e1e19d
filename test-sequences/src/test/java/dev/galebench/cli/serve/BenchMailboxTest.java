package dev.galebench.cli.serve;

import dev.galebench.link.LinkFaults;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.testsupport.Allocations;
import org.junit.jupiter.api.Test;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** The mailbox between the console's control thread and the real-time thread, on the real plant. */
class BenchMailboxTest {
    private static final long STEP_NS = 50_000;

    private static TurbinePlant settledPlant() {
        TurbineParameters p = TurbineFile.defaults();
        TurbinePlant plant = new TurbinePlant(p, STEP_NS);
        plant.initialise(SteadyState.solve(p, 10.0, 1.0, 0.0));
        return plant;
    }

    private static double signal(TurbinePlant plant, String name) {
        double[] v = new double[plant.signalCount()];
        plant.sample(v);
        for (int i = 0; i < plant.signalCount(); i++) {
            if (plant.signalName(i).equals(name)) {
                return v[i];
            }
        }
        throw new AssertionError("no signal " + name);
    }

    @Test
    void shouldApplyEachPostedControlAtTheNextStepAndEndTimedOnesOnTime() {
        TurbinePlant plant = settledPlant();
        LinkFaults faults = new LinkFaults();
        BenchMailbox box = new BenchMailbox(new LinkFaultMenu(faults));
        BoardCommand hold = new BoardCommand();
        for (long k = 0; k < 10; k++) {
            box.beforeStep(k, plant);
            plant.step(hold);
        }
        assertEquals(0, box.appliedCount());

        box.postWind(13.5);
        box.postVoltageDeviationRef(0.04);
        box.postVoltageEvent(0.5, 100);
        box.postLinkFault(LinkFaultMenu.kindOf("silence"), 40);
        box.beforeStep(10, plant);
        assertEquals(4, box.appliedCount());
        assertEquals(10, box.lastAppliedStep());
        plant.step(hold);
        assertEquals(13.5, signal(plant, "wind_m_s"), 1e-12);
        assertEquals(0.5, signal(plant, "v_source_pu"), 1e-9);
        assertTrue(faults.silent, "silence switched on in the link's fault settings");

        for (long k = 11; k < 50; k++) {
            box.beforeStep(k, plant);
            plant.step(hold);
        }
        assertTrue(faults.silent, "still on through step 49");
        box.beforeStep(50, plant);
        plant.step(hold);
        assertFalse(faults.silent, "the fault ended after its 40 steps (10..49)");
        assertEquals(0.5, signal(plant, "v_source_pu"), 1e-9, "the dip lasts 100 steps");
        for (long k = 51; k < 110; k++) {
            box.beforeStep(k, plant);
            plant.step(hold);
        }
        assertEquals(0.5, signal(plant, "v_source_pu"), 1e-9, "still dipped through step 109");
        for (long k = 110; k < 111; k++) {
            box.beforeStep(k, plant);
            plant.step(hold);
        }
        assertEquals(1.0, signal(plant, "v_source_pu"), 1e-9, "source back to its level before the dip");
        assertEquals(4, box.appliedCount(), "nothing applied twice");
    }

    @Test
    void shouldAllocateNothingOnTheRealTimeSideOverAMillionSteps() throws Exception {
        TurbinePlant plant = settledPlant();
        BenchMailbox box = new BenchMailbox(new LinkFaultMenu(new LinkFaults()));
        // warm-up and measurement run the same method while another thread posts, so every
        // apply path is compiled before the measured million steps
        steps(box, plant, 0, 1_000_000, startPoster(box));
        long appliedBefore = box.appliedCount();
        // the fewest bytes of three measured windows (see Allocations.minOverWindows); the poster
        // thread is made and joined outside each window
        long allocated = Long.MAX_VALUE;
        for (int w = 0; w < 3 && allocated != 0; w++) {
            Thread poster = startPoster(box);
            long from = 1_000_000L * (w + 1);
            long before = Allocations.threadAllocatedBytes();
            for (long k = from; k < from + 1_000_000; k++) {
                box.beforeStep(k, plant);
            }
            allocated = Math.min(allocated, Allocations.threadAllocatedBytes() - before);
            poster.join();
        }
        assertEquals(0, allocated, "bytes allocated by the real-time side (fewest of 3 windows)");
        assertTrue(box.appliedCount() > appliedBefore, "controls were applied during the measurement");
    }

    private static void steps(BenchMailbox box, TurbinePlant plant, long from, long to, Thread poster) throws InterruptedException {
        for (long k = from; k < to; k++) {
            box.beforeStep(k, plant);
        }
        poster.join();
    }

    /** Posts every kind of control about once a millisecond, 200 times. */
    private static Thread startPoster(BenchMailbox box) {
        Thread poster = new Thread(() -> {
            for (int i = 0; i < 200; i++) {
                box.postWind(8 + (i % 5));
                box.postVoltageEvent(0.9, 20);
                box.postLinkFault(i % LinkFaultMenu.NAMES.size(), 30);
                box.postVoltageDeviationRef((i % 3) * 0.01);
                try {
                    Thread.sleep(1);
                } catch (InterruptedException e) {
                    return;
                }
            }
        }, "poster");
        poster.start();
        return poster;
    }
}
