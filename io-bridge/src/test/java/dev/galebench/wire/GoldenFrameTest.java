package dev.galebench.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.support.SensorViews;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * One golden file per frame kind of wire version 1 ({@code src/test/resources/wire/v1}):
 * encode fixed inputs and byte-compare with the file; decode the file, encode again,
 * byte-compare again. A change of layout, scale or CRC breaks these on purpose; a new wire
 * version gets new files. Regenerate (only when the version changes) with
 * {@code -Dgalebench.golden.write=true}.
 */
class GoldenFrameTest {
    private static String encode(String name) {
        final ByteBuffer b = ByteBuffer.allocate(256);
        final int n;
        switch (name) {
            case "measurement-full":
                n = new MeasurementFrame().wrap(b, 0).encode(WireProfile.FULL, 0x01020304L, SensorViews.sample(1234));
                break;
            case "measurement-compact":
                n = new MeasurementFrame().wrap(b, 0).encode(WireProfile.COMPACT, 0x01020304L, SensorViews.sample(1234));
                break;
            case "command-full":
                n = new CommandFrame().wrap(b, 0).encode(WireProfile.FULL, 7, 0x01020304L, command());
                break;
            default:
                n = new CommandFrame().wrap(b, 0).encode(WireProfile.COMPACT, 7, 0x01020304L, command());
                break;
        }
        return hex(b, n);
    }

    private static BoardCommand command() {
        final BoardCommand c = new BoardCommand();
        c.mscDutyA = 0.25;
        c.mscDutyB = 0.5;
        c.mscDutyC = 0.75;
        c.gscDutyA = 0.0;
        c.gscDutyB = 1.0;
        c.gscDutyC = 0.5;
        c.chopperDuty = 0.125;
        c.pitchRefRad = 0.0175;
        c.commandFlags = BoardCommand.CMD_MSC_ENABLE | BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE;
        c.boardStatus = BoardCommand.BOARD_RUNNING | BoardCommand.BOARD_PLL_LOCKED;
        return c;
    }

    private static String hex(ByteBuffer b, int n) {
        final StringBuilder s = new StringBuilder();
        for (int i = 0; i < n; i++) {
            s.append(String.format("%02x", b.get(i) & 0xFF));
            s.append(i % 16 == 15 || i == n - 1 ? "\n" : " ");
        }
        return s.toString();
    }

    private static byte[] unhex(String text) {
        final String digits = text.replaceAll("[^0-9a-fA-F]", "");
        final byte[] out = new byte[digits.length() / 2];
        for (int i = 0; i < out.length; i++) {
            out[i] = (byte) Integer.parseInt(digits.substring(2 * i, 2 * i + 2), 16);
        }
        return out;
    }

    @ParameterizedTest
    @ValueSource(strings = {"measurement-full", "measurement-compact", "command-full", "command-compact"})
    void shouldReproduceTheGoldenFrameByteForByte(String name) throws IOException {
        final String encoded = encode(name);
        if (Boolean.getBoolean("galebench.golden.write")) {
            final Path p = Paths.get("src/test/resources/wire/v1", name + ".hex");
            Files.writeString(p, encoded, StandardCharsets.US_ASCII);
        }
        final String golden;
        try (InputStream in = GoldenFrameTest.class.getResourceAsStream("/wire/v1/" + name + ".hex")) {
            golden = new String(in.readAllBytes(), StandardCharsets.US_ASCII);
        }
        assertEquals(golden, encoded, name);
        // read back and write again
        final byte[] bytes = unhex(golden);
        final ByteBuffer b = ByteBuffer.wrap(bytes);
        final ByteBuffer again = ByteBuffer.allocate(256);
        final int n;
        if (name.startsWith("measurement")) {
            final MeasurementFrame m = new MeasurementFrame().wrap(b, 0);
            final SensorView v = new SensorView();
            assertEquals(FrameStatus.OK, m.decode(bytes.length, v));
            n = new MeasurementFrame().wrap(again, 0).encode(m.profile(), m.sequence(), v);
        } else {
            final CommandFrame c = new CommandFrame().wrap(b, 0);
            final BoardCommand cmd = new BoardCommand();
            assertEquals(FrameStatus.OK, c.decode(bytes.length, 0x01020304L, cmd));
            n = new CommandFrame().wrap(again, 0).encode(name.endsWith("full") ? WireProfile.FULL : WireProfile.COMPACT,
                    c.replySequence(), cmd.answeredSequence, cmd);
        }
        assertEquals(golden, hex(again, n), name + " decoded and encoded again");
    }
}
