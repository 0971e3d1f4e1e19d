/*
 * udp_board: the smallest complete galebench board, a starting point for a port.
 *
 *   udp_board PORT [full|compact] [BIND_ADDRESS]
 *
 * Binds BIND_ADDRESS:PORT (default 127.0.0.1; PORT 0 picks a free port), prints
 * "udp_board: listening on port N", then answers every valid measurement frame with a
 * command frame that echoes its sequence. The "controller" is trivial: both converters
 * blocked (duties 0.5, enable bits clear), chopper off, breaker kept as measured, pitch
 * reference = measured pitch. Replace control_step() with your control law.
 *
 * Blocking receive (no spinning), no heap. SIGINT/SIGTERM print the counters and exit 0.
 */
#define _POSIX_C_SOURCE 200809L

#include "gb_wire.h"

#include <arpa/inet.h>
#include <errno.h>
#include <netinet/in.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/socket.h>
#include <unistd.h>

static volatile sig_atomic_t stop_requested = 0;

static void on_signal(int sig) {
    (void)sig;
    stop_requested = 1;
}

/* One control period: the place where a real board runs its control law. */
static void control_step(const gb_measurement *in, gb_command *out) {
    int i;
    for (i = 0; i < 3; i++) {
        out->msc_duty[i] = 0.5f;
        out->gsc_duty[i] = 0.5f;
    }
    out->chopper_duty = 0.0f;
    out->pitch_ref_rad = in->pitch_angle_rad == in->pitch_angle_rad ? in->pitch_angle_rad : 0.0f;
    if (out->pitch_ref_rad > 1.5f) out->pitch_ref_rad = 1.5f;
    if (out->pitch_ref_rad < -1.5f) out->pitch_ref_rad = -1.5f;
    out->command_flags = (in->status_flags & GB_STATUS_BREAKER_CLOSED) ? GB_CMD_BREAKER_CLOSE : 0u;
    out->board_status = 0u;
}

int main(int argc, char **argv) {
    struct sockaddr_in addr;
    socklen_t addr_len = sizeof addr;
    int fd;
    gb_profile profile = GB_PROFILE_FULL;
    const char *bind_address = "127.0.0.1";
    unsigned long answered = 0, crc_errors = 0, malformed = 0, wrong_profile = 0;
    uint32_t reply_sequence = 0;
    struct sigaction sa;

    if (argc < 2) {
        fprintf(stderr, "usage: udp_board PORT [full|compact] [BIND_ADDRESS]\n");
        return 2;
    }
    if (argc > 2) {
        if (strcmp(argv[2], "compact") == 0) {
            profile = GB_PROFILE_COMPACT;
        } else if (strcmp(argv[2], "full") != 0) {
            fprintf(stderr, "udp_board: profile must be full or compact, not '%s'\n", argv[2]);
            return 2;
        }
    }
    if (argc > 3) {
        bind_address = argv[3];
    }
    memset(&sa, 0, sizeof sa);
    sa.sa_handler = on_signal; /* no SA_RESTART: a signal interrupts recvfrom */
    sigaction(SIGINT, &sa, NULL);
    sigaction(SIGTERM, &sa, NULL);

    fd = socket(AF_INET, SOCK_DGRAM, 0);
    if (fd < 0) {
        perror("udp_board: socket");
        return 1;
    }
    memset(&addr, 0, sizeof addr);
    addr.sin_family = AF_INET;
    addr.sin_port = htons((uint16_t)atoi(argv[1]));
    if (inet_pton(AF_INET, bind_address, &addr.sin_addr) != 1) {
        fprintf(stderr, "udp_board: bad bind address '%s'\n", bind_address);
        return 2;
    }
    if (bind(fd, (struct sockaddr *)&addr, sizeof addr) != 0) {
        perror("udp_board: bind");
        return 1;
    }
    getsockname(fd, (struct sockaddr *)&addr, &addr_len);
    printf("udp_board: listening on port %u\n", (unsigned)ntohs(addr.sin_port));
    fflush(stdout);

    while (!stop_requested) {
        uint8_t rx[2048];
        uint8_t tx[GB_MAX_FRAME_LENGTH];
        struct sockaddr_in from;
        socklen_t from_len = sizeof from;
        gb_measurement m;
        gb_command c;
        uint32_t sequence;
        gb_profile got;
        gb_status s;
        size_t n;
        const ssize_t r = recvfrom(fd, rx, sizeof rx, 0, (struct sockaddr *)&from, &from_len);
        if (r < 0) {
            if (errno == EINTR) continue;
            perror("udp_board: recvfrom");
            break;
        }
        s = gb_decode_measurement(rx, (size_t)r, &sequence, &got, &m);
        if (s == GB_CRC_ERROR) {
            crc_errors++;
            continue;
        }
        if (s != GB_OK) {
            malformed++;
            continue;
        }
        if (got != profile) {
            wrong_profile++;
            continue;
        }
        control_step(&m, &c);
        c.answered_sequence = sequence;
        n = gb_encode_command(profile, reply_sequence++, &c, tx);
        if (sendto(fd, tx, n, 0, (struct sockaddr *)&from, from_len) == (ssize_t)n) {
            answered++;
        }
    }
    fprintf(stderr, "udp_board: answered %lu, crc errors %lu, malformed %lu, wrong profile %lu\n", answered,
            crc_errors, malformed, wrong_profile);
    close(fd);
    return 0;
}
