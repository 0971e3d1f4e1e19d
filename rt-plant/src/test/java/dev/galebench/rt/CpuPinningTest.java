package dev.galebench.rt;

import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;

import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.BitSet;
import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** CPU lists as the kernel writes them, and moving the process's other threads off the loop's CPU for a run. */
class CpuPinningTest {

    @Test
    void shouldParseAndFormatKernelCpuLists() {
        BitSet s = CpuPinning.parseList("0-2,5,7-8");
        assertEquals("0-2,5,7-8", CpuPinning.formatList(s));
        assertEquals(6, s.cardinality());
        s.clear(1);
        assertEquals("0,2,5,7-8", CpuPinning.formatList(s));
        assertEquals("3", CpuPinning.formatList(CpuPinning.parseList(" 3 ")));
        assertEquals("", CpuPinning.formatList(new BitSet()));
    }

    @Test
    void shouldFindTheAllowedListInAStatusFile() {
        assertEquals("0-1", CpuPinning.allowedList(List.of("Name:\tjava", "Cpus_allowed:\t3", "Cpus_allowed_list:\t0-1")));
        assertNull(CpuPinning.allowedList(List.of("Name:\tjava")));
    }

    private static String allowedOfThisThread() throws Exception {
        return CpuPinning.allowedList(Files.readAllLines(Path.of("/proc/thread-self/status")));
    }

    private static String allowedOfProcess() throws Exception {
        return CpuPinning.allowedList(Files.readAllLines(Path.of("/proc/self/status")));
    }

    @Test
    void shouldMoveOtherThreadsOffTheLoopCpuDuringARunAndPutThemBackAfter() throws Exception {
        Assumptions.assumeTrue(Files.isExecutable(Path.of("/usr/bin/taskset")), "taskset (util-linux) is needed");
        final String before = allowedOfThisThread();
        final BitSet allowed = CpuPinning.parseList(before);
        Assumptions.assumeTrue(allowed.cardinality() >= 2, "needs two CPUs, has " + before);
        final int cpu = allowed.nextSetBit(0);
        final String[] seen = new String[2];
        LoopConfig cfg = LoopFixtures.offline(1, 10).pinCpu(cpu).build();
        LoopResult r = LoopFixtures.run(cfg, new FirstOrderTestPlant(50_000), new EchoBoardLink(), (step, p) -> {
            if (step == 0) { // test only: reads files on the loop thread once
                try {
                    seen[0] = allowedOfThisThread();
                    seen[1] = allowedOfProcess();
                } catch (Exception e) {
                    throw new IllegalStateException(e);
                }
            }
        }, List.of());
        assertEquals(Integer.toString(cpu), seen[0], "loop thread pinned");
        assertFalse(CpuPinning.parseList(seen[1]).get(cpu), "the JVM's main thread kept off CPU " + cpu + ": " + seen[1]);
        assertTrue(r.pinning.contains("other threads on CPUs"), r.pinning);
        assertEquals(before, allowedOfThisThread(), "put back after the run");
        assertEquals(before, allowedOfProcess(), "put back after the run");
    }
}
