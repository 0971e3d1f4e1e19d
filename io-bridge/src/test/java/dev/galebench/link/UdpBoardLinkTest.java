package dev.galebench.link;

import dev.galebench.board.BoardController;
import dev.galebench.board.VirtualBoard;
import dev.galebench.rt.BoardLink;
import java.net.InetSocketAddress;

/**
 * Runs every assertion of {@link AbstractBoardLinkContractTest} over real loopback UDP sockets.
 */
class UdpBoardLinkTest extends AbstractBoardLinkContractTest {
    private VirtualBoard board;
    private Thread thread;

    @Override
    BoardLink open(BoardController controller, LinkOptions options) {
        board = VirtualBoard.udp(new InetSocketAddress("127.0.0.1", 0), options.profile(), controller, 50e-6);
        thread = new Thread(board::run, "udp-board");
        thread.setDaemon(true);
        thread.start();
        return BoardLinks.open("udp://127.0.0.1:" + board.udpPort(), options);
    }

    @Override
    void closeBoard() throws InterruptedException {
        if (board != null) {
            board.close();
            thread.join(5000);
            board = null;
        }
    }
}
