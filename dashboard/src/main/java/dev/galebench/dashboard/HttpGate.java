package dev.galebench.dashboard;

import io.netty.buffer.Unpooled;
import io.netty.channel.ChannelFutureListener;
import io.netty.channel.ChannelHandlerContext;
import io.netty.channel.SimpleChannelInboundHandler;
import io.netty.handler.codec.http.DefaultFullHttpResponse;
import io.netty.handler.codec.http.FullHttpRequest;
import io.netty.handler.codec.http.FullHttpResponse;
import io.netty.handler.codec.http.HttpHeaderNames;
import io.netty.handler.codec.http.HttpHeaderValues;
import io.netty.handler.codec.http.HttpMethod;
import io.netty.handler.codec.http.HttpResponseStatus;
import io.netty.handler.codec.http.HttpUtil;
import io.netty.handler.codec.http.HttpVersion;
import io.netty.handler.codec.http.QueryStringDecoder;
import io.netty.util.AttributeKey;

import java.io.IOException;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/**
 * Front door of every HTTP request: serves the console's own files and uPlot, serves finished
 * run folders under {@code /runs/<runId>/}, and admits WebSocket upgrades on {@code /ws} after
 * the access check, passing them on to Netty's protocol handler with the client's role and
 * resume point attached to the channel.
 *
 * <p>Rules: pages and scripts carry no bench data and are served to anyone who can reach the
 * port; live data ({@code /ws}) and run folders need at least view access
 * ({@link Access}). A WebSocket upgrade whose {@code Origin} is not this server itself is
 * refused, so a foreign web page open in the same browser cannot drive a bench on loopback.
 * The token travels as {@code ?token=} or as {@code Authorization: Bearer}.
 */
final class HttpGate extends SimpleChannelInboundHandler<FullHttpRequest> {
    static final AttributeKey<Access.Role> ROLE = AttributeKey.valueOf("galebench.role");
    static final AttributeKey<String> RESUME_STREAM = AttributeKey.valueOf("galebench.resumeStream");
    static final AttributeKey<Long> RESUME_AFTER = AttributeKey.valueOf("galebench.resumeAfter");
    static final String WS_PATH = "/ws";

    private final StaticResources resources;
    private final Access access;
    private final TelemetryHub hub;

    HttpGate(StaticResources resources, Access access, TelemetryHub hub) {
        this.resources = resources;
        this.access = access;
        this.hub = hub;
    }

    @Override
    protected void channelRead0(ChannelHandlerContext ctx, FullHttpRequest req) {
        if (!req.decoderResult().isSuccess()) {
            respond(ctx, req, HttpResponseStatus.BAD_REQUEST, "bad request\n");
            return;
        }
        QueryStringDecoder q = new QueryStringDecoder(req.uri());
        String path = q.path();
        boolean get = HttpMethod.GET.equals(req.method());
        if (!get && !HttpMethod.HEAD.equals(req.method())) {
            respond(ctx, req, HttpResponseStatus.METHOD_NOT_ALLOWED, "only GET and HEAD\n");
            return;
        }
        if (WS_PATH.equals(path)) {
            admitWebSocket(ctx, req, q);
            return;
        }
        if (path.startsWith("/runs/")) {
            serveRunFile(ctx, req, q, path);
            return;
        }
        StaticResources.Resource r = resources.get(path);
        if (r == null) {
            respond(ctx, req, HttpResponseStatus.NOT_FOUND, "not found: " + path + "\n");
            return;
        }
        FullHttpResponse res = response(HttpResponseStatus.OK, r.bytes(), r.contentType());
        res.headers().set(HttpHeaderNames.CACHE_CONTROL, r.immutable() ? "public, max-age=86400" : "no-cache");
        // Our pages load nothing from elsewhere; reports under /runs/ are self-contained files
        // with inline scripts and styles, so they do not get this policy.
        res.headers().set("Content-Security-Policy",
                "default-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; connect-src 'self'");
        send(ctx, req, res);
    }

    private void admitWebSocket(ChannelHandlerContext ctx, FullHttpRequest req, QueryStringDecoder q) {
        if (!sameOrigin(req)) {
            respond(ctx, req, HttpResponseStatus.FORBIDDEN, "cross-origin WebSocket refused\n");
            return;
        }
        Access.Role role = access.roleFor(presentedToken(req, q));
        if (role == Access.Role.REFUSED) {
            respond(ctx, req, HttpResponseStatus.UNAUTHORIZED, "a valid token is required\n");
            return;
        }
        ctx.channel().attr(ROLE).set(role);
        ctx.channel().attr(RESUME_STREAM).set(first(q, "stream"));
        long after = -1;
        String a = first(q, "after");
        if (a != null) {
            try {
                after = Long.parseLong(a);
            } catch (NumberFormatException e) {
                respond(ctx, req, HttpResponseStatus.BAD_REQUEST, "after must be a batch number\n");
                return;
            }
        }
        ctx.channel().attr(RESUME_AFTER).set(after);
        ctx.fireChannelRead(req.retain());
    }

    private void serveRunFile(ChannelHandlerContext ctx, FullHttpRequest req, QueryStringDecoder q, String path) {
        if (access.roleFor(presentedToken(req, q)) == Access.Role.REFUSED) {
            respond(ctx, req, HttpResponseStatus.UNAUTHORIZED, "a valid token is required\n");
            return;
        }
        String rest = path.substring("/runs/".length());
        int slash = rest.indexOf('/');
        Path dir = slash > 0 ? hub.reportDir(rest.substring(0, slash)) : null;
        if (dir == null) {
            respond(ctx, req, HttpResponseStatus.NOT_FOUND, "no such run\n");
            return;
        }
        Path file = dir.resolve(rest.substring(slash + 1)).normalize();
        if (!file.startsWith(dir) || !Files.isRegularFile(file)) {
            respond(ctx, req, HttpResponseStatus.NOT_FOUND, "no such file in this run\n");
            return;
        }
        try {
            // Report files are read on the network thread: they are small (a few MB at most) and
            // opened rarely; live data never waits behind them for long.
            byte[] bytes = Files.readAllBytes(file);
            FullHttpResponse res = response(HttpResponseStatus.OK, bytes, contentType(file));
            res.headers().set(HttpHeaderNames.CACHE_CONTROL, "no-cache");
            send(ctx, req, res);
        } catch (IOException e) {
            respond(ctx, req, HttpResponseStatus.INTERNAL_SERVER_ERROR, "cannot read " + file.getFileName() + "\n");
        }
    }

    /** True if there is no Origin (not a browser) or it names this very host and port. */
    private static boolean sameOrigin(FullHttpRequest req) {
        String origin = req.headers().get(HttpHeaderNames.ORIGIN);
        if (origin == null) {
            return true;
        }
        String host = req.headers().get(HttpHeaderNames.HOST);
        if (host == null) {
            return false;
        }
        try {
            URI o = URI.create(origin);
            String authority = o.getRawAuthority();
            return ("http".equals(o.getScheme()) || "https".equals(o.getScheme()))
                    && authority != null && authority.equalsIgnoreCase(host);
        } catch (IllegalArgumentException e) {
            return false;
        }
    }

    static String presentedToken(FullHttpRequest req, QueryStringDecoder q) {
        String auth = req.headers().get(HttpHeaderNames.AUTHORIZATION);
        if (auth != null && auth.regionMatches(true, 0, "Bearer ", 0, 7)) {
            return auth.substring(7).trim();
        }
        return first(q, "token");
    }

    private static String first(QueryStringDecoder q, String name) {
        List<String> v = q.parameters().get(name);
        return v == null || v.isEmpty() ? null : v.get(0);
    }

    private static String contentType(Path file) {
        String n = file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (n.endsWith(".html") || n.endsWith(".htm")) {
            return "text/html; charset=utf-8";
        } else if (n.endsWith(".json")) {
            return "application/json";
        } else if (n.endsWith(".xml")) {
            return "application/xml";
        } else if (n.endsWith(".csv") || n.endsWith(".cfg") || n.endsWith(".hlog") || n.endsWith(".txt") || n.endsWith(".log")) {
            return "text/plain; charset=utf-8";
        } else if (n.endsWith(".png")) {
            return "image/png";
        } else if (n.endsWith(".svg")) {
            return "image/svg+xml";
        }
        return "application/octet-stream";
    }

    private static FullHttpResponse response(HttpResponseStatus status, byte[] body, String type) {
        FullHttpResponse res = new DefaultFullHttpResponse(HttpVersion.HTTP_1_1, status, Unpooled.wrappedBuffer(body));
        res.headers().set(HttpHeaderNames.CONTENT_TYPE, type);
        res.headers().setInt(HttpHeaderNames.CONTENT_LENGTH, body.length);
        res.headers().set("X-Content-Type-Options", "nosniff");
        return res;
    }

    private static void respond(ChannelHandlerContext ctx, FullHttpRequest req, HttpResponseStatus status, String text) {
        send(ctx, req, response(status, text.getBytes(StandardCharsets.UTF_8), "text/plain; charset=utf-8"));
    }

    private static void send(ChannelHandlerContext ctx, FullHttpRequest req, FullHttpResponse res) {
        boolean keepAlive = HttpUtil.isKeepAlive(req) && res.status().code() < 400;
        if (HttpMethod.HEAD.equals(req.method())) {
            res.content().clear();
        }
        if (keepAlive) {
            res.headers().set(HttpHeaderNames.CONNECTION, HttpHeaderValues.KEEP_ALIVE);
            ctx.writeAndFlush(res);
        } else {
            res.headers().set(HttpHeaderNames.CONNECTION, HttpHeaderValues.CLOSE);
            ctx.writeAndFlush(res).addListener(ChannelFutureListener.CLOSE);
        }
    }
}
