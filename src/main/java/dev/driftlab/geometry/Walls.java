package dev.driftlab.geometry;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/**
 * Cuts the walls of a closed outline into wall pieces around door gaps. Pure functions on plain
 * data, so that both the site compiler and the scenario validator can use them.
 */
public final class Walls {

    private Walls() {}

    /**
     * The wall pieces of an outline once the given gaps are cut out. Edge {@code i} of the outline
     * runs from corner i to corner i+1. Gap {@code k} sits on edge {@code gapWall[k]}, centred
     * {@code gapAlong[k]} metres from that edge's first corner, {@code gapWidth[k]} metres wide.
     * Gaps that reach past the ends of their wall are clipped to it; overlapping gaps merge. Pieces
     * shorter than 1e-12 m are dropped. Gaps whose wall index is out of range are ignored (the
     * validator reports them).
     *
     * @param outline room outline in metres
     * @param gapWall wall (edge) index of each gap
     * @param gapAlong distance in metres from the wall's first corner to each gap's centre
     * @param gapWidth width in metres of each gap, not negative
     * @return wall pieces in edge order, each running in the edge's direction
     * @throws IllegalArgumentException if the three gap arrays differ in length or hold non-finite
     *     values
     */
    public static List<Segment> cut(Polygon outline, int[] gapWall, double[] gapAlong, double[] gapWidth) {
        if (gapWall.length != gapAlong.length || gapWall.length != gapWidth.length) {
            throw new IllegalArgumentException("gap arrays must have equal lengths, got " + gapWall.length + ", "
                    + gapAlong.length + ", " + gapWidth.length);
        }
        for (int k = 0; k < gapWall.length; k++) {
            if (!Double.isFinite(gapAlong[k]) || !Double.isFinite(gapWidth[k]) || gapWidth[k] < 0) {
                throw new IllegalArgumentException("gap " + k + ": along and width must be finite, width >= 0");
            }
        }
        List<Segment> pieces = new ArrayList<>();
        int n = outline.edgeCount();
        if (n < 2) {
            return pieces;
        }
        for (int i = 0; i < n; i++) {
            List<double[]> spans = new ArrayList<>();
            for (int k = 0; k < gapWall.length; k++) {
                if (gapWall[k] == i) {
                    spans.add(new double[] {gapAlong[k] - gapWidth[k] / 2, gapAlong[k] + gapWidth[k] / 2});
                }
            }
            pieces.addAll(cutSpans(outline.edge(i), spans));
        }
        return List.copyOf(pieces);
    }

    /**
     * The pieces of one wall once gaps are cut out of it. Each gap is {@code {start, end}} in metres
     * from the wall's first corner; gaps may come in any order, overlap, or reach past the wall's
     * ends (they are clipped to it). Pieces shorter than 1e-12 m are dropped.
     *
     * @param edge the wall
     * @param gaps the spans to cut out
     * @return wall pieces in order, each running in the wall's direction
     */
    public static List<Segment> cutSpans(Segment edge, List<double[]> gaps) {
        double len = edge.length();
        List<double[]> sorted = new ArrayList<>(gaps.size());
        for (double[] g : gaps) {
            double s = Math.max(0, g[0]);
            double e = Math.min(len, g[1]);
            if (e > s) {
                sorted.add(new double[] {s, e});
            }
        }
        sorted.sort(Comparator.comparingDouble(g -> g[0]));
        List<Segment> pieces = new ArrayList<>();
        double cursor = 0;
        for (double[] g : sorted) {
            if (g[0] > cursor) {
                addPiece(pieces, edge, len, cursor, g[0]);
            }
            cursor = Math.max(cursor, g[1]);
        }
        if (len > cursor) {
            addPiece(pieces, edge, len, cursor, len);
        }
        return pieces;
    }

    /**
     * The opening a gap leaves in a wall: the segment across it, clipped to the wall. Used for a
     * closed door, which blocks exactly its gap.
     *
     * @param outline room outline in metres
     * @param wall edge index, 0 to edgeCount - 1
     * @param along distance in metres from the wall's first corner to the gap's centre
     * @param width gap width in metres, not negative
     * @return the gap segment, in the edge's direction
     * @throws IllegalArgumentException if the wall index is out of range or the values are not
     *     finite
     */
    public static Segment gap(Polygon outline, int wall, double along, double width) {
        if (wall < 0 || wall >= outline.edgeCount()) {
            throw new IllegalArgumentException("wall index " + wall + " is outside 0.." + (outline.edgeCount() - 1));
        }
        if (!Double.isFinite(along) || !Double.isFinite(width) || width < 0) {
            throw new IllegalArgumentException("along and width must be finite, width >= 0");
        }
        Segment edge = outline.edge(wall);
        double len = edge.length();
        double s = Math.max(0, Math.min(len, along - width / 2));
        double e = Math.max(0, Math.min(len, along + width / 2));
        return new Segment(pointAlong(edge, len, s), pointAlong(edge, len, e));
    }

    private static void addPiece(List<Segment> pieces, Segment edge, double len, double s, double e) {
        if (e - s < 1e-12) {
            return;
        }
        Point a = s == 0 ? edge.a() : pointAlong(edge, len, s);
        Point b = e == len ? edge.b() : pointAlong(edge, len, e);
        pieces.add(new Segment(a, b));
    }

    private static Point pointAlong(Segment edge, double len, double d) {
        if (len == 0) {
            return edge.a();
        }
        double f = d / len;
        return new Point(
                edge.a().x() + f * (edge.b().x() - edge.a().x()),
                edge.a().y() + f * (edge.b().y() - edge.a().y()));
    }
}
