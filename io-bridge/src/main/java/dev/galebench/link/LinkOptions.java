package dev.galebench.link;

import dev.galebench.wire.WireProfile;

/**
 * Settings of a board link, given to {@link BoardLinks#open}. Checked once when the link
 * opens; the real-time thread only sees the result.
 *
 * <table>
 *   <caption>Options</caption>
 *   <tr><th>option</th><th>unit</th><th>default</th><th>meaning</th></tr>
 *   <tr><td>profile</td><td></td><td>FULL</td><td>frame profile; the board must use the same</td></tr>
 *   <tr><td>faults</td><td></td><td>none</td><td>fault injection on the reply path ({@link LinkFaults})</td></tr>
 *   <tr><td>localHost</td><td></td><td>127.0.0.1 for a loopback board, else 0.0.0.0</td><td>UDP: local address to bind</td></tr>
 *   <tr><td>localPort</td><td>port</td><td>0 (any)</td><td>UDP: local port to bind</td></tr>
 *   <tr><td>socketBufferBytes</td><td>bytes</td><td>1048576</td><td>UDP: SO_SNDBUF and SO_RCVBUF requested (the kernel caps them at net.core.wmem_max / rmem_max): room for replies that pile up while the loop is stalled</td></tr>
 *   <tr><td>defaultBaud</td><td>bit/s</td><td>921600</td><td>serial: baud when the URI has no {@code @BAUD}</td></tr>
 * </table>
 */
public final class LinkOptions {
    WireProfile profile = WireProfile.FULL;
    LinkFaults faults = new LinkFaults();
    String localHost;
    int localPort;
    int socketBufferBytes = 1 << 20;
    int defaultBaud = 921600;

    /** Defaults: FULL profile, no faults. */
    public static LinkOptions defaults() {
        return new LinkOptions();
    }

    public LinkOptions profile(WireProfile value) {
        if (value == null) {
            throw new IllegalArgumentException("link option profile must not be null");
        }
        profile = value;
        return this;
    }

    /** Uses {@code value} for fault injection; keep the reference to change faults during a run. */
    public LinkOptions faults(LinkFaults value) {
        if (value == null) {
            throw new IllegalArgumentException("link option faults must not be null");
        }
        faults = value;
        return this;
    }

    public LinkOptions localHost(String value) {
        localHost = value;
        return this;
    }

    public LinkOptions localPort(int value) {
        if (value < 0 || value > 65535) {
            throw new IllegalArgumentException("link option localPort " + value + " is not in 0..65535");
        }
        localPort = value;
        return this;
    }

    public LinkOptions socketBufferBytes(int value) {
        if (value < 1024) {
            throw new IllegalArgumentException("link option socketBufferBytes " + value + " is below 1024");
        }
        socketBufferBytes = value;
        return this;
    }

    public LinkOptions defaultBaud(int value) {
        if (value <= 0) {
            throw new IllegalArgumentException("link option defaultBaud " + value + " must be positive");
        }
        defaultBaud = value;
        return this;
    }

    public WireProfile profile() {
        return profile;
    }

    public LinkFaults faults() {
        return faults;
    }
}
