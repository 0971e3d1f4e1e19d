package dev.galebench.wire;

import dev.galebench.plant.SensorView;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;

/**
 * Flyweight over one measurement frame (plant to board) in a caller-owned buffer. Wrap once,
 * then {@link #encode} or {@link #decode} in place with absolute little-endian reads and
 * writes: no allocation, no change of the buffer's position or limit, no exceptions for bad
 * input (status codes from {@link FrameStatus}). One instance per thread.
 */
public final class MeasurementFrame {
    private final Crc32c crc = new Crc32c();
    private ByteBuffer buffer;
    private int offset;

    /** Points this flyweight at {@code buffer[offset ..]}; sets the buffer to little-endian. */
    public MeasurementFrame wrap(ByteBuffer buffer, int offset) {
        buffer.order(ByteOrder.LITTLE_ENDIAN);
        this.buffer = buffer;
        this.offset = offset;
        return this;
    }

    /**
     * Writes a complete frame (header, payload, CRC) for {@code view} with the low 32 bits of
     * {@code sequence}. Returns the frame length; the buffer needs {@code profile.measurementLength} bytes.
     */
    public int encode(WireProfile profile, long sequence, SensorView view) {
        final ByteBuffer b = buffer;
        final int o = offset;
        b.put(o + FrameLayout.OFFSET_MAGIC, (byte) FrameLayout.MAGIC_0);
        b.put(o + FrameLayout.OFFSET_MAGIC + 1, (byte) FrameLayout.MAGIC_1);
        b.put(o + FrameLayout.OFFSET_VERSION, (byte) FrameLayout.VERSION);
        b.putInt(o + FrameLayout.OFFSET_SEQUENCE, (int) sequence);
        if (profile == WireProfile.FULL) {
            b.put(o + FrameLayout.OFFSET_KIND, (byte) FrameLayout.KIND_MEASUREMENT_FULL);
            b.putLong(o + FrameLayout.FM_PLANT_TIME_NS, view.plantTimeNs);
            b.putInt(o + FrameLayout.FM_STATUS_FLAGS, view.statusFlags);
            putF(b, o + FrameLayout.FM_GRID_VOLTAGE_A, view.gridVoltageAV, view.gridVoltageBV, view.gridVoltageCV);
            putF(b, o + FrameLayout.FM_GRID_CURRENT_A, view.gridCurrentAA, view.gridCurrentBA, view.gridCurrentCA);
            putF(b, o + FrameLayout.FM_STATOR_VOLTAGE_A, view.statorVoltageAV, view.statorVoltageBV, view.statorVoltageCV);
            putF(b, o + FrameLayout.FM_STATOR_CURRENT_A, view.statorCurrentAA, view.statorCurrentBA, view.statorCurrentCA);
            b.putFloat(o + FrameLayout.FM_DC_LINK_VOLTAGE, (float) view.dcLinkVoltageV);
            b.putFloat(o + FrameLayout.FM_ROTOR_ANGLE, (float) view.rotorAngleRad);
            b.putFloat(o + FrameLayout.FM_ROTOR_SPEED, (float) view.rotorSpeedRadPerS);
            b.putFloat(o + FrameLayout.FM_WIND_SPEED, (float) view.windSpeedMPerS);
            b.putFloat(o + FrameLayout.FM_PITCH_ANGLE, (float) view.pitchAngleRad);
            b.putFloat(o + FrameLayout.FM_GRID_VOLTAGE_D, (float) view.gridVoltageDV);
            b.putFloat(o + FrameLayout.FM_GRID_VOLTAGE_D + 4, (float) view.gridVoltageQV);
            b.putFloat(o + FrameLayout.FM_GRID_CURRENT_D, (float) view.gridCurrentDA);
            b.putFloat(o + FrameLayout.FM_GRID_CURRENT_D + 4, (float) view.gridCurrentQA);
            b.putFloat(o + FrameLayout.FM_STATOR_CURRENT_D, (float) view.statorCurrentDA);
            b.putFloat(o + FrameLayout.FM_STATOR_CURRENT_D + 4, (float) view.statorCurrentQA);
            b.putFloat(o + FrameLayout.FM_STATOR_VOLTAGE_D, (float) view.statorVoltageDV);
            b.putFloat(o + FrameLayout.FM_STATOR_VOLTAGE_D + 4, (float) view.statorVoltageQV);
            b.putFloat(o + FrameLayout.FM_VOLTAGE_DEVIATION_REF, (float) view.voltageDeviationRefPu);
            b.putInt(o + FrameLayout.FM_CRC, crc.of(b, o, FrameLayout.FM_CRC));
            return FrameLayout.FULL_MEASUREMENT_LENGTH;
        }
        b.put(o + FrameLayout.OFFSET_KIND, (byte) FrameLayout.KIND_MEASUREMENT_COMPACT);
        b.putInt(o + FrameLayout.CM_PLANT_TIME_US, (int) (view.plantTimeNs / 1000L));
        b.putShort(o + FrameLayout.CM_STATUS_FLAGS, (short) view.statusFlags);
        final double lv = FrameLayout.LSB_PHASE_VOLTAGE_V;
        final double li = FrameLayout.LSB_PHASE_CURRENT_A;
        putS(b, o + FrameLayout.CM_GRID_VOLTAGE_A, view.gridVoltageAV, view.gridVoltageBV, view.gridVoltageCV, lv);
        putS(b, o + FrameLayout.CM_GRID_CURRENT_A, view.gridCurrentAA, view.gridCurrentBA, view.gridCurrentCA, li);
        putS(b, o + FrameLayout.CM_STATOR_VOLTAGE_A, view.statorVoltageAV, view.statorVoltageBV, view.statorVoltageCV, lv);
        putS(b, o + FrameLayout.CM_STATOR_CURRENT_A, view.statorCurrentAA, view.statorCurrentBA, view.statorCurrentCA, li);
        b.putShort(o + FrameLayout.CM_DC_LINK_VOLTAGE, Scaled.toUint16(view.dcLinkVoltageV, FrameLayout.LSB_DC_LINK_VOLTAGE_V));
        b.putShort(o + FrameLayout.CM_ROTOR_ANGLE, Scaled.angleToUint16(view.rotorAngleRad));
        b.putShort(o + FrameLayout.CM_ROTOR_SPEED, Scaled.toInt16(view.rotorSpeedRadPerS, FrameLayout.LSB_ROTOR_SPEED_RAD_PER_S));
        b.putShort(o + FrameLayout.CM_WIND_SPEED, Scaled.toUint16(view.windSpeedMPerS, FrameLayout.LSB_WIND_SPEED_M_PER_S));
        b.putShort(o + FrameLayout.CM_PITCH_ANGLE, Scaled.toInt16(view.pitchAngleRad, FrameLayout.LSB_PITCH_RAD));
        b.putShort(o + FrameLayout.CM_VOLTAGE_DEVIATION_REF,
                Scaled.toInt16(view.voltageDeviationRefPu, FrameLayout.LSB_VOLTAGE_DEVIATION_PU));
        b.putInt(o + FrameLayout.CM_CRC, crc.of(b, o, FrameLayout.CM_CRC));
        return FrameLayout.COMPACT_MEASUREMENT_LENGTH;
    }

    /**
     * Checks and decodes a frame of {@code length} bytes (either profile) into {@code out}.
     * Returns {@link FrameStatus#OK} (out written; for COMPACT the dq fields are set to NaN
     * and the plant time is the wrapped microsecond count times 1000), or
     * {@link FrameStatus#CRC_ERROR} / {@link FrameStatus#MALFORMED} with {@code out} untouched.
     */
    public int decode(int length, SensorView out) {
        final ByteBuffer b = buffer;
        final int o = offset;
        final int kind = FrameChecks.checkFrame(crc, b, o, length);
        if (kind < 0) {
            return -kind;
        }
        if (kind == FrameLayout.KIND_MEASUREMENT_FULL) {
            out.plantTimeNs = b.getLong(o + FrameLayout.FM_PLANT_TIME_NS);
            out.statusFlags = b.getInt(o + FrameLayout.FM_STATUS_FLAGS);
            out.gridVoltageAV = b.getFloat(o + FrameLayout.FM_GRID_VOLTAGE_A);
            out.gridVoltageBV = b.getFloat(o + FrameLayout.FM_GRID_VOLTAGE_A + 4);
            out.gridVoltageCV = b.getFloat(o + FrameLayout.FM_GRID_VOLTAGE_A + 8);
            out.gridCurrentAA = b.getFloat(o + FrameLayout.FM_GRID_CURRENT_A);
            out.gridCurrentBA = b.getFloat(o + FrameLayout.FM_GRID_CURRENT_A + 4);
            out.gridCurrentCA = b.getFloat(o + FrameLayout.FM_GRID_CURRENT_A + 8);
            out.statorVoltageAV = b.getFloat(o + FrameLayout.FM_STATOR_VOLTAGE_A);
            out.statorVoltageBV = b.getFloat(o + FrameLayout.FM_STATOR_VOLTAGE_A + 4);
            out.statorVoltageCV = b.getFloat(o + FrameLayout.FM_STATOR_VOLTAGE_A + 8);
            out.statorCurrentAA = b.getFloat(o + FrameLayout.FM_STATOR_CURRENT_A);
            out.statorCurrentBA = b.getFloat(o + FrameLayout.FM_STATOR_CURRENT_A + 4);
            out.statorCurrentCA = b.getFloat(o + FrameLayout.FM_STATOR_CURRENT_A + 8);
            out.dcLinkVoltageV = b.getFloat(o + FrameLayout.FM_DC_LINK_VOLTAGE);
            out.rotorAngleRad = b.getFloat(o + FrameLayout.FM_ROTOR_ANGLE);
            out.rotorSpeedRadPerS = b.getFloat(o + FrameLayout.FM_ROTOR_SPEED);
            out.windSpeedMPerS = b.getFloat(o + FrameLayout.FM_WIND_SPEED);
            out.pitchAngleRad = b.getFloat(o + FrameLayout.FM_PITCH_ANGLE);
            out.gridVoltageDV = b.getFloat(o + FrameLayout.FM_GRID_VOLTAGE_D);
            out.gridVoltageQV = b.getFloat(o + FrameLayout.FM_GRID_VOLTAGE_D + 4);
            out.gridCurrentDA = b.getFloat(o + FrameLayout.FM_GRID_CURRENT_D);
            out.gridCurrentQA = b.getFloat(o + FrameLayout.FM_GRID_CURRENT_D + 4);
            out.statorCurrentDA = b.getFloat(o + FrameLayout.FM_STATOR_CURRENT_D);
            out.statorCurrentQA = b.getFloat(o + FrameLayout.FM_STATOR_CURRENT_D + 4);
            out.statorVoltageDV = b.getFloat(o + FrameLayout.FM_STATOR_VOLTAGE_D);
            out.statorVoltageQV = b.getFloat(o + FrameLayout.FM_STATOR_VOLTAGE_D + 4);
            out.voltageDeviationRefPu = b.getFloat(o + FrameLayout.FM_VOLTAGE_DEVIATION_REF);
            return FrameStatus.OK;
        }
        if (kind == FrameLayout.KIND_MEASUREMENT_COMPACT) {
            final double lv = FrameLayout.LSB_PHASE_VOLTAGE_V;
            final double li = FrameLayout.LSB_PHASE_CURRENT_A;
            out.plantTimeNs = (b.getInt(o + FrameLayout.CM_PLANT_TIME_US) & 0xFFFFFFFFL) * 1000L;
            out.statusFlags = b.getShort(o + FrameLayout.CM_STATUS_FLAGS) & 0xFFFF;
            out.gridVoltageAV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_VOLTAGE_A), lv);
            out.gridVoltageBV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_VOLTAGE_A + 2), lv);
            out.gridVoltageCV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_VOLTAGE_A + 4), lv);
            out.gridCurrentAA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_CURRENT_A), li);
            out.gridCurrentBA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_CURRENT_A + 2), li);
            out.gridCurrentCA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_GRID_CURRENT_A + 4), li);
            out.statorVoltageAV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_VOLTAGE_A), lv);
            out.statorVoltageBV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_VOLTAGE_A + 2), lv);
            out.statorVoltageCV = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_VOLTAGE_A + 4), lv);
            out.statorCurrentAA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_CURRENT_A), li);
            out.statorCurrentBA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_CURRENT_A + 2), li);
            out.statorCurrentCA = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_STATOR_CURRENT_A + 4), li);
            out.dcLinkVoltageV = Scaled.fromUint16(b.getShort(o + FrameLayout.CM_DC_LINK_VOLTAGE), FrameLayout.LSB_DC_LINK_VOLTAGE_V);
            out.rotorAngleRad = (b.getShort(o + FrameLayout.CM_ROTOR_ANGLE) & 0xFFFF) * FrameLayout.LSB_ROTOR_ANGLE_RAD;
            out.rotorSpeedRadPerS = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_ROTOR_SPEED), FrameLayout.LSB_ROTOR_SPEED_RAD_PER_S);
            out.windSpeedMPerS = Scaled.fromUint16(b.getShort(o + FrameLayout.CM_WIND_SPEED), FrameLayout.LSB_WIND_SPEED_M_PER_S);
            out.pitchAngleRad = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_PITCH_ANGLE), FrameLayout.LSB_PITCH_RAD);
            out.voltageDeviationRefPu = Scaled.fromInt16(b.getShort(o + FrameLayout.CM_VOLTAGE_DEVIATION_REF),
                    FrameLayout.LSB_VOLTAGE_DEVIATION_PU);
            out.gridVoltageDV = out.gridVoltageQV = Double.NaN;
            out.gridCurrentDA = out.gridCurrentQA = Double.NaN;
            out.statorCurrentDA = out.statorCurrentQA = Double.NaN;
            out.statorVoltageDV = out.statorVoltageQV = Double.NaN;
            return FrameStatus.OK;
        }
        return FrameStatus.MALFORMED;
    }

    /** The frame's 32-bit sequence number as an unsigned value (valid after a successful {@link #decode}). */
    public long sequence() {
        return buffer.getInt(offset + FrameLayout.OFFSET_SEQUENCE) & 0xFFFFFFFFL;
    }

    /** Profile of the wrapped frame by its kind byte, or null if the kind is not a measurement kind. */
    public WireProfile profile() {
        final int kind = buffer.get(offset + FrameLayout.OFFSET_KIND) & 0xFF;
        return kind == FrameLayout.KIND_MEASUREMENT_FULL ? WireProfile.FULL
                : kind == FrameLayout.KIND_MEASUREMENT_COMPACT ? WireProfile.COMPACT : null;
    }

    private static void putF(ByteBuffer b, int at, double a, double bb, double c) {
        b.putFloat(at, (float) a);
        b.putFloat(at + 4, (float) bb);
        b.putFloat(at + 8, (float) c);
    }

    private static void putS(ByteBuffer b, int at, double a, double bb, double c, double lsb) {
        b.putShort(at, Scaled.toInt16(a, lsb));
        b.putShort(at + 2, Scaled.toInt16(bb, lsb));
        b.putShort(at + 4, Scaled.toInt16(c, lsb));
    }
}
