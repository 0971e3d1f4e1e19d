package dev.galebench.board;

import dev.galebench.wire.WireProfile;
import java.io.PrintWriter;
import java.net.InetSocketAddress;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code galebench board}: runs the virtual board as its own process until it is stopped
 * (SIGINT/SIGTERM), then prints its counters. The first line on standard output says where
 * it listens ({@code galebench board: listening on udp 127.0.0.1:40123}), so a script or
 * a test that asked for port 0 learns the port.
 *
 * <p>Exit codes: 0 after a normal stop, 2 for bad options (message names the option).
 */
@Command(name = "board", mixinStandardHelpOptions = true,
        description = {"Runs a virtual converter-controller board that answers the plant's frames.",
                "It waits in blocking receives (no spinning), so it leaves the other core to the plant."})
public final class BoardSubcommand implements Callable<Integer> {
    @Option(names = "--udp", paramLabel = "[HOST:]PORT",
            description = "Answer UDP frames on HOST:PORT (HOST defaults to 127.0.0.1; PORT 0 picks a free port).")
    String udp;

    @Option(names = "--serial", paramLabel = "DEVICE[@BAUD]",
            description = "Answer COBS-framed frames on a serial port, e.g. /dev/ttyUSB0@921600 (default baud 921600).")
    String serial;

    @Option(names = "--profile", paramLabel = "full|compact", defaultValue = "full",
            description = "Frame profile (default: ${DEFAULT-VALUE}); frames of the other profile are counted and ignored.")
    String profile;

    @Option(names = "--controller", paramLabel = "NAME", defaultValue = "hold",
            description = "Control law the board runs (default: ${DEFAULT-VALUE}; known: hold, reference).")
    String controller;

    @Option(names = "--period-us", paramLabel = "US", defaultValue = "50",
            description = "Control period given to the controller, microseconds (default: ${DEFAULT-VALUE}).")
    double periodUs;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        final PrintWriter err = spec.commandLine().getErr();
        final PrintWriter out = spec.commandLine().getOut();
        final VirtualBoard board;
        try {
            board = open();
        } catch (IllegalArgumentException | java.io.UncheckedIOException e) {
            err.println("galebench board: " + e.getMessage());
            err.flush();
            return 2;
        }
        final Thread hook = new Thread(() -> {
            board.close();
            err.println("galebench board: stopped; " + board.counters());
            err.flush();
        }, "board-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        out.println("galebench board: listening on " + board.describe() + ", profile "
                + WireProfile.parse(profile).name().toLowerCase(java.util.Locale.ROOT) + ", controller " + controller);
        out.flush();
        board.run();
        return 0;
    }

    private VirtualBoard open() {
        if ((udp == null) == (serial == null)) {
            throw new IllegalArgumentException("give exactly one of --udp [HOST:]PORT or --serial DEVICE[@BAUD]");
        }
        final WireProfile p = WireProfile.parse(profile);
        if (!(periodUs > 0 && periodUs <= 1e6)) {
            throw new IllegalArgumentException("--period-us " + periodUs + " is not in (0, 1000000]");
        }
        final BoardController c = BoardControllers.create(controller);
        final double periodS = periodUs * 1e-6;
        if (udp != null) {
            final int colon = udp.lastIndexOf(':');
            final String host = colon < 0 ? "127.0.0.1" : udp.substring(0, colon);
            final int port = parsePort(colon < 0 ? udp : udp.substring(colon + 1));
            return VirtualBoard.udp(new InetSocketAddress(host, port), p, c, periodS);
        }
        final int at = serial.lastIndexOf('@');
        final String device = at < 0 ? serial : serial.substring(0, at);
        final int baud = at < 0 ? 921600 : parseBaud(serial.substring(at + 1));
        if (device.isEmpty()) {
            throw new IllegalArgumentException("--serial '" + serial + "': no device given");
        }
        return VirtualBoard.serial(device, baud, p, c, periodS);
    }

    private int parsePort(String text) {
        try {
            final int port = Integer.parseInt(text);
            if (port < 0 || port > 65535) {
                throw new IllegalArgumentException("--udp '" + udp + "': port " + port + " is not in 0..65535");
            }
            return port;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("--udp '" + udp + "': port '" + text + "' is not a number", e);
        }
    }

    private int parseBaud(String text) {
        try {
            final int baud = Integer.parseInt(text);
            if (baud <= 0) {
                throw new IllegalArgumentException("--serial '" + serial + "': baud " + baud + " must be positive");
            }
            return baud;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("--serial '" + serial + "': baud '" + text + "' is not a number", e);
        }
    }
}
