/*
 * gb_vectors: line-oriented bridge between the C kit and the Java tests, so that frames
 * cross both ways (Java encodes -> C decodes; C encodes -> Java decodes) and byte-compare.
 *
 *   gb_vectors crc                 prints the CRC-32C of "123456789"
 *   gb_vectors decode   < hex      one frame (hex) per line -> one canonical line each
 *   gb_vectors encode   < fields   one field line per frame -> frame hex
 *   gb_vectors cobs     < hex      COBS-encodes each line
 *   gb_vectors deframe  < hex      pushes each line's bytes through gb_deframer, prints results
 *
 * Canonical float form: 8 hex digits of the IEEE-754 binary32 bits, or "nan".
 * Input floats: anything strtod reads (decimal, C99 hex floats, nan, infinity).
 */
#include "gb_wire.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define LINE_MAX_CHARS 8192

static int hex_value(int c) {
    if (c >= '0' && c <= '9') return c - '0';
    if (c >= 'a' && c <= 'f') return c - 'a' + 10;
    if (c >= 'A' && c <= 'F') return c - 'A' + 10;
    return -1;
}

static size_t parse_hex(const char *line, uint8_t *out, size_t cap) {
    size_t n = 0;
    int hi = -1;
    for (; *line != '\0'; line++) {
        const int v = hex_value((unsigned char)*line);
        if (v < 0) continue;
        if (hi < 0) {
            hi = v;
        } else {
            if (n < cap) out[n++] = (uint8_t)(hi * 16 + v);
            hi = -1;
        }
    }
    return n;
}

static void print_hex(const uint8_t *b, size_t n) {
    size_t i;
    for (i = 0; i < n; i++) printf("%02x", b[i]);
    printf("\n");
}

static void print_f(float f) {
    uint32_t u;
    if (f != f) {
        printf(" nan");
        return;
    }
    memcpy(&u, &f, sizeof u);
    printf(" %08lx", (unsigned long)u);
}

static void print_f3(const float *v) {
    print_f(v[0]);
    print_f(v[1]);
    print_f(v[2]);
}

static int decode_line(const char *line) {
    uint8_t buf[512];
    const size_t n = parse_hex(line, buf, sizeof buf);
    uint32_t seq = 0;
    gb_profile profile = GB_PROFILE_FULL;
    const int is_measurement = n > 3 && (buf[3] == GB_KIND_MEASUREMENT_FULL || buf[3] == GB_KIND_MEASUREMENT_COMPACT);
    if (is_measurement) {
        gb_measurement m;
        const gb_status s = gb_decode_measurement(buf, n, &seq, &profile, &m);
        if (s != GB_OK) {
            printf("X %d\n", (int)s);
            return 0;
        }
        printf("M %lu %d %lld %lu", (unsigned long)seq, (int)profile, (long long)m.plant_time_ns,
               (unsigned long)m.status_flags);
        print_f3(m.grid_voltage_v);
        print_f3(m.grid_current_a);
        print_f3(m.stator_voltage_v);
        print_f3(m.stator_current_a);
        print_f(m.dc_link_voltage_v);
        print_f(m.rotor_angle_rad);
        print_f(m.rotor_speed_rad_s);
        print_f(m.wind_speed_m_s);
        print_f(m.pitch_angle_rad);
        print_f(m.grid_voltage_dq_v[0]);
        print_f(m.grid_voltage_dq_v[1]);
        print_f(m.grid_current_dq_a[0]);
        print_f(m.grid_current_dq_a[1]);
        print_f(m.stator_current_dq_a[0]);
        print_f(m.stator_current_dq_a[1]);
        print_f(m.stator_voltage_dq_v[0]);
        print_f(m.stator_voltage_dq_v[1]);
        print_f(m.voltage_deviation_ref_pu);
        printf("\n");
    } else {
        gb_command c;
        const gb_status s = gb_decode_command(buf, n, &seq, &profile, &c);
        if (s != GB_OK) {
            printf("X %d\n", (int)s);
            return 0;
        }
        printf("C %lu %d %lu", (unsigned long)seq, (int)profile, (unsigned long)c.answered_sequence);
        print_f3(c.msc_duty);
        print_f3(c.gsc_duty);
        print_f(c.chopper_duty);
        print_f(c.pitch_ref_rad);
        printf(" %lu %lu\n", (unsigned long)c.command_flags, (unsigned long)c.board_status);
    }
    return 0;
}

/* strtod-based float reader over a moving cursor */
static float next_f(char **p) {
    return (float)strtod(*p, p);
}

static unsigned long long next_u(char **p) {
    return strtoull(*p, p, 10);
}

static int encode_line(char *line) {
    uint8_t buf[GB_MAX_FRAME_LENGTH];
    char *p = line + 1;
    int i;
    size_t n;
    if (line[0] == 'M') {
        gb_measurement m;
        const gb_profile profile = (gb_profile)next_u(&p);
        const uint32_t seq = (uint32_t)next_u(&p);
        m.plant_time_ns = (int64_t)strtoll(p, &p, 10);
        m.status_flags = (uint32_t)next_u(&p);
        for (i = 0; i < 3; i++) m.grid_voltage_v[i] = next_f(&p);
        for (i = 0; i < 3; i++) m.grid_current_a[i] = next_f(&p);
        for (i = 0; i < 3; i++) m.stator_voltage_v[i] = next_f(&p);
        for (i = 0; i < 3; i++) m.stator_current_a[i] = next_f(&p);
        m.dc_link_voltage_v = next_f(&p);
        m.rotor_angle_rad = next_f(&p);
        m.rotor_speed_rad_s = next_f(&p);
        m.wind_speed_m_s = next_f(&p);
        m.pitch_angle_rad = next_f(&p);
        m.grid_voltage_dq_v[0] = next_f(&p);
        m.grid_voltage_dq_v[1] = next_f(&p);
        m.grid_current_dq_a[0] = next_f(&p);
        m.grid_current_dq_a[1] = next_f(&p);
        m.stator_current_dq_a[0] = next_f(&p);
        m.stator_current_dq_a[1] = next_f(&p);
        m.stator_voltage_dq_v[0] = next_f(&p);
        m.stator_voltage_dq_v[1] = next_f(&p);
        m.voltage_deviation_ref_pu = next_f(&p);
        n = gb_encode_measurement(profile, seq, &m, buf);
    } else if (line[0] == 'C') {
        gb_command c;
        const gb_profile profile = (gb_profile)next_u(&p);
        const uint32_t seq = (uint32_t)next_u(&p);
        c.answered_sequence = (uint32_t)next_u(&p);
        for (i = 0; i < 3; i++) c.msc_duty[i] = next_f(&p);
        for (i = 0; i < 3; i++) c.gsc_duty[i] = next_f(&p);
        c.chopper_duty = next_f(&p);
        c.pitch_ref_rad = next_f(&p);
        c.command_flags = (uint32_t)next_u(&p);
        c.board_status = (uint32_t)next_u(&p);
        n = gb_encode_command(profile, seq, &c, buf);
    } else {
        fprintf(stderr, "gb_vectors encode: line must start with M or C\n");
        return 2;
    }
    print_hex(buf, n);
    return 0;
}

static int cobs_line(const char *line) {
    uint8_t in[1024];
    uint8_t out[1100];
    const size_t n = parse_hex(line, in, sizeof in);
    print_hex(out, gb_cobs_encode(in, n, out));
    return 0;
}

static int deframe_line(gb_deframer *d, const char *line) {
    uint8_t in[4096];
    uint8_t frame[GB_MAX_FRAME_LENGTH + 1];
    const size_t n = parse_hex(line, in, sizeof in);
    size_t i;
    for (i = 0; i < n; i++) {
        const int r = gb_deframer_push(d, in[i], frame, sizeof frame);
        if (r > 0) {
            printf("F ");
            print_hex(frame, (size_t)r);
        } else if (r < 0) {
            printf("B\n");
        }
    }
    return 0;
}

int main(int argc, char **argv) {
    static char line[LINE_MAX_CHARS];
    gb_deframer deframer;
    const char *mode = argc > 1 ? argv[1] : "";
    int rc = 0;
    if (strcmp(mode, "crc") == 0) {
        printf("%08lx\n", (unsigned long)gb_crc32c((const uint8_t *)"123456789", 9));
        return 0;
    }
    if (strcmp(mode, "decode") != 0 && strcmp(mode, "encode") != 0 && strcmp(mode, "cobs") != 0 &&
        strcmp(mode, "deframe") != 0) {
        fprintf(stderr, "usage: gb_vectors crc|decode|encode|cobs|deframe\n");
        return 2;
    }
    gb_deframer_init(&deframer);
    while (rc == 0 && fgets(line, sizeof line, stdin) != NULL) {
        if (strcmp(mode, "decode") == 0) {
            rc = decode_line(line);
        } else if (strcmp(mode, "encode") == 0) {
            rc = encode_line(line);
        } else if (strcmp(mode, "cobs") == 0) {
            rc = cobs_line(line);
        } else {
            rc = deframe_line(&deframer, line);
        }
        fflush(stdout);
    }
    return rc;
}
