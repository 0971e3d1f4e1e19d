package dev.galebench.runner;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceParser;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A real-time run against the virtual board is recorded and replayed offline bit for bit,
 * whatever the loop's timing was (on a busy machine replies may be late: replay reproduces that).
 */
class ReplayRunTest {

    @Test
    void shouldReplayARealTimeRunBitForBit(@TempDir Path dir) throws Exception {
        Files.writeString(dir.resolve("short.yaml"), "name: short-jump\npurpose: A short real-time run.\n"
                + "initial: {wind_m_s: 11.0}\nduration_s: 0.4\nactions:\n  - at_s: 0.2\n    phase_jump: {angle_deg: 10}\n"
                + "checks:\n  - name: no-trip\n    band: {signal: trip_flags, high: 0}\n");
        Sequence seq = SequenceParser.parseFile(dir.resolve("short.yaml"));
        SequenceRunner.Options o = new SequenceRunner.Options();
        o.outBase = dir.resolve("runs");
        o.progress = false;
        o.warmupS = 0.2;
        SequenceRunner.Result r = new SequenceRunner().run(seq, o);
        assertTrue(r.loop().config.realTime);
        ReplayCommand.Outcome ok = ReplayCommand.replay(r.folder(), false);
        assertTrue(ok.reproduced(), ok.message());
        assertTrue(ok.message().contains("reproduced bit for bit (8000 samples"), ok.message());

        // change one recorded reply: the replay must notice and name the signals
        Path replies = r.folder().resolve(ReplyLog.FILE_NAME);
        byte[] bytes = Files.readAllBytes(replies);
        int at = ReplyLog.HEADER_BYTES + 5000 * ReplyLog.RECORD_BYTES + 48; // gscDutyB of reply 5000
        ByteBuffer b = ByteBuffer.wrap(bytes).order(ByteOrder.LITTLE_ENDIAN);
        b.putDouble(at, b.getDouble(at) + 1e-3);
        Files.write(replies, bytes);
        ReplayCommand.Outcome bad = ReplayCommand.replay(r.folder(), false);
        assertFalse(bad.reproduced());
        assertTrue(bad.message().contains("NOT reproduced") && bad.message().contains("gsc_duty_b"), bad.message());
    }
}
