package dev.galebench.wire;

/** Conversions between values and the COMPACT profile's scaled 16-bit raws (see {@link FrameLayout}). */
final class Scaled {
    private Scaled() {
    }

    /** Signed 16-bit raw of {@code value / lsb}, saturated at +/-32767; NaN becomes {@link FrameLayout#INT16_NAN}. */
    static short toInt16(double value, double lsb) {
        if (value != value) {
            return (short) FrameLayout.INT16_NAN;
        }
        final double r = Math.rint(value / lsb);
        if (r > 32767.0) {
            return 32767;
        }
        if (r < -32767.0) {
            return -32767;
        }
        return (short) r;
    }

    /** Unsigned 16-bit raw of {@code value / lsb}, saturated at 0..65534; NaN becomes {@link FrameLayout#UINT16_NAN}. */
    static short toUint16(double value, double lsb) {
        if (value != value) {
            return (short) FrameLayout.UINT16_NAN;
        }
        final double r = Math.rint(value / lsb);
        if (r > 65534.0) {
            return (short) 65534;
        }
        if (r < 0.0) {
            return 0;
        }
        return (short) (int) r;
    }

    static double fromInt16(short raw, double lsb) {
        return raw == (short) FrameLayout.INT16_NAN ? Double.NaN : raw * lsb;
    }

    static double fromUint16(short raw, double lsb) {
        final int u = raw & 0xFFFF;
        return u == FrameLayout.UINT16_NAN ? Double.NaN : u * lsb;
    }

    /** Rotor angle to raw: wrapped into one turn, 65536 raw per turn. */
    static short angleToUint16(double angleRad) {
        if (angleRad != angleRad || Double.isInfinite(angleRad)) {
            return 0;
        }
        final double turns = angleRad / (2.0 * Math.PI);
        final double frac = turns - Math.floor(turns);
        return (short) (((long) Math.rint(frac * 65536.0)) & 0xFFFF);
    }
}
