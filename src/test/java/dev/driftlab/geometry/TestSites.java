package dev.driftlab.geometry;

import java.util.SplittableRandom;

/** Small random and hand-made segment sets for geometry tests. */
final class TestSites {

    private TestSites() {}

    /** Random segments inside the square [0, size]^2, lengths up to maxLength. */
    static SegmentSet randomWalls(SplittableRandom rng, int count, double size, double maxLength) {
        SegmentSet.Builder b = SegmentSet.builder();
        for (int k = 0; k < count; k++) {
            double ax = rng.nextDouble() * size;
            double ay = rng.nextDouble() * size;
            double a = rng.nextDouble() * 2 * Math.PI;
            double len = 0.05 + rng.nextDouble() * maxLength;
            b.add(ax, ay, ax + len * Math.cos(a), ay + len * Math.sin(a));
        }
        return b.build();
    }

    /** Corridor-like site: an outer box with rows of internal walls that leave gaps. */
    static SegmentSet office(double width, double height) {
        SegmentSet.Builder b = SegmentSet.builder();
        b.addOutline(Polygon.rectangle(0, 0, width, height));
        for (double y = 4; y < height; y += 4) {
            for (double x = 0; x < width; x += 5) {
                b.add(x, y, x + 4, y);
            }
        }
        for (double x = 5; x < width; x += 5) {
            for (double y = 0; y < height; y += 4) {
                b.add(x, y + 0.5, x, y + 3.5);
            }
        }
        return b.build();
    }
}
