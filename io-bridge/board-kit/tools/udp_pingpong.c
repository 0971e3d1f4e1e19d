/*
 * udp_pingpong: the C floor for the UDP link's round trip, measured in the same run as the
 * Java link (see io-bridge/README.md).
 *
 *   udp_pingpong echo PORT
 *       blocking echo peer on 127.0.0.1:PORT (0 = free port; prints "echo: port N")
 *   udp_pingpong ping HOST PORT COUNT [WARMUP]
 *       initiator: sends a FULL measurement frame (128 bytes, sequence counting up) on a
 *       connected socket, spins on a non-blocking recv for the reply (any datagram),
 *       records each round trip (CLOCK_MONOTONIC) and prints
 *       "rtt_us p50 P p99 P p99.9 P p99.99 P max P n N timeouts T"
 *
 * The initiator spins (one core); the peer blocks. Timeouts (no reply within 100 ms) are
 * counted and the frame is skipped.
 */
#define _POSIX_C_SOURCE 200809L

#include "gb_wire.h"

#include <arpa/inet.h>
#include <errno.h>
#include <fcntl.h>
#include <netinet/in.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/socket.h>
#include <time.h>
#include <unistd.h>

#define MAX_SAMPLES 4000000

static long long samples[MAX_SAMPLES];

static long long now_ns(void) {
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (long long)ts.tv_sec * 1000000000LL + ts.tv_nsec;
}

static int compare_ll(const void *a, const void *b) {
    const long long x = *(const long long *)a;
    const long long y = *(const long long *)b;
    return x < y ? -1 : x > y;
}

static double percentile_us(long n, double q) {
    long idx = (long)(q * (double)n + 0.5) - 1; /* nearest rank */
    if (idx < 0) idx = 0;
    if (idx >= n) idx = n - 1;
    return (double)samples[idx] / 1000.0;
}

static int run_echo(int port) {
    struct sockaddr_in addr;
    socklen_t len = sizeof addr;
    int fd = socket(AF_INET, SOCK_DGRAM, 0);
    memset(&addr, 0, sizeof addr);
    addr.sin_family = AF_INET;
    addr.sin_port = htons((uint16_t)port);
    addr.sin_addr.s_addr = htonl(INADDR_LOOPBACK);
    if (fd < 0 || bind(fd, (struct sockaddr *)&addr, sizeof addr) != 0) {
        perror("echo: bind");
        return 1;
    }
    getsockname(fd, (struct sockaddr *)&addr, &len);
    printf("echo: port %u\n", (unsigned)ntohs(addr.sin_port));
    fflush(stdout);
    for (;;) {
        uint8_t buf[2048];
        struct sockaddr_in from;
        socklen_t from_len = sizeof from;
        const ssize_t r = recvfrom(fd, buf, sizeof buf, 0, (struct sockaddr *)&from, &from_len);
        if (r < 0) {
            if (errno == EINTR) continue;
            return 1;
        }
        sendto(fd, buf, (size_t)r, 0, (struct sockaddr *)&from, from_len);
    }
}

static int run_ping(const char *host, int port, long count, long warmup) {
    struct sockaddr_in addr;
    int fd = socket(AF_INET, SOCK_DGRAM, 0);
    gb_measurement m;
    uint8_t tx[GB_MAX_FRAME_LENGTH];
    uint8_t rx[2048];
    long i;
    long n = 0;
    long timeouts = 0;
    uint32_t seq = 0;
    if (count > MAX_SAMPLES) count = MAX_SAMPLES;
    memset(&addr, 0, sizeof addr);
    addr.sin_family = AF_INET;
    addr.sin_port = htons((uint16_t)port);
    if (fd < 0 || inet_pton(AF_INET, host, &addr.sin_addr) != 1 ||
        connect(fd, (struct sockaddr *)&addr, sizeof addr) != 0) {
        perror("ping: connect");
        return 1;
    }
    fcntl(fd, F_SETFL, fcntl(fd, F_GETFL) | O_NONBLOCK);
    memset(&m, 0, sizeof m);
    m.dc_link_voltage_v = 1100.0f;
    m.status_flags = GB_STATUS_BREAKER_CLOSED;
    for (i = 0; i < warmup + count; i++) {
        long long t0;
        long long deadline;
        size_t len;
        int got = 0;
        m.plant_time_ns = (int64_t)i * 50000;
        len = gb_encode_measurement(GB_PROFILE_FULL, seq++, &m, tx);
        t0 = now_ns();
        deadline = t0 + 100000000LL;
        if (send(fd, tx, len, 0) != (ssize_t)len) {
            timeouts++;
            continue;
        }
        while (!got) {
            const ssize_t r = recv(fd, rx, sizeof rx, 0);
            if (r > 0) {
                got = 1;
            } else if (now_ns() > deadline) {
                break;
            }
        }
        if (!got) {
            timeouts++;
            continue;
        }
        if (i >= warmup) {
            samples[n++] = now_ns() - t0;
        }
    }
    if (n == 0) {
        printf("rtt_us n 0 timeouts %ld\n", timeouts);
        return 1;
    }
    qsort(samples, (size_t)n, sizeof samples[0], compare_ll);
    printf("rtt_us p50 %.2f p99 %.2f p99.9 %.2f p99.99 %.2f max %.2f n %ld timeouts %ld\n", percentile_us(n, 0.50),
           percentile_us(n, 0.99), percentile_us(n, 0.999), percentile_us(n, 0.9999), (double)samples[n - 1] / 1000.0,
           n, timeouts);
    close(fd);
    return 0;
}

int main(int argc, char **argv) {
    if (argc >= 3 && strcmp(argv[1], "echo") == 0) {
        return run_echo(atoi(argv[2]));
    }
    if (argc >= 5 && strcmp(argv[1], "ping") == 0) {
        return run_ping(argv[2], atoi(argv[3]), atol(argv[4]), argc > 5 ? atol(argv[5]) : 10000);
    }
    fprintf(stderr, "usage: udp_pingpong echo PORT | udp_pingpong ping HOST PORT COUNT [WARMUP]\n");
    return 2;
}
