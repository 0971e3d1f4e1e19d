package dev.galebench.wire;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.support.SensorViews;
import java.nio.ByteBuffer;
import org.junit.jupiter.api.Test;

class FrameCodecTest {
    private final ByteBuffer buffer = ByteBuffer.allocate(256);
    private final MeasurementFrame measurement = new MeasurementFrame().wrap(buffer, 0);
    private final CommandFrame command = new CommandFrame().wrap(buffer, 0);

    private static BoardCommand sampleCommand() {
        final BoardCommand c = new BoardCommand();
        c.mscDutyA = 0.1;
        c.mscDutyB = 0.5;
        c.mscDutyC = 0.9;
        c.gscDutyA = 0.0;
        c.gscDutyB = 1.0;
        c.gscDutyC = 0.33;
        c.chopperDuty = 0.25;
        c.pitchRefRad = -0.05;
        c.commandFlags = BoardCommand.CMD_MSC_ENABLE | BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE;
        c.boardStatus = BoardCommand.BOARD_RUNNING | BoardCommand.BOARD_FRT_ACTIVE;
        return c;
    }

    @Test
    void shouldRoundTripFullMeasurementAsFloat32() {
        final SensorView in = SensorViews.sample(123);
        final int n = measurement.encode(WireProfile.FULL, 77, in);
        assertEquals(FrameLayout.FULL_MEASUREMENT_LENGTH, n);
        final SensorView out = new SensorView();
        assertEquals(FrameStatus.OK, measurement.decode(n, out));
        assertEquals(77, measurement.sequence());
        assertEquals(in.plantTimeNs, out.plantTimeNs);
        assertEquals(in.statusFlags, out.statusFlags);
        assertEquals((float) in.gridVoltageBV, out.gridVoltageBV);
        assertEquals((float) in.statorCurrentCA, out.statorCurrentCA);
        assertEquals((float) in.dcLinkVoltageV, out.dcLinkVoltageV);
        assertEquals((float) in.statorVoltageQV, out.statorVoltageQV);
        assertEquals((float) in.voltageDeviationRefPu, out.voltageDeviationRefPu);
    }

    @Test
    void shouldRoundTripCompactMeasurementWithinHalfAnLsb() {
        final SensorView in = SensorViews.sample(55);
        final int n = measurement.encode(WireProfile.COMPACT, 9, in);
        assertEquals(FrameLayout.COMPACT_MEASUREMENT_LENGTH, n);
        final SensorView out = new SensorView();
        assertEquals(FrameStatus.OK, measurement.decode(n, out));
        assertEquals(in.gridVoltageAV, out.gridVoltageAV, 0.05 + 1e-9);
        assertEquals(in.gridCurrentCA, out.gridCurrentCA, 0.25 + 1e-9);
        assertEquals(in.dcLinkVoltageV, out.dcLinkVoltageV, 0.05 + 1e-9);
        assertEquals(in.rotorAngleRad, out.rotorAngleRad, Math.PI / 65536 + 1e-12);
        assertEquals(in.rotorSpeedRadPerS, out.rotorSpeedRadPerS, 0.005 + 1e-9);
        assertEquals(in.pitchAngleRad, out.pitchAngleRad, 0.5e-4 + 1e-12);
        assertEquals(in.plantTimeNs, out.plantTimeNs, "plant time in whole microseconds");
        assertTrue(Double.isNaN(out.gridVoltageDV), "COMPACT carries no dq values");
    }

    @Test
    void shouldSaturateAndMarkNanInCompactProfile() {
        final SensorView in = SensorViews.sample(1);
        in.gridVoltageAV = 1e6;
        in.gridCurrentBA = -1e6;
        in.windSpeedMPerS = Double.NaN;
        in.rotorSpeedRadPerS = Double.NaN;
        final int n = measurement.encode(WireProfile.COMPACT, 1, in);
        final SensorView out = new SensorView();
        assertEquals(FrameStatus.OK, measurement.decode(n, out));
        assertEquals(3276.7, out.gridVoltageAV, 1e-9);
        assertEquals(-16383.5, out.gridCurrentBA, 1e-9);
        assertTrue(Double.isNaN(out.windSpeedMPerS));
        assertTrue(Double.isNaN(out.rotorSpeedRadPerS));
    }

    @Test
    void shouldRoundTripCommandsOfBothProfiles() {
        final BoardCommand in = sampleCommand();
        for (WireProfile p : WireProfile.values()) {
            final int n = command.encode(p, 5, 1000, in);
            assertEquals(p.commandLength, n);
            final BoardCommand out = new BoardCommand();
            assertEquals(FrameStatus.OK, command.decode(n, 1002, out), p.name());
            final double tol = p == WireProfile.FULL ? 1e-7 : 0.5 / 65534 + 1e-12;
            assertEquals(1000, out.answeredSequence);
            assertEquals(in.mscDutyA, out.mscDutyA, tol);
            assertEquals(in.gscDutyB, out.gscDutyB, tol);
            assertEquals(in.gscDutyC, out.gscDutyC, tol);
            assertEquals(in.chopperDuty, out.chopperDuty, tol);
            assertEquals(in.pitchRefRad, out.pitchRefRad, p == WireProfile.FULL ? 1e-8 : 0.5e-4);
            assertEquals(in.commandFlags, out.commandFlags);
            assertEquals(in.boardStatus, out.boardStatus);
            assertEquals(5, command.replySequence());
        }
    }

    @Test
    void shouldEncodeHalfDutyExactlyInCompactProfile() {
        final BoardCommand in = sampleCommand();
        final int n = command.encode(WireProfile.COMPACT, 0, 0, in);
        assertEquals(32767, buffer.getShort(FrameLayout.CC_MSC_DUTY_A + 2) & 0xFFFF);
        final BoardCommand out = new BoardCommand();
        assertEquals(FrameStatus.OK, command.decode(n, 0, out));
        assertEquals(0.5, out.mscDutyB);
    }

    @Test
    void shouldRejectFrameWithBadCrc() {
        final int n = command.encode(WireProfile.FULL, 0, 3, sampleCommand());
        buffer.put(20, (byte) (buffer.get(20) ^ 0x10));
        final BoardCommand out = new BoardCommand();
        assertEquals(FrameStatus.CRC_ERROR, command.decode(n, 3, out));
        assertEquals(-1, out.answeredSequence, "untouched");
    }

    @Test
    void shouldRejectFrameWithWrongLengthVersionOrKind() {
        final BoardCommand out = new BoardCommand();
        int n = command.encode(WireProfile.FULL, 0, 3, sampleCommand());
        assertEquals(FrameStatus.MALFORMED, command.decode(n - 1, 3, out), "length");
        buffer.put(FrameLayout.OFFSET_VERSION, (byte) 2);
        buffer.putInt(FrameLayout.FC_CRC, Crc32c.compute(buffer, 0, FrameLayout.FC_CRC));
        assertEquals(FrameStatus.MALFORMED, command.decode(n, 3, out), "version");
        n = command.encode(WireProfile.FULL, 0, 3, sampleCommand());
        buffer.put(FrameLayout.OFFSET_KIND, (byte) FrameLayout.KIND_MEASUREMENT_COMPACT);
        buffer.putInt(FrameLayout.FC_CRC, Crc32c.compute(buffer, 0, FrameLayout.FC_CRC));
        assertEquals(FrameStatus.MALFORMED, command.decode(n, 3, out), "kind does not match length");
        n = measurement.encode(WireProfile.COMPACT, 3, SensorViews.sample(3));
        assertEquals(FrameStatus.MALFORMED, command.decode(n, 3, out), "a measurement is not a command");
    }

    @Test
    void shouldRejectReplyToASequenceNeverSent() {
        final BoardCommand out = new BoardCommand();
        final int n = command.encode(WireProfile.FULL, 0, 11, sampleCommand());
        assertEquals(FrameStatus.MALFORMED, command.decode(n, 10, out), "answers the future");
        assertEquals(FrameStatus.MALFORMED, command.decode(n, -1, out), "nothing sent yet");
        assertEquals(FrameStatus.OK, command.decode(n, 11, out));
    }

    @Test
    void shouldRejectNanAndOutOfRangeReferences() {
        final BoardCommand out = new BoardCommand();
        final BoardCommand bad = sampleCommand();
        bad.gscDutyA = Double.NaN;
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.FULL, 0, 1, bad), 1, out));
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.COMPACT, 0, 1, bad), 1, out));
        final BoardCommand high = sampleCommand();
        high.chopperDuty = 1.01;
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.FULL, 0, 1, high), 1, out));
        final BoardCommand pitch = sampleCommand();
        pitch.pitchRefRad = Double.POSITIVE_INFINITY;
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.FULL, 0, 1, pitch), 1, out));
        pitch.pitchRefRad = 2.0;
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.COMPACT, 0, 1, pitch), 1, out));
        final BoardCommand flags = sampleCommand();
        flags.commandFlags |= 1 << 7;
        assertEquals(FrameStatus.INVALID_REFERENCE, command.decode(command.encode(WireProfile.FULL, 0, 1, flags), 1, out));
        assertEquals(-1, out.answeredSequence, "every rejection left the command untouched");
    }
}
