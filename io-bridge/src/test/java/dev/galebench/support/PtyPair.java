package dev.galebench.support;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.TimeUnit;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * A real pseudo-terminal pair made by {@code socat -d -d pty,raw,echo=0 pty,raw,echo=0}: two
 * device paths joined like a null-modem cable. One fresh pair per test: leftover bytes in a
 * reused pair would misalign the next test's frames. Closing ends the socat process (by its
 * own handle, nothing else).
 */
public final class PtyPair implements AutoCloseable {
    private static final Pattern PTY = Pattern.compile("PTY is (\\S+)");
    private final Process socat;
    private final String first;
    private final String second;

    private PtyPair(Process socat, String first, String second) {
        this.socat = socat;
        this.first = first;
        this.second = second;
    }

    /** Starts socat and waits (up to 5 s) until it has printed both device names. */
    public static PtyPair open() throws IOException {
        final Process p = new ProcessBuilder("socat", "-d", "-d", "pty,raw,echo=0", "pty,raw,echo=0")
                .redirectOutput(ProcessBuilder.Redirect.DISCARD)
                .start();
        final BufferedReader err = new BufferedReader(new InputStreamReader(p.getErrorStream(), StandardCharsets.UTF_8));
        String a = null;
        String b = null;
        final long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(5);
        String line;
        while (b == null && System.nanoTime() < deadline && (line = err.readLine()) != null) {
            final Matcher m = PTY.matcher(line);
            if (m.find()) {
                if (a == null) {
                    a = m.group(1);
                } else {
                    b = m.group(1);
                }
            }
        }
        if (b == null) {
            p.destroy();
            throw new IOException("socat did not report two pty devices (is socat installed?)");
        }
        // keep draining stderr so socat never blocks on a full pipe
        final Thread drain = new Thread(() -> {
            try {
                while (err.readLine() != null) {
                    // discard
                }
            } catch (IOException ignored) {
                // socat ended
            }
        }, "socat-stderr");
        drain.setDaemon(true);
        drain.start();
        return new PtyPair(p, a, b);
    }

    /** First device, e.g. {@code /dev/pts/3}. */
    public String first() {
        return first;
    }

    /** Second device, joined to the first. */
    public String second() {
        return second;
    }

    @Override
    public void close() {
        socat.destroy();
        try {
            socat.waitFor(5, TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }
}
