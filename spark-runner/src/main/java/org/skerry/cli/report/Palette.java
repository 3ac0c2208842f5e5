package org.skerry.cli.report;

import java.awt.Color;

/**
 * The report's colours: the eight-colour palette of Okabe and Ito ("Color Universal Design",
 * 2008), chosen so that the series stay distinguishable with the common forms of colour-vision
 * deficiency; lines also differ by dash or marker where two share a plot, so print in grey reads.
 */
final class Palette {

    static final Color BLACK = new Color(0x000000);
    static final Color ORANGE = new Color(0xE69F00);
    static final Color SKY_BLUE = new Color(0x56B4E9);
    static final Color BLUISH_GREEN = new Color(0x009E73);
    static final Color BLUE = new Color(0x0072B2);
    static final Color VERMILLION = new Color(0xD55E00);
    static final Color REDDISH_PURPLE = new Color(0xCC79A7);

    /** A plot's background: light enough that every palette colour keeps its contrast. */
    static final Color BACKGROUND = new Color(0xF7F7F7);
    static final Color GRID = new Color(0xD0D0D0);

    /**
     * Colours for series told apart by colour, in order of use: the strongest contrasts first, so
     * two or three series (the common case) get the most distinct pair or triple.
     */
    static final java.util.List<Color> SERIES = java.util.List.of(BLUE, VERMILLION, BLUISH_GREEN, ORANGE,
            REDDISH_PURPLE, SKY_BLUE, BLACK);

    private Palette() {
    }

    /** The colour of series {@code i} (from 0), repeating after {@link #SERIES}'s seven. */
    static Color series(int i) {
        return SERIES.get(Math.floorMod(i, SERIES.size()));
    }

    /**
     * A shade of {@link #BLUE} for a share {@code t} in [0, 1] of the largest value: white mixed
     * toward blue, so density reads as lightness alone (one hue, safe for every colour vision).
     */
    static Color blueShade(double t) {
        double s = Math.max(0, Math.min(1, t));
        // Start at 12 % so the smallest non-empty cell still differs from the white background.
        double f = 0.12 + 0.88 * s;
        return new Color(mix(255, BLUE.getRed(), f), mix(255, BLUE.getGreen(), f), mix(255, BLUE.getBlue(), f));
    }

    private static int mix(int from, int to, double f) {
        return (int) Math.round(from + (to - from) * f);
    }
}
