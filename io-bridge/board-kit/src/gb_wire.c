/*
 * galebench wire protocol, version 1 (see gb_wire.h and io-bridge/PROTOCOL.md).
 * C99, no heap. Link with -lm (rint, floor).
 */
#include "gb_wire.h"

#include <math.h>
#include <string.h>

/* ---- offsets (mirror dev.galebench.wire.FrameLayout) ---- */
#define OFF_SEQUENCE 4u
#define HEADER_LENGTH 8u

#define FM_PLANT_TIME_NS 8u
#define FM_STATUS_FLAGS 16u
#define FM_GRID_VOLTAGE_A 20u
#define FM_GRID_CURRENT_A 32u
#define FM_STATOR_VOLTAGE_A 44u
#define FM_STATOR_CURRENT_A 56u
#define FM_DC_LINK_VOLTAGE 68u
#define FM_ROTOR_ANGLE 72u
#define FM_ROTOR_SPEED 76u
#define FM_WIND_SPEED 80u
#define FM_PITCH_ANGLE 84u
#define FM_GRID_VOLTAGE_D 88u
#define FM_GRID_CURRENT_D 96u
#define FM_STATOR_CURRENT_D 104u
#define FM_STATOR_VOLTAGE_D 112u
#define FM_VOLTAGE_DEVIATION_REF 120u

#define FC_ANSWERED_SEQUENCE 8u
#define FC_MSC_DUTY_A 12u
#define FC_GSC_DUTY_A 24u
#define FC_CHOPPER_DUTY 36u
#define FC_PITCH_REF 40u
#define FC_COMMAND_FLAGS 44u
#define FC_BOARD_STATUS 48u

#define CM_PLANT_TIME_US 8u
#define CM_STATUS_FLAGS 12u
#define CM_GRID_VOLTAGE_A 14u
#define CM_GRID_CURRENT_A 20u
#define CM_STATOR_VOLTAGE_A 26u
#define CM_STATOR_CURRENT_A 32u
#define CM_DC_LINK_VOLTAGE 38u
#define CM_ROTOR_ANGLE 40u
#define CM_ROTOR_SPEED 42u
#define CM_WIND_SPEED 44u
#define CM_PITCH_ANGLE 46u
#define CM_VOLTAGE_DEVIATION_REF 48u

#define CC_ANSWERED_SEQUENCE 8u
#define CC_MSC_DUTY_A 12u
#define CC_GSC_DUTY_A 18u
#define CC_CHOPPER_DUTY 24u
#define CC_PITCH_REF 26u
#define CC_COMMAND_FLAGS 28u
#define CC_BOARD_STATUS 30u

/* ---- COMPACT scales (value = raw * LSB), identical doubles to the Java constants ---- */
#define TWO_PI 6.2831853071795862
#define LSB_PHASE_VOLTAGE_V 0.1
#define LSB_PHASE_CURRENT_A 0.5
#define LSB_DC_LINK_VOLTAGE_V 0.1
#define LSB_ROTOR_ANGLE_RAD (TWO_PI / 65536.0)
#define LSB_ROTOR_SPEED_RAD_PER_S 0.01
#define LSB_WIND_SPEED_M_PER_S 0.01
#define LSB_PITCH_RAD 1e-4
#define LSB_VOLTAGE_DEVIATION_PU 1e-4
#define LSB_DUTY (1.0 / 65534.0)
#define INT16_NAN (-32768)
#define UINT16_NAN 0xFFFFu

/* ---- CRC-32C, reflected polynomial 0x82F63B78 ---- */
static const uint32_t crc_table[256] = {
    0x00000000u, 0xF26B8303u, 0xE13B70F7u, 0x1350F3F4u, 0xC79A971Fu, 0x35F1141Cu, 0x26A1E7E8u, 0xD4CA64EBu,
    0x8AD958CFu, 0x78B2DBCCu, 0x6BE22838u, 0x9989AB3Bu, 0x4D43CFD0u, 0xBF284CD3u, 0xAC78BF27u, 0x5E133C24u,
    0x105EC76Fu, 0xE235446Cu, 0xF165B798u, 0x030E349Bu, 0xD7C45070u, 0x25AFD373u, 0x36FF2087u, 0xC494A384u,
    0x9A879FA0u, 0x68EC1CA3u, 0x7BBCEF57u, 0x89D76C54u, 0x5D1D08BFu, 0xAF768BBCu, 0xBC267848u, 0x4E4DFB4Bu,
    0x20BD8EDEu, 0xD2D60DDDu, 0xC186FE29u, 0x33ED7D2Au, 0xE72719C1u, 0x154C9AC2u, 0x061C6936u, 0xF477EA35u,
    0xAA64D611u, 0x580F5512u, 0x4B5FA6E6u, 0xB93425E5u, 0x6DFE410Eu, 0x9F95C20Du, 0x8CC531F9u, 0x7EAEB2FAu,
    0x30E349B1u, 0xC288CAB2u, 0xD1D83946u, 0x23B3BA45u, 0xF779DEAEu, 0x05125DADu, 0x1642AE59u, 0xE4292D5Au,
    0xBA3A117Eu, 0x4851927Du, 0x5B016189u, 0xA96AE28Au, 0x7DA08661u, 0x8FCB0562u, 0x9C9BF696u, 0x6EF07595u,
    0x417B1DBCu, 0xB3109EBFu, 0xA0406D4Bu, 0x522BEE48u, 0x86E18AA3u, 0x748A09A0u, 0x67DAFA54u, 0x95B17957u,
    0xCBA24573u, 0x39C9C670u, 0x2A993584u, 0xD8F2B687u, 0x0C38D26Cu, 0xFE53516Fu, 0xED03A29Bu, 0x1F682198u,
    0x5125DAD3u, 0xA34E59D0u, 0xB01EAA24u, 0x42752927u, 0x96BF4DCCu, 0x64D4CECFu, 0x77843D3Bu, 0x85EFBE38u,
    0xDBFC821Cu, 0x2997011Fu, 0x3AC7F2EBu, 0xC8AC71E8u, 0x1C661503u, 0xEE0D9600u, 0xFD5D65F4u, 0x0F36E6F7u,
    0x61C69362u, 0x93AD1061u, 0x80FDE395u, 0x72966096u, 0xA65C047Du, 0x5437877Eu, 0x4767748Au, 0xB50CF789u,
    0xEB1FCBADu, 0x197448AEu, 0x0A24BB5Au, 0xF84F3859u, 0x2C855CB2u, 0xDEEEDFB1u, 0xCDBE2C45u, 0x3FD5AF46u,
    0x7198540Du, 0x83F3D70Eu, 0x90A324FAu, 0x62C8A7F9u, 0xB602C312u, 0x44694011u, 0x5739B3E5u, 0xA55230E6u,
    0xFB410CC2u, 0x092A8FC1u, 0x1A7A7C35u, 0xE811FF36u, 0x3CDB9BDDu, 0xCEB018DEu, 0xDDE0EB2Au, 0x2F8B6829u,
    0x82F63B78u, 0x709DB87Bu, 0x63CD4B8Fu, 0x91A6C88Cu, 0x456CAC67u, 0xB7072F64u, 0xA457DC90u, 0x563C5F93u,
    0x082F63B7u, 0xFA44E0B4u, 0xE9141340u, 0x1B7F9043u, 0xCFB5F4A8u, 0x3DDE77ABu, 0x2E8E845Fu, 0xDCE5075Cu,
    0x92A8FC17u, 0x60C37F14u, 0x73938CE0u, 0x81F80FE3u, 0x55326B08u, 0xA759E80Bu, 0xB4091BFFu, 0x466298FCu,
    0x1871A4D8u, 0xEA1A27DBu, 0xF94AD42Fu, 0x0B21572Cu, 0xDFEB33C7u, 0x2D80B0C4u, 0x3ED04330u, 0xCCBBC033u,
    0xA24BB5A6u, 0x502036A5u, 0x4370C551u, 0xB11B4652u, 0x65D122B9u, 0x97BAA1BAu, 0x84EA524Eu, 0x7681D14Du,
    0x2892ED69u, 0xDAF96E6Au, 0xC9A99D9Eu, 0x3BC21E9Du, 0xEF087A76u, 0x1D63F975u, 0x0E330A81u, 0xFC588982u,
    0xB21572C9u, 0x407EF1CAu, 0x532E023Eu, 0xA145813Du, 0x758FE5D6u, 0x87E466D5u, 0x94B49521u, 0x66DF1622u,
    0x38CC2A06u, 0xCAA7A905u, 0xD9F75AF1u, 0x2B9CD9F2u, 0xFF56BD19u, 0x0D3D3E1Au, 0x1E6DCDEEu, 0xEC064EEDu,
    0xC38D26C4u, 0x31E6A5C7u, 0x22B65633u, 0xD0DDD530u, 0x0417B1DBu, 0xF67C32D8u, 0xE52CC12Cu, 0x1747422Fu,
    0x49547E0Bu, 0xBB3FFD08u, 0xA86F0EFCu, 0x5A048DFFu, 0x8ECEE914u, 0x7CA56A17u, 0x6FF599E3u, 0x9D9E1AE0u,
    0xD3D3E1ABu, 0x21B862A8u, 0x32E8915Cu, 0xC083125Fu, 0x144976B4u, 0xE622F5B7u, 0xF5720643u, 0x07198540u,
    0x590AB964u, 0xAB613A67u, 0xB831C993u, 0x4A5A4A90u, 0x9E902E7Bu, 0x6CFBAD78u, 0x7FAB5E8Cu, 0x8DC0DD8Fu,
    0xE330A81Au, 0x115B2B19u, 0x020BD8EDu, 0xF0605BEEu, 0x24AA3F05u, 0xD6C1BC06u, 0xC5914FF2u, 0x37FACCF1u,
    0x69E9F0D5u, 0x9B8273D6u, 0x88D28022u, 0x7AB90321u, 0xAE7367CAu, 0x5C18E4C9u, 0x4F48173Du, 0xBD23943Eu,
    0xF36E6F75u, 0x0105EC76u, 0x12551F82u, 0xE03E9C81u, 0x34F4F86Au, 0xC69F7B69u, 0xD5CF889Du, 0x27A40B9Eu,
    0x79B737BAu, 0x8BDCB4B9u, 0x988C474Du, 0x6AE7C44Eu, 0xBE2DA0A5u, 0x4C4623A6u, 0x5F16D052u, 0xAD7D5351u};

uint32_t gb_crc32c(const uint8_t *data, size_t length) {
    uint32_t crc = 0xFFFFFFFFu;
    size_t i;
    for (i = 0; i < length; i++) {
        crc = (crc >> 8) ^ crc_table[(crc ^ data[i]) & 0xFFu];
    }
    return ~crc;
}

/* ---- little-endian access, byte by byte ---- */
static void put_u16(uint8_t *p, uint16_t v) {
    p[0] = (uint8_t)(v & 0xFFu);
    p[1] = (uint8_t)(v >> 8);
}

static void put_u32(uint8_t *p, uint32_t v) {
    p[0] = (uint8_t)(v & 0xFFu);
    p[1] = (uint8_t)((v >> 8) & 0xFFu);
    p[2] = (uint8_t)((v >> 16) & 0xFFu);
    p[3] = (uint8_t)(v >> 24);
}

static void put_u64(uint8_t *p, uint64_t v) {
    put_u32(p, (uint32_t)(v & 0xFFFFFFFFu));
    put_u32(p + 4, (uint32_t)(v >> 32));
}

static void put_f32(uint8_t *p, float f) {
    uint32_t u;
    memcpy(&u, &f, sizeof u);
    put_u32(p, u);
}

static uint16_t get_u16(const uint8_t *p) {
    return (uint16_t)(p[0] | ((uint16_t)p[1] << 8));
}

static uint32_t get_u32(const uint8_t *p) {
    return (uint32_t)p[0] | ((uint32_t)p[1] << 8) | ((uint32_t)p[2] << 16) | ((uint32_t)p[3] << 24);
}

static uint64_t get_u64(const uint8_t *p) {
    return (uint64_t)get_u32(p) | ((uint64_t)get_u32(p + 4) << 32);
}

static float get_f32(const uint8_t *p) {
    uint32_t u = get_u32(p);
    float f;
    memcpy(&f, &u, sizeof f);
    return f;
}

/* ---- COMPACT scaling, same rules as dev.galebench.wire.Scaled ---- */
static uint16_t to_int16(double value, double lsb) {
    double r;
    if (value != value) {
        return (uint16_t)0x8000u;
    }
    r = rint(value / lsb);
    if (r > 32767.0) {
        return 32767u;
    }
    if (r < -32767.0) {
        return (uint16_t)(int16_t)-32767;
    }
    return (uint16_t)(int16_t)r;
}

static uint16_t to_uint16(double value, double lsb) {
    double r;
    if (value != value) {
        return (uint16_t)UINT16_NAN;
    }
    r = rint(value / lsb);
    if (r > 65534.0) {
        return 65534u;
    }
    if (r < 0.0) {
        return 0u;
    }
    return (uint16_t)r;
}

static uint16_t angle_to_uint16(double angle) {
    double turns;
    double frac;
    if (angle != angle || angle > 1e300 || angle < -1e300) {
        return 0u;
    }
    turns = angle / TWO_PI;
    frac = turns - floor(turns);
    return (uint16_t)(((int64_t)rint(frac * 65536.0)) & 0xFFFF);
}

static double from_int16(uint16_t raw, double lsb) {
    int16_t s = (int16_t)raw;
    return s == INT16_NAN ? (double)NAN : (double)s * lsb;
}

static double from_uint16(uint16_t raw, double lsb) {
    return raw == UINT16_NAN ? (double)NAN : (double)raw * lsb;
}

size_t gb_measurement_length(gb_profile profile) {
    return profile == GB_PROFILE_FULL ? GB_FULL_MEASUREMENT_LENGTH : GB_COMPACT_MEASUREMENT_LENGTH;
}

size_t gb_command_length(gb_profile profile) {
    return profile == GB_PROFILE_FULL ? GB_FULL_COMMAND_LENGTH : GB_COMPACT_COMMAND_LENGTH;
}

static void put_header(uint8_t *buf, uint8_t kind, uint32_t sequence) {
    buf[0] = (uint8_t)GB_MAGIC0;
    buf[1] = (uint8_t)GB_MAGIC1;
    buf[2] = (uint8_t)GB_WIRE_VERSION;
    buf[3] = kind;
    put_u32(buf + OFF_SEQUENCE, sequence);
}

static void put_f32x3(uint8_t *p, const float *v) {
    put_f32(p, v[0]);
    put_f32(p + 4, v[1]);
    put_f32(p + 8, v[2]);
}

static void put_s16x3(uint8_t *p, const float *v, double lsb) {
    put_u16(p, to_int16(v[0], lsb));
    put_u16(p + 2, to_int16(v[1], lsb));
    put_u16(p + 4, to_int16(v[2], lsb));
}

size_t gb_encode_measurement(gb_profile profile, uint32_t sequence, const gb_measurement *m, uint8_t *buf) {
    if (profile == GB_PROFILE_FULL) {
        put_header(buf, GB_KIND_MEASUREMENT_FULL, sequence);
        put_u64(buf + FM_PLANT_TIME_NS, (uint64_t)m->plant_time_ns);
        put_u32(buf + FM_STATUS_FLAGS, m->status_flags);
        put_f32x3(buf + FM_GRID_VOLTAGE_A, m->grid_voltage_v);
        put_f32x3(buf + FM_GRID_CURRENT_A, m->grid_current_a);
        put_f32x3(buf + FM_STATOR_VOLTAGE_A, m->stator_voltage_v);
        put_f32x3(buf + FM_STATOR_CURRENT_A, m->stator_current_a);
        put_f32(buf + FM_DC_LINK_VOLTAGE, m->dc_link_voltage_v);
        put_f32(buf + FM_ROTOR_ANGLE, m->rotor_angle_rad);
        put_f32(buf + FM_ROTOR_SPEED, m->rotor_speed_rad_s);
        put_f32(buf + FM_WIND_SPEED, m->wind_speed_m_s);
        put_f32(buf + FM_PITCH_ANGLE, m->pitch_angle_rad);
        put_f32(buf + FM_GRID_VOLTAGE_D, m->grid_voltage_dq_v[0]);
        put_f32(buf + FM_GRID_VOLTAGE_D + 4, m->grid_voltage_dq_v[1]);
        put_f32(buf + FM_GRID_CURRENT_D, m->grid_current_dq_a[0]);
        put_f32(buf + FM_GRID_CURRENT_D + 4, m->grid_current_dq_a[1]);
        put_f32(buf + FM_STATOR_CURRENT_D, m->stator_current_dq_a[0]);
        put_f32(buf + FM_STATOR_CURRENT_D + 4, m->stator_current_dq_a[1]);
        put_f32(buf + FM_STATOR_VOLTAGE_D, m->stator_voltage_dq_v[0]);
        put_f32(buf + FM_STATOR_VOLTAGE_D + 4, m->stator_voltage_dq_v[1]);
        put_f32(buf + FM_VOLTAGE_DEVIATION_REF, m->voltage_deviation_ref_pu);
        put_u32(buf + GB_FULL_MEASUREMENT_LENGTH - 4, gb_crc32c(buf, GB_FULL_MEASUREMENT_LENGTH - 4));
        return GB_FULL_MEASUREMENT_LENGTH;
    }
    put_header(buf, GB_KIND_MEASUREMENT_COMPACT, sequence);
    put_u32(buf + CM_PLANT_TIME_US, (uint32_t)(uint64_t)(m->plant_time_ns / 1000));
    put_u16(buf + CM_STATUS_FLAGS, (uint16_t)(m->status_flags & 0xFFFFu));
    put_s16x3(buf + CM_GRID_VOLTAGE_A, m->grid_voltage_v, LSB_PHASE_VOLTAGE_V);
    put_s16x3(buf + CM_GRID_CURRENT_A, m->grid_current_a, LSB_PHASE_CURRENT_A);
    put_s16x3(buf + CM_STATOR_VOLTAGE_A, m->stator_voltage_v, LSB_PHASE_VOLTAGE_V);
    put_s16x3(buf + CM_STATOR_CURRENT_A, m->stator_current_a, LSB_PHASE_CURRENT_A);
    put_u16(buf + CM_DC_LINK_VOLTAGE, to_uint16(m->dc_link_voltage_v, LSB_DC_LINK_VOLTAGE_V));
    put_u16(buf + CM_ROTOR_ANGLE, angle_to_uint16(m->rotor_angle_rad));
    put_u16(buf + CM_ROTOR_SPEED, to_int16(m->rotor_speed_rad_s, LSB_ROTOR_SPEED_RAD_PER_S));
    put_u16(buf + CM_WIND_SPEED, to_uint16(m->wind_speed_m_s, LSB_WIND_SPEED_M_PER_S));
    put_u16(buf + CM_PITCH_ANGLE, to_int16(m->pitch_angle_rad, LSB_PITCH_RAD));
    put_u16(buf + CM_VOLTAGE_DEVIATION_REF, to_int16(m->voltage_deviation_ref_pu, LSB_VOLTAGE_DEVIATION_PU));
    put_u32(buf + GB_COMPACT_MEASUREMENT_LENGTH - 4, gb_crc32c(buf, GB_COMPACT_MEASUREMENT_LENGTH - 4));
    return GB_COMPACT_MEASUREMENT_LENGTH;
}

size_t gb_encode_command(gb_profile profile, uint32_t reply_sequence, const gb_command *c, uint8_t *buf) {
    int i;
    if (profile == GB_PROFILE_FULL) {
        put_header(buf, GB_KIND_COMMAND_FULL, reply_sequence);
        put_u32(buf + FC_ANSWERED_SEQUENCE, c->answered_sequence);
        put_f32x3(buf + FC_MSC_DUTY_A, c->msc_duty);
        put_f32x3(buf + FC_GSC_DUTY_A, c->gsc_duty);
        put_f32(buf + FC_CHOPPER_DUTY, c->chopper_duty);
        put_f32(buf + FC_PITCH_REF, c->pitch_ref_rad);
        put_u32(buf + FC_COMMAND_FLAGS, c->command_flags);
        put_u32(buf + FC_BOARD_STATUS, c->board_status);
        put_u32(buf + GB_FULL_COMMAND_LENGTH - 4, gb_crc32c(buf, GB_FULL_COMMAND_LENGTH - 4));
        return GB_FULL_COMMAND_LENGTH;
    }
    put_header(buf, GB_KIND_COMMAND_COMPACT, reply_sequence);
    put_u32(buf + CC_ANSWERED_SEQUENCE, c->answered_sequence);
    for (i = 0; i < 3; i++) {
        put_u16(buf + CC_MSC_DUTY_A + 2 * i, to_uint16(c->msc_duty[i], LSB_DUTY));
        put_u16(buf + CC_GSC_DUTY_A + 2 * i, to_uint16(c->gsc_duty[i], LSB_DUTY));
    }
    put_u16(buf + CC_CHOPPER_DUTY, to_uint16(c->chopper_duty, LSB_DUTY));
    put_u16(buf + CC_PITCH_REF, to_int16(c->pitch_ref_rad, LSB_PITCH_RAD));
    put_u16(buf + CC_COMMAND_FLAGS, (uint16_t)(c->command_flags & 0xFFFFu));
    put_u16(buf + CC_BOARD_STATUS, (uint16_t)(c->board_status & 0xFFFFu));
    put_u32(buf + GB_COMPACT_COMMAND_LENGTH - 4, gb_crc32c(buf, GB_COMPACT_COMMAND_LENGTH - 4));
    return GB_COMPACT_COMMAND_LENGTH;
}

/* length, CRC, magic/version, kind/length: returns the kind or a negated status */
static int check_frame(const uint8_t *buf, size_t length) {
    size_t expected;
    unsigned kind;
    if (length != GB_FULL_MEASUREMENT_LENGTH && length != GB_FULL_COMMAND_LENGTH &&
        length != GB_COMPACT_MEASUREMENT_LENGTH && length != GB_COMPACT_COMMAND_LENGTH) {
        return -(int)GB_MALFORMED;
    }
    if (gb_crc32c(buf, length - 4) != get_u32(buf + length - 4)) {
        return -(int)GB_CRC_ERROR;
    }
    if (buf[0] != GB_MAGIC0 || buf[1] != GB_MAGIC1 || buf[2] != GB_WIRE_VERSION) {
        return -(int)GB_MALFORMED;
    }
    kind = buf[3];
    switch (kind) {
    case GB_KIND_MEASUREMENT_FULL: expected = GB_FULL_MEASUREMENT_LENGTH; break;
    case GB_KIND_COMMAND_FULL: expected = GB_FULL_COMMAND_LENGTH; break;
    case GB_KIND_MEASUREMENT_COMPACT: expected = GB_COMPACT_MEASUREMENT_LENGTH; break;
    case GB_KIND_COMMAND_COMPACT: expected = GB_COMPACT_COMMAND_LENGTH; break;
    default: return -(int)GB_MALFORMED;
    }
    return expected == length ? (int)kind : -(int)GB_MALFORMED;
}

static void get_f32x3(const uint8_t *p, float *v) {
    v[0] = get_f32(p);
    v[1] = get_f32(p + 4);
    v[2] = get_f32(p + 8);
}

static void get_s16x3(const uint8_t *p, float *v, double lsb) {
    v[0] = (float)from_int16(get_u16(p), lsb);
    v[1] = (float)from_int16(get_u16(p + 2), lsb);
    v[2] = (float)from_int16(get_u16(p + 4), lsb);
}

gb_status gb_decode_measurement(const uint8_t *buf, size_t length, uint32_t *sequence, gb_profile *profile,
                                gb_measurement *out) {
    const int kind = check_frame(buf, length);
    if (kind < 0) {
        return (gb_status)(-kind);
    }
    if (kind == (int)GB_KIND_MEASUREMENT_FULL) {
        out->plant_time_ns = (int64_t)get_u64(buf + FM_PLANT_TIME_NS);
        out->status_flags = get_u32(buf + FM_STATUS_FLAGS);
        get_f32x3(buf + FM_GRID_VOLTAGE_A, out->grid_voltage_v);
        get_f32x3(buf + FM_GRID_CURRENT_A, out->grid_current_a);
        get_f32x3(buf + FM_STATOR_VOLTAGE_A, out->stator_voltage_v);
        get_f32x3(buf + FM_STATOR_CURRENT_A, out->stator_current_a);
        out->dc_link_voltage_v = get_f32(buf + FM_DC_LINK_VOLTAGE);
        out->rotor_angle_rad = get_f32(buf + FM_ROTOR_ANGLE);
        out->rotor_speed_rad_s = get_f32(buf + FM_ROTOR_SPEED);
        out->wind_speed_m_s = get_f32(buf + FM_WIND_SPEED);
        out->pitch_angle_rad = get_f32(buf + FM_PITCH_ANGLE);
        out->grid_voltage_dq_v[0] = get_f32(buf + FM_GRID_VOLTAGE_D);
        out->grid_voltage_dq_v[1] = get_f32(buf + FM_GRID_VOLTAGE_D + 4);
        out->grid_current_dq_a[0] = get_f32(buf + FM_GRID_CURRENT_D);
        out->grid_current_dq_a[1] = get_f32(buf + FM_GRID_CURRENT_D + 4);
        out->stator_current_dq_a[0] = get_f32(buf + FM_STATOR_CURRENT_D);
        out->stator_current_dq_a[1] = get_f32(buf + FM_STATOR_CURRENT_D + 4);
        out->stator_voltage_dq_v[0] = get_f32(buf + FM_STATOR_VOLTAGE_D);
        out->stator_voltage_dq_v[1] = get_f32(buf + FM_STATOR_VOLTAGE_D + 4);
        out->voltage_deviation_ref_pu = get_f32(buf + FM_VOLTAGE_DEVIATION_REF);
        *profile = GB_PROFILE_FULL;
    } else if (kind == (int)GB_KIND_MEASUREMENT_COMPACT) {
        out->plant_time_ns = (int64_t)get_u32(buf + CM_PLANT_TIME_US) * 1000;
        out->status_flags = get_u16(buf + CM_STATUS_FLAGS);
        get_s16x3(buf + CM_GRID_VOLTAGE_A, out->grid_voltage_v, LSB_PHASE_VOLTAGE_V);
        get_s16x3(buf + CM_GRID_CURRENT_A, out->grid_current_a, LSB_PHASE_CURRENT_A);
        get_s16x3(buf + CM_STATOR_VOLTAGE_A, out->stator_voltage_v, LSB_PHASE_VOLTAGE_V);
        get_s16x3(buf + CM_STATOR_CURRENT_A, out->stator_current_a, LSB_PHASE_CURRENT_A);
        out->dc_link_voltage_v = (float)from_uint16(get_u16(buf + CM_DC_LINK_VOLTAGE), LSB_DC_LINK_VOLTAGE_V);
        out->rotor_angle_rad = (float)((double)get_u16(buf + CM_ROTOR_ANGLE) * LSB_ROTOR_ANGLE_RAD);
        out->rotor_speed_rad_s = (float)from_int16(get_u16(buf + CM_ROTOR_SPEED), LSB_ROTOR_SPEED_RAD_PER_S);
        out->wind_speed_m_s = (float)from_uint16(get_u16(buf + CM_WIND_SPEED), LSB_WIND_SPEED_M_PER_S);
        out->pitch_angle_rad = (float)from_int16(get_u16(buf + CM_PITCH_ANGLE), LSB_PITCH_RAD);
        out->voltage_deviation_ref_pu =
            (float)from_int16(get_u16(buf + CM_VOLTAGE_DEVIATION_REF), LSB_VOLTAGE_DEVIATION_PU);
        out->grid_voltage_dq_v[0] = out->grid_voltage_dq_v[1] = NAN;
        out->grid_current_dq_a[0] = out->grid_current_dq_a[1] = NAN;
        out->stator_current_dq_a[0] = out->stator_current_dq_a[1] = NAN;
        out->stator_voltage_dq_v[0] = out->stator_voltage_dq_v[1] = NAN;
        *profile = GB_PROFILE_COMPACT;
    } else {
        return GB_MALFORMED;
    }
    *sequence = get_u32(buf + OFF_SEQUENCE);
    return GB_OK;
}

static int duty_ok(double d) {
    return d >= 0.0 && d <= 1.0;
}

gb_status gb_decode_command(const uint8_t *buf, size_t length, uint32_t *reply_sequence, gb_profile *profile,
                            gb_command *out) {
    const int kind = check_frame(buf, length);
    double duty[7];
    double pitch;
    uint32_t flags;
    uint32_t status;
    uint32_t answered;
    int i;
    if (kind < 0) {
        return (gb_status)(-kind);
    }
    if (kind == (int)GB_KIND_COMMAND_FULL) {
        answered = get_u32(buf + FC_ANSWERED_SEQUENCE);
        for (i = 0; i < 3; i++) {
            duty[i] = get_f32(buf + FC_MSC_DUTY_A + 4 * i);
            duty[3 + i] = get_f32(buf + FC_GSC_DUTY_A + 4 * i);
        }
        duty[6] = get_f32(buf + FC_CHOPPER_DUTY);
        pitch = get_f32(buf + FC_PITCH_REF);
        flags = get_u32(buf + FC_COMMAND_FLAGS);
        status = get_u32(buf + FC_BOARD_STATUS);
    } else if (kind == (int)GB_KIND_COMMAND_COMPACT) {
        answered = get_u32(buf + CC_ANSWERED_SEQUENCE);
        for (i = 0; i < 3; i++) {
            duty[i] = from_uint16(get_u16(buf + CC_MSC_DUTY_A + 2 * i), LSB_DUTY);
            duty[3 + i] = from_uint16(get_u16(buf + CC_GSC_DUTY_A + 2 * i), LSB_DUTY);
        }
        duty[6] = from_uint16(get_u16(buf + CC_CHOPPER_DUTY), LSB_DUTY);
        pitch = from_int16(get_u16(buf + CC_PITCH_REF), LSB_PITCH_RAD);
        flags = get_u16(buf + CC_COMMAND_FLAGS);
        status = get_u16(buf + CC_BOARD_STATUS);
    } else {
        return GB_MALFORMED;
    }
    for (i = 0; i < 7; i++) {
        if (!duty_ok(duty[i])) {
            return GB_INVALID_REFERENCE;
        }
    }
    if (!(pitch >= -GB_PITCH_REF_LIMIT_RAD && pitch <= GB_PITCH_REF_LIMIT_RAD) || (flags & ~GB_COMMAND_FLAGS_MASK) != 0) {
        return GB_INVALID_REFERENCE;
    }
    out->answered_sequence = answered;
    for (i = 0; i < 3; i++) {
        out->msc_duty[i] = (float)duty[i];
        out->gsc_duty[i] = (float)duty[3 + i];
    }
    out->chopper_duty = (float)duty[6];
    out->pitch_ref_rad = (float)pitch;
    out->command_flags = flags;
    out->board_status = status;
    *reply_sequence = get_u32(buf + OFF_SEQUENCE);
    *profile = kind == (int)GB_KIND_COMMAND_FULL ? GB_PROFILE_FULL : GB_PROFILE_COMPACT;
    return GB_OK;
}

/* ---- COBS (Cheshire and Baker, 1999) ---- */
size_t gb_cobs_encode(const uint8_t *src, size_t length, uint8_t *dst) {
    size_t code_index = 0;
    size_t out = 1;
    uint8_t code = 1;
    size_t i;
    for (i = 0; i < length; i++) {
        if (src[i] == 0) {
            dst[code_index] = code;
            code_index = out++;
            code = 1;
        } else {
            dst[out++] = src[i];
            code++;
            if (code == 0xFFu) {
                dst[code_index] = code;
                if (i + 1 == length) {
                    return out; /* a full block ends the frame: no extra code byte */
                }
                code_index = out++;
                code = 1;
            }
        }
    }
    dst[code_index] = code;
    return out;
}

int gb_cobs_decode(const uint8_t *src, size_t length, uint8_t *dst, size_t capacity) {
    size_t in = 0;
    size_t out = 0;
    while (in < length) {
        const unsigned code = src[in++];
        unsigned k;
        if (code == 0 || in + code - 1 > length) {
            return -1;
        }
        for (k = 1; k < code; k++) {
            const uint8_t b = src[in++];
            if (b == 0 || out >= capacity) {
                return -1;
            }
            dst[out++] = b;
        }
        if (code != 0xFFu && in < length) {
            if (out >= capacity) {
                return -1;
            }
            dst[out++] = 0;
        }
    }
    return (int)out;
}

void gb_deframer_init(gb_deframer *d) {
    d->length = 0;
    d->overlong = 0;
}

int gb_deframer_push(gb_deframer *d, uint8_t byte, uint8_t *frame, size_t capacity) {
    if (byte != 0) {
        if (d->length < sizeof d->block) {
            d->block[d->length++] = byte;
            return 0;
        }
        if (!d->overlong) {
            d->overlong = 1;
            return -1;
        }
        return 0;
    }
    if (d->overlong) {
        d->overlong = 0;
        d->length = 0;
        return 0;
    }
    if (d->length == 0) {
        return 0; /* empty frame: ignored */
    }
    {
        const int n = gb_cobs_decode(d->block, d->length, frame, capacity);
        d->length = 0;
        return n <= 0 ? -1 : n;
    }
}
