package dev.galebench.board.control;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class TransformsTest {
    @Test
    void shouldMatchTheReferenceTestVector() {
        // REFERENCES.md section 5 [D]: theta 0.5 rad, (1, -0.2, -0.8) -> d 1.043660, q -0.175422
        final double al = Transforms.alpha(1.0, -0.2, -0.8);
        final double be = Transforms.beta(-0.2, -0.8);
        final double c = Math.cos(0.5);
        final double s = Math.sin(0.5);
        assertEquals(1.043660, Transforms.d(al, be, c, s), 1e-6);
        assertEquals(-0.175422, Transforms.q(al, be, c, s), 1e-6);
    }

    @Test
    void shouldKeepAmplitudeOfBalancedSetAndPutQAheadOfD() {
        // amplitude-invariant: a balanced set of peak 325 V at angle th gives d = 325, q = 0 in a frame at th;
        // a frame 90 degrees behind sees the vector on +q (q leads d)
        final double th = 1.234;
        final double a = 325 * Math.cos(th);
        final double b = 325 * Math.cos(th - 2 * Math.PI / 3);
        final double cc = 325 * Math.cos(th + 2 * Math.PI / 3);
        final double al = Transforms.alpha(a, b, cc);
        final double be = Transforms.beta(b, cc);
        assertEquals(325.0, Transforms.d(al, be, Math.cos(th), Math.sin(th)), 1e-9);
        assertEquals(0.0, Transforms.q(al, be, Math.cos(th), Math.sin(th)), 1e-9);
        final double behind = th - Math.PI / 2;
        assertEquals(325.0, Transforms.q(al, be, Math.cos(behind), Math.sin(behind)), 1e-9);
    }

    @Test
    void shouldInvertParkAndClarke() {
        final double th = 4.0;
        final double c = Math.cos(th);
        final double s = Math.sin(th);
        final double al = Transforms.alphaOf(10.0, -3.0, c, s);
        final double be = Transforms.betaOf(10.0, -3.0, c, s);
        final double a = al;
        final double b = Transforms.phaseB(al, be);
        final double cc = Transforms.phaseC(al, be);
        assertEquals(0.0, a + b + cc, 1e-12);
        final double al2 = Transforms.alpha(a, b, cc);
        final double be2 = Transforms.beta(b, cc);
        assertEquals(10.0, Transforms.d(al2, be2, c, s), 1e-12);
        assertEquals(-3.0, Transforms.q(al2, be2, c, s), 1e-12);
    }
}
