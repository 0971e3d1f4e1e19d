package dev.galebench.link;

import dev.galebench.board.BoardController;
import dev.galebench.rt.BoardLink;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.UnknownHostException;

/**
 * Opens board links. The links themselves are package-private; callers see only
 * {@link BoardLink}.
 *
 * <table>
 *   <caption>URIs</caption>
 *   <tr><th>URI</th><th>link</th></tr>
 *   <tr><td>{@code udp://HOST:PORT}</td><td>UDP to a board (or {@code galebench board --udp PORT}) at HOST:PORT</td></tr>
 *   <tr><td>{@code serial:DEVICE[@BAUD]}</td><td>serial port by path, e.g. {@code serial:/dev/ttyUSB0@921600}; default baud from {@link LinkOptions}</td></tr>
 * </table>
 *
 * <p>Errors: a malformed URI throws {@link IllegalArgumentException} naming the URI and the
 * problem; a port or socket that cannot be opened throws {@link java.io.UncheckedIOException}.
 */
public final class BoardLinks {
    private BoardLinks() {
    }

    /** Opens the link {@code uri} names with {@code options}. */
    public static BoardLink open(String uri, LinkOptions options) {
        if (uri == null || uri.isBlank()) {
            throw new IllegalArgumentException("board link URI is empty (expected udp://HOST:PORT or serial:DEVICE[@BAUD])");
        }
        final LinkOptions o = options == null ? LinkOptions.defaults() : options;
        if (uri.startsWith("udp://")) {
            return new UdpBoardLink(parseUdp(uri), o);
        }
        if (uri.startsWith("serial:")) {
            final String rest = uri.substring("serial:".length());
            final int at = rest.lastIndexOf('@');
            final String device = at < 0 ? rest : rest.substring(0, at);
            final int baud = at < 0 ? o.defaultBaud : parseInt(uri, rest.substring(at + 1), "baud", 1, Integer.MAX_VALUE);
            if (device.isEmpty()) {
                throw new IllegalArgumentException("board link URI '" + uri + "': no serial device given");
            }
            return new SerialBoardLink(device, baud, o);
        }
        throw new IllegalArgumentException("board link URI '" + uri + "': unknown scheme (expected udp://HOST:PORT or serial:DEVICE[@BAUD])");
    }

    /** In-process link with the FULL profile and no faults. */
    public static BoardLink inProcess(BoardController controller) {
        return new InProcessBoardLink(controller, LinkOptions.defaults());
    }

    /** In-process link with the given profile and faults. */
    public static BoardLink inProcess(BoardController controller, LinkOptions options) {
        return new InProcessBoardLink(controller, options == null ? LinkOptions.defaults() : options);
    }

    /** Parses {@code udp://HOST:PORT} (HOST may be a name, an IPv4 address or {@code [IPv6]}). */
    static InetSocketAddress parseUdp(String uri) {
        final String rest = uri.substring("udp://".length());
        final int colon = rest.lastIndexOf(':');
        if (colon <= 0) {
            throw new IllegalArgumentException("board link URI '" + uri + "': expected udp://HOST:PORT");
        }
        String host = rest.substring(0, colon);
        if (host.startsWith("[") && host.endsWith("]")) {
            host = host.substring(1, host.length() - 1);
        }
        final int port = parseInt(uri, rest.substring(colon + 1), "port", 1, 65535);
        try {
            return new InetSocketAddress(InetAddress.getByName(host), port);
        } catch (UnknownHostException e) {
            throw new IllegalArgumentException("board link URI '" + uri + "': unknown host '" + host + "'", e);
        }
    }

    private static int parseInt(String uri, String text, String what, int min, int max) {
        try {
            final int v = Integer.parseInt(text);
            if (v < min || v > max) {
                throw new IllegalArgumentException("board link URI '" + uri + "': " + what + " " + v + " is not in " + min + ".." + max);
            }
            return v;
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("board link URI '" + uri + "': " + what + " '" + text + "' is not a number", e);
        }
    }
}
