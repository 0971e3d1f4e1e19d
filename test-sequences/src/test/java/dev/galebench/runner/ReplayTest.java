package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.support.EchoBoardLink;
import dev.galebench.rt.support.FirstOrderTestPlant;
import dev.galebench.rt.support.LoopFixtures;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Record a board's replies during a run, replay them offline, and get the same waveforms to
 * the bit. Uses the loop's real {@code RealTimeLoop} with its test plant and in-test board.
 */
class ReplayTest {
    private static final long STEPS = 20_000;

    /** Drops, delays and a NaN reply, so supervision has decisions to reproduce. */
    private static int script(long seq) {
        if (seq % 97 == 0) {
            return EchoBoardLink.DROP;
        }
        if (seq % 50 == 3) {
            return EchoBoardLink.DELAY + 2;
        }
        return seq == 500 ? EchoBoardLink.NAN_DUTY : EchoBoardLink.NORMAL;
    }

    private static LoopConfig config() {
        return LoopFixtures.offline(2, STEPS).build();
    }

    private static LoopResult recordRun(Path replies, WaveformDigest digest) throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(LoopFixtures.STEP_NS);
        RecordingLink link = new RecordingLink(new EchoBoardLink(ReplayTest::script), replies, LoopFixtures.STEP_NS, 2);
        LoopResult r = LoopFixtures.run(config(), plant, link, null, List.<SampleConsumer>of(digest));
        assertTrue(link.finish() > 9_000, "replies written");
        assertEquals(0, link.lost());
        return r;
    }

    private static LoopResult replay(Path replies, WaveformDigest digest, ReplayLink[] keep) throws Exception {
        FirstOrderTestPlant plant = new FirstOrderTestPlant(LoopFixtures.STEP_NS);
        ReplayLink link = new ReplayLink(replies);
        keep[0] = link;
        return LoopFixtures.run(config(), plant, link, null, List.<SampleConsumer>of(digest));
    }

    @Test
    void shouldReproduceTheWaveformsBitForBit(@TempDir Path dir) throws Exception {
        Path file = dir.resolve(ReplyLog.FILE_NAME);
        WaveformDigest original = new WaveformDigest();
        LoopResult rec = recordRun(file, original);
        WaveformDigest again = new WaveformDigest();
        ReplayLink[] link = new ReplayLink[1];
        LoopResult rep = replay(file, again, link);
        assertEquals(0, link[0].lostInRecording());
        assertEquals(0, link[0].skipped());
        assertEquals(original.text(), again.text());
        assertTrue(rec.linkCounters.missingReplies > 100, "drops happened: " + rec.linkCounters.missingReplies);
        assertEquals(rec.linkCounters.missingReplies, rep.linkCounters.missingReplies);
        assertEquals(rec.linkCounters.lateReplies, rep.linkCounters.lateReplies);
        assertEquals(rec.linkCounters.invalidReferences, rep.linkCounters.invalidReferences);
        try (InputStream in = Files.newInputStream(file)) {
            ReplyLog.Header h = ReplyLog.readHeader(in);
            assertEquals(LoopFixtures.STEP_NS, h.stepPeriodNs());
            assertEquals(2, h.exchangeEverySteps());
        }
    }

    @Test
    void shouldNameTheSignalsWhenAReplyWasAltered(@TempDir Path dir) throws Exception {
        Path file = dir.resolve(ReplyLog.FILE_NAME);
        WaveformDigest original = new WaveformDigest();
        recordRun(file, original);
        // flip the lowest mantissa bit of gscDutyA in reply 7000 (offset 40 in the record)
        byte[] bytes = Files.readAllBytes(file);
        int at = ReplyLog.HEADER_BYTES + 7000 * ReplyLog.RECORD_BYTES + 40;
        ByteBuffer b = ByteBuffer.wrap(bytes).order(ByteOrder.LITTLE_ENDIAN);
        b.putLong(at, b.getLong(at) ^ 1L);
        Files.write(file, bytes);
        WaveformDigest again = new WaveformDigest();
        replay(file, again, new ReplayLink[1]);
        List<String> diff = WaveformDigest.Parsed.of(original.text()).differences(WaveformDigest.Parsed.of(again.text()));
        assertFalse(diff.isEmpty());
        String all = String.join("; ", diff);
        assertTrue(all.contains("first differing second of plant time: 0 s") && all.contains("gsc_duty_a"), all);
    }

    @Test
    void shouldRefuseAFileThatIsNotAReplyLog(@TempDir Path dir) throws IOException {
        Path f = dir.resolve("x.bin");
        Files.write(f, new byte[64]);
        IOException e = assertThrows(IOException.class, () -> new ReplayLink(f));
        assertTrue(e.getMessage().contains("bad magic"), e.getMessage());
    }

    @Test
    void shouldRecordWithoutAllocatingOnTheLoopThread(@TempDir Path dir) throws Exception {
        // the loop thread's allocated bytes, read by a step hook after a warm-up and 1 million
        // exchanges later, with every reply going through the recorder
        final long warmup = 300_000, measured = 1_000_000;
        // three back-to-back windows: a one-off JVM charge shows in one, a real allocation in all
        final dev.galebench.rt.support.AllocationProbe probe =
                new dev.galebench.rt.support.AllocationProbe(warmup, measured, 3);
        FirstOrderTestPlant plant = new FirstOrderTestPlant(LoopFixtures.STEP_NS);
        // a small ring: the writer falls behind again and again, so both the recorded and the
        // counted-as-lost path run in the warm-up and in the measurement (a path first taken
        // during the measurement would deoptimise the loop once, which allocates)
        RecordingLink link = new RecordingLink(new EchoBoardLink(), dir.resolve("r.bin"), LoopFixtures.STEP_NS, 1, 64);
        LoopResult r = LoopFixtures.run(LoopFixtures.offline(1, probe.lastStep() + 10).ringSize(1024)
                .offlineBackpressure(false).build(), plant, link, probe, List.<SampleConsumer>of());
        long written = link.finish();
        assertEquals(probe.lastStep() + 10, r.steps);
        assertEquals(0, probe.fewestBytesInAWindow(), "bytes allocated by the loop thread over " + measured
                + " exchanges through the reply recorder (fewest of 3 windows)");
        assertTrue(link.lost() > 0 && written > 0, "both paths ran: written " + written + ", lost " + link.lost());
    }
}
