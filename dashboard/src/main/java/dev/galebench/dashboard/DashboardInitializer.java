package dev.galebench.dashboard;

import io.netty.channel.ChannelInitializer;
import io.netty.channel.ChannelPipeline;
import io.netty.channel.socket.SocketChannel;
import io.netty.handler.codec.http.HttpObjectAggregator;
import io.netty.handler.codec.http.HttpServerCodec;
import io.netty.handler.codec.http.websocketx.WebSocketServerProtocolConfig;
import io.netty.handler.codec.http.websocketx.WebSocketServerProtocolHandler;
import io.netty.handler.timeout.IdleStateHandler;

import java.util.concurrent.TimeUnit;

/**
 * Builds each connection's pipeline, in the order a request travels:
 *
 * <ol>
 *   <li>{@code http}: HTTP/1.1 codec;</li>
 *   <li>{@code aggregate}: whole requests, at most {@value #MAX_REQUEST_BYTES} bytes (the
 *       console sends only GETs and small control messages);</li>
 *   <li>{@code idle}: no read for {@value #READ_IDLE_S} s closes the connection (browsers answer
 *       pings, so only dead peers go quiet that long); no write for {@value #WRITE_IDLE_S} s sends
 *       a ping;</li>
 *   <li>{@code gate}: access rules, pages, uPlot, run folders; admits upgrades on {@code /ws};</li>
 *   <li>{@code websocket}: Netty's handshake, ping/pong and close handling;</li>
 *   <li>{@code session}: joins the hub, passes control messages on.</li>
 * </ol>
 */
final class DashboardInitializer extends ChannelInitializer<SocketChannel> {
    static final int MAX_REQUEST_BYTES = 64 * 1024;
    static final int MAX_CLIENT_FRAME_BYTES = 16 * 1024;
    static final int READ_IDLE_S = 60;
    static final int WRITE_IDLE_S = 20;

    private final StaticResources resources;
    private final Access access;
    private final TelemetryHub hub;
    private final ControlDispatcher dispatcher;
    private final WebSocketServerProtocolConfig wsConfig = WebSocketServerProtocolConfig.newBuilder()
            .websocketPath(HttpGate.WS_PATH)
            .checkStartsWith(true)
            .maxFramePayloadLength(MAX_CLIENT_FRAME_BYTES)
            .handshakeTimeoutMillis(10_000)
            .allowExtensions(false)
            .build();

    DashboardInitializer(StaticResources resources, Access access, TelemetryHub hub, ControlDispatcher dispatcher) {
        this.resources = resources;
        this.access = access;
        this.hub = hub;
        this.dispatcher = dispatcher;
    }

    @Override
    protected void initChannel(SocketChannel ch) {
        ChannelPipeline p = ch.pipeline();
        p.addLast("http", new HttpServerCodec());
        p.addLast("aggregate", new HttpObjectAggregator(MAX_REQUEST_BYTES));
        p.addLast("idle", new IdleStateHandler(READ_IDLE_S, WRITE_IDLE_S, 0, TimeUnit.SECONDS));
        p.addLast("gate", new HttpGate(resources, access, hub));
        p.addLast("websocket", new WebSocketServerProtocolHandler(wsConfig));
        p.addLast("session", new WebSocketSession(hub, dispatcher, access.tokenRequired()));
    }
}
