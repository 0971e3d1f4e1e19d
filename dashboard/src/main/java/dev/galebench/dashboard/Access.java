package dev.galebench.dashboard;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;

/**
 * The console's access rules, in one place:
 *
 * <ul>
 *   <li>No token configured (loopback only, enforced by {@link DashboardOptions#validated()}):
 *       every client may watch and control.</li>
 *   <li>Token configured: a client that presents it may watch and control; a client that
 *       presents none may watch read-only if viewers are allowed, else it is refused; a client
 *       that presents a wrong one is always refused (a typo should be noticed, not silently
 *       demoted to read-only).</li>
 *   <li>Every control message must carry the token as well (not only the socket handshake), so a
 *       message replayed on a viewer's socket cannot act.</li>
 * </ul>
 *
 * Tokens are compared in constant time.
 */
final class Access {
    /** What a client may do. */
    enum Role { CONTROL, VIEW, REFUSED }

    private final byte[] token;
    private final boolean allowViewers;

    Access(String token, boolean allowViewers) {
        this.token = token == null ? null : token.getBytes(StandardCharsets.UTF_8);
        this.allowViewers = allowViewers;
    }

    boolean tokenRequired() {
        return token != null;
    }

    /** Role of a client that presented {@code presented} (null or empty = none). */
    Role roleFor(String presented) {
        if (token == null) {
            return Role.CONTROL;
        }
        if (presented == null || presented.isEmpty()) {
            return allowViewers ? Role.VIEW : Role.REFUSED;
        }
        return matches(presented) ? Role.CONTROL : Role.REFUSED;
    }

    /** True if a control message carrying {@code presented} may act. */
    boolean controlAllowed(String presented) {
        return token == null || (presented != null && matches(presented));
    }

    private boolean matches(String presented) {
        return MessageDigest.isEqual(token, presented.getBytes(StandardCharsets.UTF_8));
    }
}
