package dev.galebench.wire;

/**
 * Byte layout of wire version 1: one header, four frame kinds, one CRC. Little-endian,
 * fixed offsets, no padding, no optional fields. The frames are documented field by field
 * (with units and ranges) in {@code io-bridge/PROTOCOL.md}; this class is the single source
 * of the offsets the Java codec uses, and {@code board-kit/include/gb_wire.h} mirrors it.
 *
 * <pre>
 * Header (all kinds)
 *   0                   1                   2                   3
 *   0 1 2 3 4 5 6 7 8 9 0 1 2 3 4 5 6 7 8 9 0 1 2 3 4 5 6 7 8 9 0 1
 *  +---------------+---------------+---------------+---------------+
 *  | magic 'G' 0x47| magic 'B' 0x42| version = 1   | kind          |  0
 *  +---------------+---------------+---------------+---------------+
 *  | sequence (uint32): measurement seq, or the board's reply counter|  4
 *  +---------------------------------------------------------------+
 *  | payload (kind-specific) ...                                   |  8
 *  +---------------------------------------------------------------+
 *  | CRC-32C (uint32) of every byte before it                      |  len-4
 *  +---------------------------------------------------------------+
 *
 * kind 0x01  measurement, FULL (128 bytes)            kind 0x02  command, FULL (56 bytes)
 *   8  int64   plant time, ns                           8  uint32  answered sequence
 *  16  uint32  status and trip flags                   12  float32 MSC duty a, b, c (12,16,20)
 *  20  float32 grid voltage a, b, c, V (20,24,28)      24  float32 GSC duty a, b, c (24,28,32)
 *  32  float32 grid current a, b, c, A (32,36,40)      36  float32 chopper duty
 *  44  float32 stator voltage a, b, c, V (44,48,52)    40  float32 pitch reference, rad
 *  56  float32 stator current a, b, c, A (56,60,64)    44  uint32  command flags (CMD_*)
 *  68  float32 DC-link voltage, V                      48  uint32  board status (BOARD_*)
 *  72  float32 rotor angle, rad                        52  uint32  CRC-32C
 *  76  float32 rotor speed, rad/s
 *  80  float32 wind speed, m/s                       kind 0x12  command, COMPACT (36 bytes)
 *  84  float32 pitch angle, rad                         8  uint32  answered sequence
 *  88  float32 grid voltage d, q, V (88,92)            12  uint16  MSC duty a, b, c  (LSB 1/65534)
 *  96  float32 grid current d, q, A (96,100)           18  uint16  GSC duty a, b, c  (LSB 1/65534)
 * 104  float32 stator current d, q, A (104,108)        24  uint16  chopper duty      (LSB 1/65534)
 * 112  float32 stator voltage d, q, V (112,116)        26  int16   pitch reference   (LSB 1e-4 rad)
 * 120  float32 voltage-deviation reference, pu         28  uint16  command flags
 * 124  uint32  CRC-32C                                 30  uint16  board status
 *                                                      32  uint32  CRC-32C
 * kind 0x11  measurement, COMPACT (54 bytes)
 *   8  uint32  plant time, us modulo 2^32
 *  12  uint16  status and trip flags
 *  14  int16   grid voltage a, b, c     (LSB 0.1 V)    38  uint16  DC-link voltage  (LSB 0.1 V)
 *  20  int16   grid current a, b, c     (LSB 0.5 A)    40  uint16  rotor angle      (LSB 2 pi / 65536 rad)
 *  26  int16   stator voltage a, b, c   (LSB 0.1 V)    42  int16   rotor speed      (LSB 0.01 rad/s)
 *  32  int16   stator current a, b, c   (LSB 0.5 A)    44  uint16  wind speed       (LSB 0.01 m/s)
 *                                                      46  int16   pitch angle      (LSB 1e-4 rad)
 *                                                      48  int16   voltage-dev. ref (LSB 1e-4 pu)
 *                                                      50  uint32  CRC-32C
 * </pre>
 *
 * <p>Compact values: {@code value = raw * LSB}. int16 raw -32768 and uint16 raw 0xFFFF mean
 * "not a number" (the sender had NaN); encoders saturate out-of-range values at the largest
 * representable raw (int16 +/-32767, uint16 0..65534, rotor angle wraps).
 */
public final class FrameLayout {
    private FrameLayout() {
    }

    /** First magic byte, ASCII 'G'. */
    public static final int MAGIC_0 = 0x47;
    /** Second magic byte, ASCII 'B'. */
    public static final int MAGIC_1 = 0x42;
    /** Wire version this codec writes and accepts. */
    public static final int VERSION = 1;

    /** Kind: measurement frame, FULL profile. */
    public static final int KIND_MEASUREMENT_FULL = 0x01;
    /** Kind: command frame, FULL profile. */
    public static final int KIND_COMMAND_FULL = 0x02;
    /** Kind: measurement frame, COMPACT profile. */
    public static final int KIND_MEASUREMENT_COMPACT = 0x11;
    /** Kind: command frame, COMPACT profile. */
    public static final int KIND_COMMAND_COMPACT = 0x12;

    public static final int OFFSET_MAGIC = 0;
    public static final int OFFSET_VERSION = 2;
    public static final int OFFSET_KIND = 3;
    public static final int OFFSET_SEQUENCE = 4;
    public static final int HEADER_LENGTH = 8;
    public static final int CRC_LENGTH = 4;

    // ---- measurement, FULL ----
    public static final int FM_PLANT_TIME_NS = 8;
    public static final int FM_STATUS_FLAGS = 16;
    public static final int FM_GRID_VOLTAGE_A = 20;
    public static final int FM_GRID_CURRENT_A = 32;
    public static final int FM_STATOR_VOLTAGE_A = 44;
    public static final int FM_STATOR_CURRENT_A = 56;
    public static final int FM_DC_LINK_VOLTAGE = 68;
    public static final int FM_ROTOR_ANGLE = 72;
    public static final int FM_ROTOR_SPEED = 76;
    public static final int FM_WIND_SPEED = 80;
    public static final int FM_PITCH_ANGLE = 84;
    public static final int FM_GRID_VOLTAGE_D = 88;
    public static final int FM_GRID_CURRENT_D = 96;
    public static final int FM_STATOR_CURRENT_D = 104;
    public static final int FM_STATOR_VOLTAGE_D = 112;
    public static final int FM_VOLTAGE_DEVIATION_REF = 120;
    public static final int FM_CRC = 124;
    public static final int FULL_MEASUREMENT_LENGTH = 128;

    // ---- command, FULL ----
    public static final int FC_ANSWERED_SEQUENCE = 8;
    public static final int FC_MSC_DUTY_A = 12;
    public static final int FC_GSC_DUTY_A = 24;
    public static final int FC_CHOPPER_DUTY = 36;
    public static final int FC_PITCH_REF = 40;
    public static final int FC_COMMAND_FLAGS = 44;
    public static final int FC_BOARD_STATUS = 48;
    public static final int FC_CRC = 52;
    public static final int FULL_COMMAND_LENGTH = 56;

    // ---- measurement, COMPACT ----
    public static final int CM_PLANT_TIME_US = 8;
    public static final int CM_STATUS_FLAGS = 12;
    public static final int CM_GRID_VOLTAGE_A = 14;
    public static final int CM_GRID_CURRENT_A = 20;
    public static final int CM_STATOR_VOLTAGE_A = 26;
    public static final int CM_STATOR_CURRENT_A = 32;
    public static final int CM_DC_LINK_VOLTAGE = 38;
    public static final int CM_ROTOR_ANGLE = 40;
    public static final int CM_ROTOR_SPEED = 42;
    public static final int CM_WIND_SPEED = 44;
    public static final int CM_PITCH_ANGLE = 46;
    public static final int CM_VOLTAGE_DEVIATION_REF = 48;
    public static final int CM_CRC = 50;
    public static final int COMPACT_MEASUREMENT_LENGTH = 54;

    // ---- command, COMPACT ----
    public static final int CC_ANSWERED_SEQUENCE = 8;
    public static final int CC_MSC_DUTY_A = 12;
    public static final int CC_GSC_DUTY_A = 18;
    public static final int CC_CHOPPER_DUTY = 24;
    public static final int CC_PITCH_REF = 26;
    public static final int CC_COMMAND_FLAGS = 28;
    public static final int CC_BOARD_STATUS = 30;
    public static final int CC_CRC = 32;
    public static final int COMPACT_COMMAND_LENGTH = 36;

    /** Longest frame of any kind, bytes. */
    public static final int MAX_FRAME_LENGTH = FULL_MEASUREMENT_LENGTH;

    // ---- COMPACT scales (value = raw * LSB) ----
    /** Phase voltage LSB, V (range +/-3276.7 V). */
    public static final double LSB_PHASE_VOLTAGE_V = 0.1;
    /** Phase current LSB, A (range +/-16383.5 A). */
    public static final double LSB_PHASE_CURRENT_A = 0.5;
    /** DC-link voltage LSB, V (uint16, range 0..6553.4 V). */
    public static final double LSB_DC_LINK_VOLTAGE_V = 0.1;
    /** Rotor angle LSB, rad (uint16, full turn = 65536). */
    public static final double LSB_ROTOR_ANGLE_RAD = 2.0 * Math.PI / 65536.0;
    /** Rotor speed LSB, rad/s (range +/-327.67 rad/s). */
    public static final double LSB_ROTOR_SPEED_RAD_PER_S = 0.01;
    /** Wind speed LSB, m/s (uint16, range 0..655.34 m/s). */
    public static final double LSB_WIND_SPEED_M_PER_S = 0.01;
    /** Pitch angle and pitch reference LSB, rad (range +/-3.2767 rad). */
    public static final double LSB_PITCH_RAD = 1e-4;
    /** Voltage-deviation reference LSB, pu (range +/-3.2767 pu). */
    public static final double LSB_VOLTAGE_DEVIATION_PU = 1e-4;
    /** Duty LSB (uint16, 65534 = duty 1, 32767 = duty 0.5 exactly). */
    public static final double LSB_DUTY = 1.0 / 65534.0;
    /** Full scale of a duty, raw. */
    public static final int DUTY_FULL_SCALE_RAW = 65534;

    /** int16 raw value meaning "not a number". */
    public static final int INT16_NAN = -32768;
    /** uint16 raw value meaning "not a number". */
    public static final int UINT16_NAN = 0xFFFF;

    // ---- validation of commands (both profiles) ----
    /** Largest accepted |pitch reference|, rad (the plant clamps further to its own limits). */
    public static final double PITCH_REF_LIMIT_RAD = 1.6;
    /** Command flag bits defined in version 1; any other bit set makes a command invalid. */
    public static final int COMMAND_FLAGS_MASK = 0x0F;
}
