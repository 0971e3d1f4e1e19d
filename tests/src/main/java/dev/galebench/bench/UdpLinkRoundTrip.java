package dev.galebench.bench;

import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Round trip of the Java UDP link against a blocking C peer, compared with a C initiator in
 * the same run (the floor). Both initiators spin on a non-blocking receive on one core; the
 * peer is the board kit's example board ({@code udp_board}, blocking) on the other core, so
 * both measure the same thing: a FULL measurement frame out, a FULL command frame back.
 *
 * <p>Runs C and Java alternately ({@code rounds} times each) and reports, per percentile,
 * the median over rounds and the ratio Java / C. Absolute microseconds on a shared VM move
 * with its moods (see MEASUREMENTS.md); the ratio is the number to quote.
 *
 * <pre>
 * java -cp tests/target/classes:... dev.galebench.bench.UdpLinkRoundTrip [io-bridge/board-kit] [exchanges] [rounds]
 * </pre>
 */
public final class UdpLinkRoundTrip {
    private static final double[] QUANTILES = {0.50, 0.99, 0.999, 0.9999};
    private static final String[] NAMES = {"p50", "p99", "p99.9", "p99.99"};

    private UdpLinkRoundTrip() {
    }

    public static void main(String[] args) throws Exception {
        final Path kit = Paths.get(args.length > 0 ? args[0] : "io-bridge/board-kit").toAbsolutePath();
        final int exchanges = args.length > 1 ? Integer.parseInt(args[1]) : 200_000;
        final int rounds = args.length > 2 ? Integer.parseInt(args[2]) : 3;
        final Path bin = Files.createTempDirectory("galebench-kit");
        compile(kit, bin.resolve("udp_board"), "examples/udp_board.c");
        compile(kit, bin.resolve("udp_pingpong"), "tools/udp_pingpong.c");
        final Process board = new ProcessBuilder(bin.resolve("udp_board").toString(), "0", "full").start();
        try {
            final String first = new BufferedReader(new InputStreamReader(board.getInputStream(), StandardCharsets.UTF_8)).readLine();
            final Matcher m = Pattern.compile("port (\\d+)").matcher(first == null ? "" : first);
            if (!m.find()) {
                throw new IllegalStateException("udp_board did not start: " + first);
            }
            final int port = Integer.parseInt(m.group(1));
            final double[][] c = new double[rounds][];
            final double[][] java = new double[rounds][];
            try (BoardLink link = BoardLinks.open("udp://127.0.0.1:" + port, LinkOptions.defaults())) {
                javaRun(link, 20_000); // warm-up: JIT
                for (int r = 0; r < rounds; r++) {
                    c[r] = cRun(bin, port, exchanges);
                    java[r] = javaRun(link, exchanges);
                    System.out.printf(Locale.ROOT, "round %d: C %s | Java %s%n", r + 1, Arrays.toString(c[r]), Arrays.toString(java[r]));
                }
            }
            System.out.println();
            System.out.println("| initiator | " + String.join(" | ", NAMES) + " |");
            System.out.println("|---|---|---|---|---|");
            final double[] cMed = medians(c);
            final double[] jMed = medians(java);
            System.out.println(row("C, spins on non-blocking recv (floor)", cMed));
            System.out.println(row("Java UDP link (DatagramChannel, non-blocking, spin)", jMed));
            final StringBuilder ratio = new StringBuilder("| ratio Java / C |");
            for (int i = 0; i < QUANTILES.length; i++) {
                ratio.append(String.format(Locale.ROOT, " %.2f |", jMed[i] / cMed[i]));
            }
            System.out.println(ratio);
            System.out.printf(Locale.ROOT, "(us, medians of %d rounds of %d exchanges; peer: udp_board, blocking)%n", rounds, exchanges);
        } finally {
            board.toHandle().destroy();
            board.waitFor(5, TimeUnit.SECONDS);
        }
    }

    private static String row(String name, double[] v) {
        final StringBuilder s = new StringBuilder("| " + name + " |");
        for (double x : v) {
            s.append(String.format(Locale.ROOT, " %.2f |", x));
        }
        return s.toString();
    }

    private static double[] medians(double[][] runs) {
        final double[] out = new double[QUANTILES.length];
        for (int i = 0; i < out.length; i++) {
            final double[] col = new double[runs.length];
            for (int r = 0; r < runs.length; r++) {
                col[r] = runs[r][i];
            }
            Arrays.sort(col);
            out[i] = col[col.length / 2];
        }
        return out;
    }

    private static double[] javaRun(BoardLink link, int exchanges) {
        final long[] rtt = new long[exchanges];
        final SensorView view = new SensorView();
        view.dcLinkVoltageV = 1100;
        view.statusFlags = SensorView.STATUS_BREAKER_CLOSED;
        final BoardCommand out = new BoardCommand();
        int n = 0;
        long seq = System.nanoTime() & 0xFFFFFFL; // fresh numbers each run
        for (int i = 0; i < exchanges; i++) {
            final long s = seq++;
            final long t0 = System.nanoTime();
            link.send(s, view);
            final long deadline = t0 + 100_000_000L;
            while (true) {
                if (link.poll(out) == BoardLink.POLL_REPLY && out.answeredSequence == s) {
                    rtt[n++] = System.nanoTime() - t0;
                    break;
                }
                if (System.nanoTime() > deadline) {
                    break;
                }
            }
        }
        return percentilesUs(rtt, n);
    }

    private static double[] percentilesUs(long[] v, int n) {
        Arrays.sort(v, 0, n);
        final double[] out = new double[QUANTILES.length];
        for (int i = 0; i < QUANTILES.length; i++) {
            int idx = (int) Math.round(QUANTILES[i] * n) - 1; // nearest rank, as the C tool
            idx = Math.max(0, Math.min(n - 1, idx));
            out[i] = v[idx] / 1000.0;
        }
        return out;
    }

    private static double[] cRun(Path bin, int port, int exchanges) throws IOException, InterruptedException {
        final Process p = new ProcessBuilder(bin.resolve("udp_pingpong").toString(), "ping", "127.0.0.1",
                Integer.toString(port), Integer.toString(exchanges), "20000").redirectErrorStream(true).start();
        final String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        p.waitFor();
        final double[] v = new double[QUANTILES.length];
        for (int i = 0; i < NAMES.length; i++) {
            final Matcher m = Pattern.compile(" " + Pattern.quote(NAMES[i]) + " ([0-9.]+)").matcher(out);
            if (!m.find()) {
                throw new IllegalStateException("udp_pingpong: " + out);
            }
            v[i] = Double.parseDouble(m.group(1));
        }
        return v;
    }

    private static void compile(Path kit, Path out, String main) throws IOException, InterruptedException {
        final List<String> cmd = new ArrayList<>(List.of("gcc", "-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic", "-Wconversion", "-Wshadow", "-O2",
                "-I" + kit.resolve("include"), "-o", out.toString(), kit.resolve(main).toString(),
                kit.resolve("src/gb_wire.c").toString(), "-lm"));
        final Process p = new ProcessBuilder(cmd).inheritIO().start();
        if (p.waitFor() != 0) {
            throw new IllegalStateException("gcc failed for " + main);
        }
    }
}
