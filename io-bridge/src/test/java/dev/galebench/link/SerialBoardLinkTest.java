package dev.galebench.link;

import dev.galebench.board.BoardController;
import dev.galebench.board.VirtualBoard;
import dev.galebench.rt.BoardLink;
import dev.galebench.support.PtyPair;

/**
 * Runs every assertion of {@link AbstractBoardLinkContractTest} over a fresh socat pty pair.
 */
class SerialBoardLinkTest extends AbstractBoardLinkContractTest {
    private PtyPair pty;
    private VirtualBoard board;
    private Thread thread;

    @Override
    BoardLink open(BoardController controller, LinkOptions options) throws Exception {
        pty = PtyPair.open();
        board = VirtualBoard.serial(pty.second(), 921600, options.profile(), controller, 50e-6);
        thread = new Thread(board::run, "serial-board");
        thread.setDaemon(true);
        thread.start();
        return BoardLinks.open("serial:" + pty.first() + "@921600", options);
    }

    @Override
    void closeBoard() throws InterruptedException {
        if (board != null) {
            board.close();
            thread.join(5000);
            board = null;
        }
        if (pty != null) {
            pty.close();
            pty = null;
        }
    }
}
