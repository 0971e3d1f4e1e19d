package dev.galebench.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.support.SensorViews;
import java.nio.ByteBuffer;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Feeds more than a million random and mutated frames to the decoders. No exception may
 * escape and every frame must be accounted for: accepted + each rejection = fed.
 */
class FrameFuzzTest {
    private static final int FRAMES = 1_200_000;

    @Test
    void shouldAccountForEveryRandomOrMutatedFrame() {
        final SplittableRandom random = new SplittableRandom(20261202L);
        final ByteBuffer buffer = ByteBuffer.allocate(512);
        final MeasurementFrame m = new MeasurementFrame().wrap(buffer, 0);
        final CommandFrame c = new CommandFrame().wrap(buffer, 0);
        final SensorView view = new SensorView();
        final BoardCommand command = new BoardCommand();
        final BoardCommand out = new BoardCommand();
        final long[] byStatus = new long[4];
        final long[] byStatusMeasurement = new long[4];
        long fedCommands = 0;
        long fedMeasurements = 0;
        for (int i = 0; i < FRAMES; i++) {
            final int mode = random.nextInt(6);
            final boolean asCommand = random.nextBoolean();
            final WireProfile profile = random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT;
            int length;
            if (mode == 0) {
                // pure noise of any length
                length = random.nextInt(0, 200);
                for (int k = 0; k < length; k++) {
                    buffer.put(k, (byte) random.nextInt(256));
                }
            } else {
                command.mscDutyA = random.nextDouble();
                command.mscDutyB = random.nextDouble();
                command.mscDutyC = random.nextDouble();
                command.gscDutyA = command.gscDutyB = command.gscDutyC = 0.5;
                command.chopperDuty = random.nextDouble() < 0.1 ? 1.0 : 0.0;
                command.pitchRefRad = random.nextDouble(-1.5, 1.5);
                command.commandFlags = random.nextInt(16);
                command.boardStatus = random.nextInt();
                SensorViews.fill(view, random.nextInt(1_000_000));
                length = asCommand ? c.encode(profile, i, i, command) : m.encode(profile, i, view);
                if (mode == 1) {
                    // flip 1 to 4 random bits
                    final int flips = 1 + random.nextInt(4);
                    for (int f = 0; f < flips; f++) {
                        final int at = random.nextInt(length);
                        buffer.put(at, (byte) (buffer.get(at) ^ (1 << random.nextInt(8))));
                    }
                } else if (mode == 2) {
                    // truncate or extend
                    length = random.nextBoolean() ? random.nextInt(length) : length + 1 + random.nextInt(60);
                } else if (mode == 3) {
                    // overwrite a random field with random bytes, then fix the CRC so validation sees it
                    final int at = random.nextInt(length - 4);
                    final int n = Math.min(length - 4 - at, 1 + random.nextInt(8));
                    for (int k = 0; k < n; k++) {
                        buffer.put(at + k, (byte) random.nextInt(256));
                    }
                    buffer.putInt(length - 4, Crc32c.compute(buffer, 0, length - 4));
                } else if (mode == 4) {
                    // NaN or infinity in a float field of a FULL frame, CRC fixed
                    if (profile == WireProfile.FULL) {
                        final int at = asCommand ? 12 + 4 * random.nextInt(8) : 20 + 4 * random.nextInt(26);
                        buffer.putFloat(at, random.nextBoolean() ? Float.NaN : Float.NEGATIVE_INFINITY);
                        buffer.putInt(length - 4, Crc32c.compute(buffer, 0, length - 4));
                    }
                }
                // mode 5: unmodified valid frame
            }
            if (asCommand) {
                final int status = c.decode(length, i + random.nextInt(3), out);
                byStatus[status]++;
                fedCommands++;
            } else {
                final int status = m.decode(length, view);
                byStatusMeasurement[status]++;
                fedMeasurements++;
            }
        }
        assertEquals(FRAMES, fedCommands + fedMeasurements);
        assertEquals(fedCommands, byStatus[FrameStatus.OK] + byStatus[FrameStatus.CRC_ERROR]
                + byStatus[FrameStatus.MALFORMED] + byStatus[FrameStatus.INVALID_REFERENCE]);
        assertEquals(fedMeasurements, byStatusMeasurement[FrameStatus.OK] + byStatusMeasurement[FrameStatus.CRC_ERROR]
                + byStatusMeasurement[FrameStatus.MALFORMED]);
        assertEquals(0, byStatusMeasurement[FrameStatus.INVALID_REFERENCE], "measurements are not range-checked");
        for (int s = 0; s < 4; s++) {
            assertTrue(byStatus[s] > 1000, "command status " + FrameStatus.name(s) + " seen: " + byStatus[s]);
        }
        // mode 5 (1/6 of frames, half commands) must all be accepted, among others
        assertTrue(byStatus[FrameStatus.OK] > FRAMES / 12 * 0.95, "accepted commands " + byStatus[FrameStatus.OK]);
    }

    @Test
    void shouldAccountForEveryBlockOfARandomSerialStream() {
        final SplittableRandom random = new SplittableRandom(77);
        final CobsFramer framer = new CobsFramer(FrameLayout.MAX_FRAME_LENGTH, 4096);
        final byte[] frame = new byte[FrameLayout.MAX_FRAME_LENGTH + 1];
        final byte[] valid = new byte[FrameLayout.MAX_FRAME_LENGTH];
        final byte[] encoded = new byte[Cobs.maxEncodedLength(FrameLayout.MAX_FRAME_LENGTH) + 1];
        final ByteBuffer validBuffer = ByteBuffer.wrap(valid);
        final CommandFrame c = new CommandFrame().wrap(validBuffer, 0);
        final BoardCommand command = new BoardCommand();
        command.block(true);
        final ByteBuffer frameBuffer = ByteBuffer.wrap(frame);
        final CommandFrame decoder = new CommandFrame().wrap(frameBuffer, 0);
        final BoardCommand out = new BoardCommand();
        long validSent = 0;
        long validDecoded = 0;
        long blocks = 0;
        long malformed = 0;
        for (int i = 0; i < 300_000; i++) {
            final int at = framer.writeOffset();
            int n;
            if (random.nextInt(3) == 0) {
                // a burst of line noise (may contain delimiters)
                n = Math.min(framer.writableBytes(), random.nextInt(1, 300));
                for (int k = 0; k < n; k++) {
                    framer.buffer()[at + k] = (byte) (random.nextInt(8) == 0 ? 0 : random.nextInt(256));
                }
            } else {
                final int len = c.encode(random.nextBoolean() ? WireProfile.FULL : WireProfile.COMPACT, i, i, command);
                final int e = Cobs.encode(valid, 0, len, encoded, 0);
                encoded[e] = 0;
                n = Math.min(framer.writableBytes(), e + 2);
                final int lead = 1; // a leading delimiter resynchronises after noise
                framer.buffer()[at] = 0;
                System.arraycopy(encoded, 0, framer.buffer(), at + lead, Math.min(e + 1, n - lead));
                validSent++;
            }
            framer.advance(n);
            int r;
            while ((r = framer.nextFrame(frame)) != CobsFramer.NONE) {
                blocks++;
                if (r < 0) {
                    malformed++;
                } else if (decoder.decode(r, i, out) == FrameStatus.OK) {
                    validDecoded++;
                }
            }
        }
        assertTrue(blocks > 0 && malformed > 0);
        assertEquals(validSent, validDecoded, "every valid frame sent after a delimiter is decoded, noise or not");
    }
}
