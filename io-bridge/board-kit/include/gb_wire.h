/*
 * galebench wire protocol, version 1: frame encode/decode, CRC-32C, COBS.
 *
 * C99, no heap, no global state except a const CRC table, portable byte order (every
 * multi-byte field is assembled byte by byte, so the code runs on big-endian MCUs too).
 * The byte layout is specified in io-bridge/PROTOCOL.md; the Java codec
 * (dev.galebench.wire.FrameLayout) and this file are tested against each other byte for byte.
 *
 * A board typically calls, per received frame:
 *   gb_decode_measurement() -> its control step -> gb_encode_command()
 * and, on a serial line, gb_deframer_push() per received byte and gb_cobs_encode() before
 * sending (followed by one 0x00 byte).
 */
#ifndef GB_WIRE_H
#define GB_WIRE_H

#include <stddef.h>
#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

#define GB_WIRE_VERSION 1u
#define GB_MAGIC0 0x47u /* 'G' */
#define GB_MAGIC1 0x42u /* 'B' */

#define GB_KIND_MEASUREMENT_FULL 0x01u
#define GB_KIND_COMMAND_FULL 0x02u
#define GB_KIND_MEASUREMENT_COMPACT 0x11u
#define GB_KIND_COMMAND_COMPACT 0x12u

#define GB_FULL_MEASUREMENT_LENGTH 128u
#define GB_FULL_COMMAND_LENGTH 56u
#define GB_COMPACT_MEASUREMENT_LENGTH 54u
#define GB_COMPACT_COMMAND_LENGTH 36u
#define GB_MAX_FRAME_LENGTH 128u
/* COBS-encoded size of the longest frame, without the 0x00 delimiter */
#define GB_MAX_ENCODED_LENGTH (GB_MAX_FRAME_LENGTH + GB_MAX_FRAME_LENGTH / 254u + 1u)

/* status and trip flags of a measurement (SensorView.STATUS_* / TRIP_*) */
#define GB_STATUS_BREAKER_CLOSED 0x0001u
#define GB_STATUS_MSC_BLOCKED 0x0002u
#define GB_STATUS_GSC_BLOCKED 0x0004u
#define GB_STATUS_CHOPPER_ON 0x0008u
#define GB_TRIP_DC_OVERVOLTAGE 0x0100u
#define GB_TRIP_MSC_OVERCURRENT 0x0200u
#define GB_TRIP_GSC_OVERCURRENT 0x0400u
#define GB_TRIP_LINK_WATCHDOG 0x0800u
#define GB_TRIP_OVERSPEED 0x1000u

/* command flags (BoardCommand.CMD_*) */
#define GB_CMD_MSC_ENABLE 0x1u
#define GB_CMD_GSC_ENABLE 0x2u
#define GB_CMD_BREAKER_CLOSE 0x4u
#define GB_CMD_TRIP_RESET 0x8u
#define GB_COMMAND_FLAGS_MASK 0xFu

/* board status bits (BoardCommand.BOARD_*) */
#define GB_BOARD_RUNNING 0x01u
#define GB_BOARD_FRT_ACTIVE 0x02u
#define GB_BOARD_TRIPPED 0x04u
#define GB_BOARD_PITCH_ACTIVE 0x08u
#define GB_BOARD_CHOPPER_ON 0x10u
#define GB_BOARD_PLL_LOCKED 0x20u

/* largest accepted |pitch reference|, rad */
#define GB_PITCH_REF_LIMIT_RAD 1.6

typedef enum { GB_PROFILE_FULL = 0, GB_PROFILE_COMPACT = 1 } gb_profile;

/* decode results (same codes as dev.galebench.wire.FrameStatus) */
typedef enum {
    GB_OK = 0,
    GB_CRC_ERROR = 1,
    GB_MALFORMED = 2,
    GB_INVALID_REFERENCE = 3
} gb_status;

/* plant -> board; SI units; COMPACT leaves the dq fields NaN */
typedef struct {
    int64_t plant_time_ns;
    uint32_t status_flags;
    float grid_voltage_v[3];
    float grid_current_a[3];
    float stator_voltage_v[3];
    float stator_current_a[3];
    float dc_link_voltage_v;
    float rotor_angle_rad;
    float rotor_speed_rad_s;
    float wind_speed_m_s;
    float pitch_angle_rad;
    float grid_voltage_dq_v[2];
    float grid_current_dq_a[2];
    float stator_current_dq_a[2];
    float stator_voltage_dq_v[2];
    float voltage_deviation_ref_pu;
} gb_measurement;

/* board -> plant */
typedef struct {
    uint32_t answered_sequence; /* copy of the measurement's sequence field */
    float msc_duty[3];          /* 0..1 */
    float gsc_duty[3];          /* 0..1 */
    float chopper_duty;         /* 0..1 */
    float pitch_ref_rad;        /* |x| <= 1.6 */
    uint32_t command_flags;     /* GB_CMD_* */
    uint32_t board_status;      /* GB_BOARD_* */
} gb_command;

/* CRC-32C (Castagnoli, CRC-32/ISCSI): check value of "123456789" is 0xE3069283 */
uint32_t gb_crc32c(const uint8_t *data, size_t length);

/* Frame length of a profile's measurement / command frame. */
size_t gb_measurement_length(gb_profile profile);
size_t gb_command_length(gb_profile profile);

/*
 * Encoders write a complete frame (header, payload, CRC) into buf, which must hold
 * gb_*_length(profile) bytes, and return its length. COMPACT saturates out-of-range values
 * and writes the NaN raw for NaN, exactly as the Java encoder.
 */
size_t gb_encode_measurement(gb_profile profile, uint32_t sequence, const gb_measurement *m, uint8_t *buf);
size_t gb_encode_command(gb_profile profile, uint32_t reply_sequence, const gb_command *c, uint8_t *buf);

/*
 * Decoders check length, CRC, magic, version and kind (in that order), then decode.
 * On GB_OK *out, *sequence and *profile are written; otherwise nothing is written.
 * gb_decode_command also validates the references (duties, chopper, pitch, flags) and
 * returns GB_INVALID_REFERENCE if one is NaN or out of range.
 */
gb_status gb_decode_measurement(const uint8_t *buf, size_t length, uint32_t *sequence, gb_profile *profile,
                                gb_measurement *out);
gb_status gb_decode_command(const uint8_t *buf, size_t length, uint32_t *reply_sequence, gb_profile *profile,
                            gb_command *out);

/* COBS: encode length bytes into dst (GB_MAX_ENCODED_LENGTH for a frame); returns the encoded
 * length, without delimiter. Decode returns the decoded length or -1 if the block is invalid
 * or does not fit in capacity. */
size_t gb_cobs_encode(const uint8_t *src, size_t length, uint8_t *dst);
int gb_cobs_decode(const uint8_t *src, size_t length, uint8_t *dst, size_t capacity);

/* Byte-at-a-time serial deframer (e.g. from a UART receive interrupt). */
typedef struct {
    uint8_t block[GB_MAX_ENCODED_LENGTH];
    size_t length;
    int overlong;
} gb_deframer;

void gb_deframer_init(gb_deframer *d);

/*
 * Feeds one received byte. Returns the decoded frame length (> 0) written to frame when the
 * byte was a delimiter ending a valid COBS block, 0 when no frame is complete (or an empty
 * frame was skipped), -1 once per malformed block (bad COBS or too long without delimiter).
 */
int gb_deframer_push(gb_deframer *d, uint8_t byte, uint8_t *frame, size_t capacity);

#ifdef __cplusplus
}
#endif

#endif /* GB_WIRE_H */
