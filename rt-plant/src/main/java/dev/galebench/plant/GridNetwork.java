package dev.galebench.plant;

/**
 * The series impedances between the grid-side converter and the grid source, all referred to
 * the LV side (converter-transformer LV voltage) with ideal nominal turns ratios: grid choke,
 * converter transformer, plant transformer, Thevenin grid. Transformer magnetising branches
 * and vector-group phase shifts are not modelled (a three-wire system carries no zero
 * sequence, so the winding connection does not change the currents).
 *
 * <p>A short-circuit impedance {@code u_k} on rating {@code S} is {@code Z = u_k V_LV^2 / S}
 * when referred to LV; R and X follow from X/R; inductance {@code L = X / (2 pi f_nominal)}.
 * The grid: {@code Z = V_LV^2 / (SCR P_rated)}.
 */
final class GridNetwork {
    final double chokeResistanceOhm, chokeInductanceH;
    final double converterTransformerResistanceOhm, converterTransformerInductanceH;
    final double plantTransformerResistanceOhm, plantTransformerInductanceH;
    final double gridResistanceOhm, gridInductanceH;

    GridNetwork(TurbineParameters p, double shortCircuitRatio, double xOverR) {
        final double omega = 2.0 * Math.PI * p.gridFrequencyHz;
        final double vLv2 = p.lvVoltageV * p.lvVoltageV;
        chokeResistanceOhm = p.chokeResistanceOhm;
        chokeInductanceH = p.chokeInductanceH;
        double zct = p.converterTransformerShortCircuitPu * vLv2 / p.converterTransformerRatingVA;
        converterTransformerResistanceOhm = resistance(zct, p.converterTransformerXOverR);
        converterTransformerInductanceH = reactance(zct, p.converterTransformerXOverR) / omega;
        double zpt = p.plantTransformerShortCircuitPu * vLv2 / p.plantTransformerRatingVA;
        plantTransformerResistanceOhm = resistance(zpt, p.plantTransformerXOverR);
        plantTransformerInductanceH = reactance(zpt, p.plantTransformerXOverR) / omega;
        double zg = vLv2 / (shortCircuitRatio * p.ratedPowerW);
        gridResistanceOhm = resistance(zg, xOverR);
        gridInductanceH = reactance(zg, xOverR) / omega;
    }

    GridNetwork(TurbineParameters p) {
        this(p, p.shortCircuitRatio, p.gridXOverR);
    }

    static double resistance(double zOhm, double xOverR) {
        return zOhm / Math.sqrt(1.0 + xOverR * xOverR);
    }

    static double reactance(double zOhm, double xOverR) {
        return zOhm * xOverR / Math.sqrt(1.0 + xOverR * xOverR);
    }

    /** Resistance downstream of the terminal (transformers + grid), ohm. */
    double downstreamResistanceOhm() {
        return converterTransformerResistanceOhm + plantTransformerResistanceOhm + gridResistanceOhm;
    }

    /** Inductance downstream of the terminal (transformers + grid), H. */
    double downstreamInductanceH() {
        return converterTransformerInductanceH + plantTransformerInductanceH + gridInductanceH;
    }
}
