package dev.galebench.link;

import dev.galebench.board.BoardController;
import dev.galebench.rt.BoardLink;

/** Runs every assertion of {@link AbstractBoardLinkContractTest} in process. */
class InProcessBoardLinkTest extends AbstractBoardLinkContractTest {
    @Override
    BoardLink open(BoardController controller, LinkOptions options) {
        controller.setSamplePeriod(50e-6);
        return BoardLinks.inProcess(controller, options);
    }

    @Override
    void closeBoard() {
        // the board is the controller itself
    }
}
