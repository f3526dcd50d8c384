package dev.driftlab.geometry;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Optional;

/**
 * The one rule for cutting door openings out of walls. An opening opens every wall lying along it:
 * a wall whose infinite line passes within {@link #SAME_WALL} of both ends of the opening, cut where
 * the opening, projected onto the wall, overlaps it. So a door on the shared wall of two adjacent
 * rooms is one passage even when the two rooms were drawn a few millimetres apart, and a wall only
 * partly behind a door is cut where it is behind it.
 *
 * <p>Pure functions on segments and outlines: the scenario validator (which may not see the site
 * stage) and {@code site.WallPieces} (which maps rooms and doors onto this for the compiler, the
 * drawings, the player and the editor) both call it, so a drawing can never show a passage the
 * simulated world does not have.
 */
public final class Walls {

    /**
     * How far (metres) a wall's line may pass from the ends of an opening and still count as the
     * wall the opening is in. One centimetre: more than drawing on a 1 cm snap or rounding in a
     * file gives, less than any wall thickness a plan would draw as two walls.
     */
    public static final double SAME_WALL = 0.01;

    /** Pieces shorter than this (metres) are dropped: they are rounding left by a cut at a corner. */
    private static final double MIN_PIECE = 1e-12;

    private Walls() {}

    /**
     * The wall pieces of the given outlines once every opening is cut out of every wall lying along
     * it (see the class comment). Outlines with fewer than three corners have no walls; edges of
     * zero length are dropped.
     *
     * @param outlines closed room outlines, metres
     * @param openings the segments across open door gaps, metres
     * @return wall pieces, outline by outline and edge by edge, each running in its edge's direction
     */
    public static List<Segment> pieces(List<Polygon> outlines, List<Segment> openings) {
        List<Segment> out = new ArrayList<>();
        List<double[]> spans = new ArrayList<>();
        for (Polygon outline : outlines) {
            if (outline.corners().size() < 3) {
                continue;
            }
            for (int i = 0; i < outline.edgeCount(); i++) {
                Segment edge = outline.edge(i);
                spans.clear();
                for (Segment opening : openings) {
                    spanOn(edge, opening).ifPresent(spans::add);
                }
                cutSpans(edge, spans, out);
            }
        }
        return List.copyOf(out);
    }

    /**
     * Where an opening lies along a wall: {@code {start, end}} in metres from the wall's first
     * corner, clipped to the wall, when both ends of the opening lie within {@link #SAME_WALL} of the
     * wall's line and the clipped span is not empty.
     *
     * @param wall the wall
     * @param opening the segment across a door gap
     * @return the span to cut, or empty when the opening does not open this wall
     */
    public static Optional<double[]> spanOn(Segment wall, Segment opening) {
        double len = wall.length();
        if (!(len > 0) || !(opening.length() > 0)) {
            return Optional.empty();
        }
        double ux = (wall.b().x() - wall.a().x()) / len;
        double uy = (wall.b().y() - wall.a().y()) / len;
        double ax = opening.a().x() - wall.a().x();
        double ay = opening.a().y() - wall.a().y();
        double bx = opening.b().x() - wall.a().x();
        double by = opening.b().y() - wall.a().y();
        if (Math.abs(ax * uy - ay * ux) > SAME_WALL || Math.abs(bx * uy - by * ux) > SAME_WALL) {
            return Optional.empty();
        }
        double sa = ax * ux + ay * uy;
        double sb = bx * ux + by * uy;
        double s = Math.max(0, Math.min(sa, sb));
        double e = Math.min(len, Math.max(sa, sb));
        return e > s ? Optional.of(new double[] {s, e}) : Optional.empty();
    }

    /**
     * The opening a door leaves in its own wall: the segment across it, clipped to the wall.
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

    /** Adds the pieces of one wall left once the spans (any order, may overlap) are cut out. */
    private static void cutSpans(Segment edge, List<double[]> spans, List<Segment> out) {
        double len = edge.length();
        if (!(len > 0)) {
            return;
        }
        spans.sort(Comparator.comparingDouble(g -> g[0]));
        double cursor = 0;
        for (double[] g : spans) {
            if (g[0] > cursor) {
                addPiece(out, edge, len, cursor, g[0]);
            }
            cursor = Math.max(cursor, g[1]);
        }
        if (len > cursor) {
            addPiece(out, edge, len, cursor, len);
        }
    }

    private static void addPiece(List<Segment> pieces, Segment edge, double len, double s, double e) {
        if (e - s < MIN_PIECE) {
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
