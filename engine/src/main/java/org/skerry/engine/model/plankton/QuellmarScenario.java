package org.skerry.engine.model.plankton;

import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import org.skerry.engine.model.prior.IndependentPrior;

/**
 * The invented demonstration scenario: the Quellmar Basin Water Board (fictional) runs twelve
 * buoys on Lake Quellmar (fictional), each recording chlorophyll-a weekly through one season.
 * This class states the truth the synthetic data are generated from: per buoy, the parameters
 * and initial nutrient ({@link QuellmarBuoy}); for all buoys, the constants of
 * {@link PlanktonConstants#defaults()} and sigmoidal grazing ({@link #TRUE_GRAZING}); and the
 * season, weekly from day 0. The NPZ structure is that of Franks, Wroblewski &amp; Flierl
 * (1986), Marine Biology 91; every number here is made up.
 */
public final class QuellmarScenario {

    /** The grazing response the synthetic data are generated with. */
    public static final GrazingResponse TRUE_GRAZING = GrazingResponse.SIGMOIDAL;
    /** Observations in a full season: weekly from day 0 to day 175. */
    public static final int FULL_SEASON = 26;
    /** Days between observations. */
    public static final double SAMPLING_INTERVAL_DAYS = 7.0;
    /** The number of the buoy the demonstration calibrates. */
    public static final int DEMO_BUOY = 7;

    // mu_max, k_n, g_max, k_p, m_p, sigma, N0: invented, near the default priors' medians.
    private static final double[][] TABLE = {
        {0.92, 0.46, 1.06, 0.94, 0.095, 0.18, 4.1},
        {1.04, 0.53, 0.97, 1.07, 0.110, 0.21, 4.8},
        {1.12, 0.61, 1.10, 0.91, 0.102, 0.17, 5.6},
        {0.87, 0.41, 0.93, 1.13, 0.085, 0.22, 3.7},
        {1.06, 0.56, 1.01, 1.02, 0.118, 0.19, 4.4},
        {0.97, 0.47, 1.08, 0.86, 0.098, 0.24, 5.2},
        {1.02, 0.50, 0.99, 1.04, 0.100, 0.20, 4.6},
        {0.94, 0.44, 1.04, 0.97, 0.092, 0.18, 3.9},
        {1.09, 0.58, 0.95, 1.10, 0.107, 0.23, 5.9},
        {0.99, 0.52, 1.12, 0.89, 0.104, 0.20, 4.3},
        {0.90, 0.43, 0.96, 1.05, 0.089, 0.19, 3.5},
        {1.07, 0.49, 1.03, 0.99, 0.113, 0.21, 5.0},
    };

    private static final List<QuellmarBuoy> BUOYS;

    static {
        List<QuellmarBuoy> buoys = new ArrayList<>();
        for (int b = 0; b < TABLE.length; b++) {
            double[] row = TABLE[b];
            double[] parameters = new double[row.length - 1];
            System.arraycopy(row, 0, parameters, 0, parameters.length);
            buoys.add(new QuellmarBuoy(b + 1, parameters, row[row.length - 1]));
        }
        BUOYS = Collections.unmodifiableList(buoys);
    }

    private QuellmarScenario() {
    }

    /** The twelve buoys, {@code buoy-01} to {@code buoy-12}. */
    public static List<QuellmarBuoy> buoys() {
        return BUOYS;
    }

    /** The buoy numbered {@code number} (1 to 12). */
    public static QuellmarBuoy buoy(int number) {
        if (number < 1 || number > BUOYS.size()) {
            throw new IllegalArgumentException("buoy number must be in [1, " + BUOYS.size() + "], was " + number);
        }
        return BUOYS.get(number - 1);
    }

    /** The buoy named {@code name}, for example {@code buoy-07}. */
    public static QuellmarBuoy buoy(String name) {
        for (QuellmarBuoy buoy : BUOYS) {
            if (buoy.name().equals(name)) {
                return buoy;
            }
        }
        throw new IllegalArgumentException("unknown buoy '" + name + "'; buoys are buoy-01 to buoy-"
                + String.format("%02d", BUOYS.size()));
    }

    /** The buoy the demonstration calibrates, {@code buoy-07}. */
    public static QuellmarBuoy demoBuoy() {
        return buoy(DEMO_BUOY);
    }

    /**
     * The observation days of a season of {@code observations} weekly samples: 0, 7, 14, …
     *
     * @throws IllegalArgumentException if {@code observations} is not in [1, {@link #FULL_SEASON}]
     */
    public static double[] seasonDays(int observations) {
        if (observations < 1 || observations > FULL_SEASON) {
            throw new IllegalArgumentException("observations must be in [1, " + FULL_SEASON + "], was "
                    + observations);
        }
        double[] days = new double[observations];
        for (int j = 0; j < observations; j++) {
            days[j] = SAMPLING_INTERVAL_DAYS * j;
        }
        return days;
    }

    /** The true dynamics at {@code buoy} over a season of {@code observations} weeks. */
    public static PlanktonDynamics dynamics(QuellmarBuoy buoy, int observations) {
        return PlanktonDynamics.of(TRUE_GRAZING, buoy.constants(), seasonDays(observations));
    }

    /**
     * The model an analyst would fit to {@code rows} (columns day, chlorophyll, as from
     * {@link QuellmarData#generate}) at {@code buoy}, with the given grazing variant and the
     * default priors.
     */
    public static PlanktonModel model(QuellmarBuoy buoy, double[][] rows, GrazingResponse grazing) {
        return model(buoy, rows, grazing, PlanktonPriors.defaults());
    }

    /** As {@link #model(QuellmarBuoy, double[][], GrazingResponse)}, with another prior. */
    public static PlanktonModel model(QuellmarBuoy buoy, double[][] rows, GrazingResponse grazing,
            IndependentPrior prior) {
        double[] days = new double[rows.length];
        double[] chlorophyll = new double[rows.length];
        for (int j = 0; j < rows.length; j++) {
            days[j] = rows[j][0];
            chlorophyll[j] = rows[j][1];
        }
        return PlanktonModel.of(grazing, buoy.constants(), prior, days, chlorophyll);
    }
}
