package org.skerry.cli.runfile;

import java.util.Collection;

/**
 * Finds the known key closest to a mistyped one, by Levenshtein edit distance (Levenshtein 1966,
 * Soviet Physics Doklady 10(8)) on the whole dotted path and on its last segment.
 */
public final class KeySuggestion {

    private KeySuggestion() {
    }

    /** The closest candidate, or null when none is within a plausible distance. */
    public static String closest(String key, Collection<String> candidates) {
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        String last = lastSegment(key);
        for (String candidate : candidates) {
            int distance = Math.min(distance(key, candidate), distance(last, lastSegment(candidate)) + 1);
            if (distance < bestDistance || (distance == bestDistance && best != null && candidate.compareTo(best) < 0)) {
                best = candidate;
                bestDistance = distance;
            }
        }
        int limit = Math.max(2, last.length() / 3 + 1);
        return bestDistance <= limit ? best : null;
    }

    private static String lastSegment(String key) {
        int dot = key.lastIndexOf('.');
        return dot < 0 ? key : key.substring(dot + 1);
    }

    static int distance(String a, String b) {
        int[] previous = new int[b.length() + 1];
        int[] current = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            previous[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            current[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int substitution = previous[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                current[j] = Math.min(substitution, Math.min(previous[j] + 1, current[j - 1] + 1));
            }
            int[] swap = previous;
            previous = current;
            current = swap;
        }
        return previous[b.length()];
    }
}
