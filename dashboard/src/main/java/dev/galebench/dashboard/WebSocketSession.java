package dev.galebench.dashboard;

import io.netty.channel.ChannelHandlerContext;
import io.netty.channel.SimpleChannelInboundHandler;
import io.netty.handler.codec.http.websocketx.PingWebSocketFrame;
import io.netty.handler.codec.http.websocketx.TextWebSocketFrame;
import io.netty.handler.codec.http.websocketx.WebSocketFrame;
import io.netty.handler.codec.http.websocketx.WebSocketServerProtocolHandler;
import io.netty.handler.timeout.IdleState;
import io.netty.handler.timeout.IdleStateEvent;

/**
 * One console's socket after the handshake: joins the {@link TelemetryHub} (which sends the
 * catch-up), hands text messages to the {@link ControlDispatcher}, pings when it has been quiet
 * and closes a socket whose browser stopped answering, so a vanished tab is released within
 * a minute even without a TCP reset. Netty's protocol handler before it answers pings and
 * closes; this handler never sees those.
 */
final class WebSocketSession extends SimpleChannelInboundHandler<WebSocketFrame> {
    private final TelemetryHub hub;
    private final ControlDispatcher dispatcher;
    private final boolean tokenRequired;
    private boolean open;

    WebSocketSession(TelemetryHub hub, ControlDispatcher dispatcher, boolean tokenRequired) {
        this.hub = hub;
        this.dispatcher = dispatcher;
        this.tokenRequired = tokenRequired;
    }

    @Override
    public void userEventTriggered(ChannelHandlerContext ctx, Object evt) throws Exception {
        if (evt instanceof WebSocketServerProtocolHandler.HandshakeComplete) {
            open = true;
            Long after = ctx.channel().attr(HttpGate.RESUME_AFTER).get();
            hub.join(ctx.channel(), role(ctx), tokenRequired, ctx.channel().attr(HttpGate.RESUME_STREAM).get(),
                    after == null ? -1 : after);
        } else if (evt instanceof IdleStateEvent) {
            IdleState s = ((IdleStateEvent) evt).state();
            if (s == IdleState.READER_IDLE) {
                ctx.close();
            } else if (s == IdleState.WRITER_IDLE && open) {
                ctx.writeAndFlush(new PingWebSocketFrame());
            }
        } else {
            super.userEventTriggered(ctx, evt);
        }
    }

    @Override
    protected void channelRead0(ChannelHandlerContext ctx, WebSocketFrame frame) {
        if (frame instanceof TextWebSocketFrame) {
            dispatcher.onMessage(ctx.channel(), role(ctx), ((TextWebSocketFrame) frame).text());
        }
    }

    @Override
    public void exceptionCaught(ChannelHandlerContext ctx, Throwable cause) {
        // A browser that vanished mid-write, or garbage on the socket: drop that socket only.
        ctx.close();
    }

    private static Access.Role role(ChannelHandlerContext ctx) {
        Access.Role r = ctx.channel().attr(HttpGate.ROLE).get();
        return r == null ? Access.Role.VIEW : r;
    }
}
