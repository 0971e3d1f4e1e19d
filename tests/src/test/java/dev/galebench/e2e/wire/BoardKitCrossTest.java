package dev.galebench.e2e.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.wire.Cobs;
import dev.galebench.wire.CobsFramer;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.Crc32c;
import dev.galebench.wire.FrameLayout;
import dev.galebench.wire.FrameStatus;
import dev.galebench.wire.MeasurementFrame;
import dev.galebench.wire.WireProfile;
import java.nio.ByteBuffer;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The C board kit and the Java codec agree byte for byte: Java encodes and C decodes; C
 * encodes and Java decodes; both classify corrupted frames the same; COBS and the serial
 * deframer produce the same output. The kit is compiled with -std=c99 -Wall -Wextra -Werror.
 */
class BoardKitCrossTest {
    private static final int FRAMES = 3000;

    @Test
    void shouldCompileWithoutAnyDiagnostic() throws Exception {
        BoardKit.build();
        assertEquals("", BoardKit.compilerOutput().trim(), "gcc printed nothing with " + String.join(" ", BoardKit.FLAGS));
    }

    @Test
    void shouldComputeTheCatalogueCrcInC() throws Exception {
        // CRC-32/ISCSI check value (RevEng CRC catalogue)
        assertEquals(List.of("e3069283"), BoardKit.run("gb_vectors", List.of(), "crc"));
    }

    @Test
    void shouldDecodeJavaFramesInCExactlyAsJavaDoes() throws Exception {
        final SplittableRandom random = new SplittableRandom(101);
        final ByteBuffer buffer = ByteBuffer.allocate(512);
        final MeasurementFrame m = new MeasurementFrame().wrap(buffer, 0);
        final CommandFrame c = new CommandFrame().wrap(buffer, 0);
        final List<String> input = new ArrayList<>();
        final List<String> expected = new ArrayList<>();
        final SensorView view = new SensorView();
        final BoardCommand command = new BoardCommand();
        int statuses = 0;
        for (int i = 0; i < FRAMES; i++) {
            final WireProfile profile = random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT;
            final boolean isCommand = random.nextBoolean();
            int length;
            if (isCommand) {
                randomCommand(random, command);
                length = c.encode(profile, random.nextLong(1L << 32), random.nextLong(1L << 32), command);
            } else {
                randomView(random, view);
                length = m.encode(profile, random.nextLong(1L << 32), view);
            }
            final int mutation = random.nextInt(5);
            if (mutation == 0) {
                buffer.put(random.nextInt(length), (byte) (1 << random.nextInt(8)));
            } else if (mutation == 1) {
                final int at = 4 + random.nextInt(length - 8);
                buffer.put(at, (byte) random.nextInt(256));
                buffer.putInt(length - 4, Crc32c.compute(buffer, 0, length - 4));
            } else if (mutation == 2) {
                length = random.nextInt(1, length);
            }
            final byte[] bytes = new byte[length];
            buffer.get(0, bytes);
            input.add(BoardKit.hex(bytes, length));
            final String line = javaCanonical(buffer, length, m, c);
            if (line.startsWith("X")) {
                statuses++;
            }
            expected.add(line);
        }
        final List<String> actual = BoardKit.run("gb_vectors", input, "decode");
        assertEquals(expected.size(), actual.size());
        for (int i = 0; i < expected.size(); i++) {
            assertEquals(expected.get(i), actual.get(i), "frame " + i + ": " + input.get(i));
        }
        assertTrue(statuses > FRAMES / 10 && statuses < FRAMES * 9 / 10, "both valid and rejected frames crossed: " + statuses);
    }

    @Test
    void shouldEncodeTheSameBytesInCAsInJava() throws Exception {
        final SplittableRandom random = new SplittableRandom(202);
        final ByteBuffer buffer = ByteBuffer.allocate(512);
        final MeasurementFrame m = new MeasurementFrame().wrap(buffer, 0);
        final CommandFrame c = new CommandFrame().wrap(buffer, 0);
        final List<String> input = new ArrayList<>();
        final List<String> expected = new ArrayList<>();
        final SensorView view = new SensorView();
        final BoardCommand command = new BoardCommand();
        for (int i = 0; i < FRAMES; i++) {
            final WireProfile profile = random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT;
            final int p = profile == WireProfile.FULL ? 0 : 1;
            final long seq = random.nextLong(1L << 32);
            final int length;
            if (random.nextBoolean()) {
                randomCommand(random, command);
                final long answered = random.nextLong(1L << 32);
                length = c.encode(profile, seq, answered, command);
                input.add("C " + p + " " + seq + " " + answered + " " + f(command.mscDutyA) + " " + f(command.mscDutyB) + " "
                        + f(command.mscDutyC) + " " + f(command.gscDutyA) + " " + f(command.gscDutyB) + " " + f(command.gscDutyC)
                        + " " + f(command.chopperDuty) + " " + f(command.pitchRefRad) + " "
                        + Integer.toUnsignedString(command.commandFlags) + " " + Integer.toUnsignedString(command.boardStatus));
            } else {
                randomView(random, view);
                length = m.encode(profile, seq, view);
                input.add("M " + p + " " + seq + " " + view.plantTimeNs + " " + Integer.toUnsignedString(view.statusFlags) + " "
                        + f(view.gridVoltageAV) + " " + f(view.gridVoltageBV) + " " + f(view.gridVoltageCV) + " "
                        + f(view.gridCurrentAA) + " " + f(view.gridCurrentBA) + " " + f(view.gridCurrentCA) + " "
                        + f(view.statorVoltageAV) + " " + f(view.statorVoltageBV) + " " + f(view.statorVoltageCV) + " "
                        + f(view.statorCurrentAA) + " " + f(view.statorCurrentBA) + " " + f(view.statorCurrentCA) + " "
                        + f(view.dcLinkVoltageV) + " " + f(view.rotorAngleRad) + " " + f(view.rotorSpeedRadPerS) + " "
                        + f(view.windSpeedMPerS) + " " + f(view.pitchAngleRad) + " " + f(view.gridVoltageDV) + " "
                        + f(view.gridVoltageQV) + " " + f(view.gridCurrentDA) + " " + f(view.gridCurrentQA) + " "
                        + f(view.statorCurrentDA) + " " + f(view.statorCurrentQA) + " " + f(view.statorVoltageDV) + " "
                        + f(view.statorVoltageQV) + " " + f(view.voltageDeviationRefPu));
            }
            final byte[] bytes = new byte[length];
            buffer.get(0, bytes);
            expected.add(BoardKit.hex(bytes, length));
        }
        final List<String> actual = BoardKit.run("gb_vectors", input, "encode");
        assertEquals(expected.size(), actual.size());
        int decodedByJava = 0;
        for (int i = 0; i < expected.size(); i++) {
            assertEquals(expected.get(i), actual.get(i), "frame " + i + " from: " + input.get(i));
            // C encoded, Java decodes
            final byte[] fromC = BoardKit.unhex(actual.get(i));
            final ByteBuffer b = ByteBuffer.wrap(fromC);
            final int status = (fromC[FrameLayout.OFFSET_KIND] & 0x0F) == 1
                    ? new MeasurementFrame().wrap(b, 0).decode(fromC.length, new SensorView())
                    : new CommandFrame().wrap(b, 0).decode(fromC.length, b.getInt(FrameLayout.FC_ANSWERED_SEQUENCE) & 0xFFFFFFFFL,
                    new BoardCommand());
            if (status == FrameStatus.OK) {
                decodedByJava++;
            }
        }
        assertTrue(decodedByJava > FRAMES / 2, "most C-encoded frames decode in Java: " + decodedByJava);
    }

    @Test
    void shouldCobsEncodeTheSameBytesInC() throws Exception {
        final SplittableRandom random = new SplittableRandom(303);
        final List<String> input = new ArrayList<>();
        final List<String> expected = new ArrayList<>();
        for (int i = 0; i < 2000; i++) {
            final byte[] src = new byte[i < 10 ? i * 127 % 600 : random.nextInt(1, 600)];
            for (int k = 0; k < src.length; k++) {
                src[k] = random.nextInt(5) == 0 ? 0 : (byte) random.nextInt(1, 256);
            }
            if (i == 3) {
                java.util.Arrays.fill(src, (byte) 7); // long zero-free runs: 254-byte blocks
            }
            final byte[] dst = new byte[Cobs.maxEncodedLength(src.length)];
            final int n = Cobs.encode(src, 0, src.length, dst, 0);
            input.add(src.length == 0 ? "" : BoardKit.hex(src, src.length));
            expected.add(BoardKit.hex(dst, n));
        }
        assertEquals(expected, BoardKit.run("gb_vectors", input, "cobs"));
    }

    @Test
    void shouldDeframeANoisySerialStreamLikeJava() throws Exception {
        final SplittableRandom random = new SplittableRandom(404);
        final CobsFramer framer = new CobsFramer(FrameLayout.MAX_FRAME_LENGTH, 8192);
        final byte[] frame = new byte[FrameLayout.MAX_FRAME_LENGTH + 1];
        final ByteBuffer buffer = ByteBuffer.allocate(256);
        final CommandFrame c = new CommandFrame().wrap(buffer, 0);
        final BoardCommand command = new BoardCommand();
        command.block(true);
        final List<String> input = new ArrayList<>();
        final List<String> expected = new ArrayList<>();
        for (int chunk = 0; chunk < 2000; chunk++) {
            final byte[] bytes;
            if (random.nextInt(3) == 0) {
                bytes = new byte[random.nextInt(1, 400)];
                for (int k = 0; k < bytes.length; k++) {
                    bytes[k] = random.nextInt(10) == 0 ? 0 : (byte) random.nextInt(256);
                }
            } else {
                final int len = c.encode(random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT, chunk, chunk, command);
                final byte[] raw = new byte[len];
                buffer.get(0, raw);
                final byte[] enc = new byte[Cobs.maxEncodedLength(len) + 2];
                enc[0] = 0;
                final int e = Cobs.encode(raw, 0, len, enc, 1);
                enc[e + 1] = 0;
                bytes = java.util.Arrays.copyOf(enc, e + 2);
            }
            input.add(BoardKit.hex(bytes, bytes.length));
            final int at = framer.writeOffset();
            System.arraycopy(bytes, 0, framer.buffer(), at, bytes.length);
            framer.advance(bytes.length);
            int r;
            while ((r = framer.nextFrame(frame)) != CobsFramer.NONE) {
                expected.add(r < 0 ? "B" : "F " + BoardKit.hex(frame, r));
            }
        }
        final List<String> actual = BoardKit.run("gb_vectors", input, "deframe");
        assertEquals(expected.size(), actual.size(), "same number of frames and bad blocks");
        assertEquals(expected, actual);
        assertTrue(expected.stream().anyMatch("B"::equals) && expected.stream().anyMatch(s -> s.startsWith("F")));
    }

    private static String javaCanonical(ByteBuffer buffer, int length, MeasurementFrame m, CommandFrame c) {
        final int kind = length > 3 ? buffer.get(FrameLayout.OFFSET_KIND) & 0xFF : -1;
        if (kind == FrameLayout.KIND_MEASUREMENT_FULL || kind == FrameLayout.KIND_MEASUREMENT_COMPACT) {
            final SensorView v = new SensorView();
            final int s = m.decode(length, v);
            if (s != FrameStatus.OK) {
                return "X " + s;
            }
            return "M " + m.sequence() + " " + (m.profile() == WireProfile.FULL ? 0 : 1) + " " + v.plantTimeNs + " "
                    + Integer.toUnsignedString(v.statusFlags)
                    + bits(v.gridVoltageAV) + bits(v.gridVoltageBV) + bits(v.gridVoltageCV)
                    + bits(v.gridCurrentAA) + bits(v.gridCurrentBA) + bits(v.gridCurrentCA)
                    + bits(v.statorVoltageAV) + bits(v.statorVoltageBV) + bits(v.statorVoltageCV)
                    + bits(v.statorCurrentAA) + bits(v.statorCurrentBA) + bits(v.statorCurrentCA)
                    + bits(v.dcLinkVoltageV) + bits(v.rotorAngleRad) + bits(v.rotorSpeedRadPerS) + bits(v.windSpeedMPerS)
                    + bits(v.pitchAngleRad) + bits(v.gridVoltageDV) + bits(v.gridVoltageQV) + bits(v.gridCurrentDA)
                    + bits(v.gridCurrentQA) + bits(v.statorCurrentDA) + bits(v.statorCurrentQA) + bits(v.statorVoltageDV)
                    + bits(v.statorVoltageQV) + bits(v.voltageDeviationRefPu);
        }
        final BoardCommand out = new BoardCommand();
        final long raw = length >= 12 ? c.answeredSequenceRaw() : 0;
        final int s = c.decode(length, raw, out);
        if (s != FrameStatus.OK) {
            return "X " + s;
        }
        final int profile = (buffer.get(FrameLayout.OFFSET_KIND) & 0xFF) == FrameLayout.KIND_COMMAND_FULL ? 0 : 1;
        return "C " + c.replySequence() + " " + profile + " " + out.answeredSequence
                + bits(out.mscDutyA) + bits(out.mscDutyB) + bits(out.mscDutyC)
                + bits(out.gscDutyA) + bits(out.gscDutyB) + bits(out.gscDutyC)
                + bits(out.chopperDuty) + bits(out.pitchRefRad) + " "
                + Integer.toUnsignedString(out.commandFlags) + " " + Integer.toUnsignedString(out.boardStatus);
    }

    private static String bits(double value) {
        final float f = (float) value;
        return Float.isNaN(f) ? " nan" : String.format(" %08x", Float.floatToRawIntBits(f));
    }

    /** A float-exact value as a C99-readable literal. */
    private static String f(double value) {
        return Double.isNaN(value) ? "nan" : Double.toHexString(value);
    }

    private static double rf(SplittableRandom r, double scale) {
        final int pick = r.nextInt(40);
        if (pick == 0) {
            return Double.NaN;
        }
        if (pick == 1) {
            return (float) (scale * 1e4 * (r.nextBoolean() ? 1 : -1)); // saturates COMPACT
        }
        if (pick == 2) {
            return r.nextBoolean() ? Double.POSITIVE_INFINITY : Double.NEGATIVE_INFINITY;
        }
        return (float) (scale * r.nextDouble(-1, 1));
    }

    private static void randomView(SplittableRandom r, SensorView v) {
        v.plantTimeNs = r.nextLong(1L << 50);
        v.statusFlags = r.nextInt();
        v.gridVoltageAV = rf(r, 600);
        v.gridVoltageBV = rf(r, 600);
        v.gridVoltageCV = rf(r, 600);
        v.gridCurrentAA = rf(r, 5000);
        v.gridCurrentBA = rf(r, 5000);
        v.gridCurrentCA = rf(r, 5000);
        v.statorVoltageAV = rf(r, 700);
        v.statorVoltageBV = rf(r, 700);
        v.statorVoltageCV = rf(r, 700);
        v.statorCurrentAA = rf(r, 5000);
        v.statorCurrentBA = rf(r, 5000);
        v.statorCurrentCA = rf(r, 5000);
        v.dcLinkVoltageV = Math.abs(rf(r, 1200));
        v.rotorAngleRad = rf(r, 20);
        v.rotorSpeedRadPerS = rf(r, 200);
        v.windSpeedMPerS = Math.abs(rf(r, 30));
        v.pitchAngleRad = rf(r, 1.5);
        v.gridVoltageDV = rf(r, 600);
        v.gridVoltageQV = rf(r, 600);
        v.gridCurrentDA = rf(r, 5000);
        v.gridCurrentQA = rf(r, 5000);
        v.statorCurrentDA = rf(r, 5000);
        v.statorCurrentQA = rf(r, 5000);
        v.statorVoltageDV = rf(r, 700);
        v.statorVoltageQV = rf(r, 700);
        v.voltageDeviationRefPu = rf(r, 0.5);
    }

    private static void randomCommand(SplittableRandom r, BoardCommand c) {
        c.mscDutyA = duty(r);
        c.mscDutyB = duty(r);
        c.mscDutyC = duty(r);
        c.gscDutyA = duty(r);
        c.gscDutyB = duty(r);
        c.gscDutyC = duty(r);
        c.chopperDuty = duty(r);
        c.pitchRefRad = r.nextInt(20) == 0 ? Double.NaN : (float) r.nextDouble(-1.8, 1.8);
        c.commandFlags = r.nextInt(10) == 0 ? r.nextInt() : r.nextInt(16);
        c.boardStatus = r.nextInt(64);
    }

    private static double duty(SplittableRandom r) {
        final int pick = r.nextInt(60);
        if (pick == 0) {
            return Double.NaN;
        }
        if (pick == 1) {
            return 1.25f;
        }
        if (pick == 2) {
            return -0.01f;
        }
        if (pick == 3) {
            return 1.0;
        }
        return (float) r.nextDouble();
    }
}
