package dev.driftlab.app.editor;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import javax.imageio.ImageIO;

/**
 * Turns an occupancy image (dark = occupied) into wall blocks for the site plan. Dark cells are
 * merged into runs along each row, and runs with the same span on consecutive rows into one
 * rectangle, which keeps a typical scanned map to a few hundred blocks. The counts are capped so a
 * noisy photo is refused with a message instead of producing a plan nobody can edit.
 */
public final class OccupancyImport {

    /** Largest image side accepted, in pixels. */
    public static final int MAX_SIDE = 2000;

    /** Most wall blocks one import may add. */
    public static final int MAX_BLOCKS = 800;

    /** Brightness (0 to 255) under which a cell counts as occupied. */
    public static final int DARK_BELOW = 100;

    /**
     * One wall block, an axis-aligned rectangle in metres in the site frame (x east, y north).
     *
     * @param x0 west edge
     * @param y0 south edge
     * @param x1 east edge
     * @param y1 north edge
     */
    public record Block(double x0, double y0, double x1, double y1) {}

    private OccupancyImport() {}

    /**
     * Reads a PNG and returns its dark regions as blocks. The image's bottom-left pixel corner sits
     * at the origin; each pixel is {@code cellSize} metres square.
     *
     * @throws ImportRefused for an unreadable image, bad sizes or too many blocks
     */
    public static List<Block> blocks(byte[] png, double cellSize, double originX, double originY) {
        if (!(cellSize >= 0.005 && cellSize <= 1)) {
            throw new ImportRefused("cellSize", "must be between 0.005 and 1 m per pixel");
        }
        if (!Double.isFinite(originX) || Math.abs(originX) > 1000) {
            throw new ImportRefused("originX", "must be a number of metres between -1000 and 1000");
        }
        if (!Double.isFinite(originY) || Math.abs(originY) > 1000) {
            throw new ImportRefused("originY", "must be a number of metres between -1000 and 1000");
        }
        if (png.length == 0) {
            throw new ImportRefused("image", "no file was sent");
        }
        BufferedImage image = read(png);
        int w = image.getWidth();
        int h = image.getHeight();
        if (w > MAX_SIDE || h > MAX_SIDE) {
            throw new ImportRefused(
                    "image", w + " x " + h + " pixels is too large; at most " + MAX_SIDE + " pixels a side");
        }
        if (w * cellSize > 1000 || h * cellSize > 1000) {
            throw new ImportRefused("cellSize", "the image would cover more than 1 km across; use smaller cells");
        }
        return merge(image, cellSize, originX, originY);
    }

    private static BufferedImage read(byte[] png) {
        boolean isPng = png.length > 8 && (png[0] & 0xff) == 0x89 && png[1] == 'P' && png[2] == 'N' && png[3] == 'G';
        if (!isPng) {
            throw new ImportRefused("image", "not a PNG file");
        }
        try {
            BufferedImage image = ImageIO.read(new ByteArrayInputStream(png));
            if (image == null) {
                throw new ImportRefused("image", "the PNG could not be read");
            }
            return image;
        } catch (IOException | RuntimeException e) {
            if (e instanceof ImportRefused r) {
                throw r;
            }
            throw new ImportRefused("image", "the PNG could not be read");
        }
    }

    private static List<Block> merge(BufferedImage image, double cell, double ox, double oy) {
        int w = image.getWidth();
        int h = image.getHeight();
        // open[x0] = {x1, firstRow} for runs still growing downwards through the rows
        List<int[]> open = new ArrayList<>();
        List<Block> out = new ArrayList<>();
        for (int row = 0; row <= h; row++) {
            List<int[]> runs = row < h ? runs(image, row, w) : List.of();
            List<int[]> next = new ArrayList<>();
            for (int[] o : open) {
                int[] same = null;
                for (int[] r : runs) {
                    if (r[0] == o[0] && r[1] == o[1]) {
                        same = r;
                    }
                }
                if (same != null) {
                    runs.remove(same);
                    next.add(o);
                } else {
                    out.add(block(o, row, h, cell, ox, oy));
                    if (out.size() > MAX_BLOCKS) {
                        throw tooMany();
                    }
                }
            }
            for (int[] r : runs) {
                next.add(new int[] {r[0], r[1], row});
            }
            open = next;
        }
        return out;
    }

    private static ImportRefused tooMany() {
        return new ImportRefused(
                "image", "more than " + MAX_BLOCKS + " wall blocks; clean the image or use larger cells");
    }

    private static List<int[]> runs(BufferedImage image, int row, int w) {
        List<int[]> runs = new ArrayList<>();
        int start = -1;
        for (int x = 0; x <= w; x++) {
            boolean dark = x < w && dark(image.getRGB(x, row));
            if (dark && start < 0) {
                start = x;
            } else if (!dark && start >= 0) {
                runs.add(new int[] {start, x});
                start = -1;
            }
        }
        if (runs.size() > MAX_BLOCKS) {
            throw tooMany();
        }
        return runs;
    }

    private static boolean dark(int argb) {
        int a = (argb >>> 24) & 0xff;
        int r = (argb >>> 16) & 0xff;
        int g = (argb >>> 8) & 0xff;
        int b = argb & 0xff;
        // transparent pixels are unknown space, not walls
        return a >= 128 && (r * 299 + g * 587 + b * 114) / 1000 < DARK_BELOW;
    }

    /** Image rows run downwards, the site's y runs north: row r covers y from (h - r - 1) to (h - r). */
    private static Block block(int[] run, int endRow, int h, double cell, double ox, double oy) {
        double x0 = ox + run[0] * cell;
        double x1 = ox + run[1] * cell;
        double y1 = oy + (h - run[2]) * cell;
        double y0 = oy + (h - endRow) * cell;
        return new Block(round(x0), round(y0), round(x1), round(y1));
    }

    private static double round(double v) {
        return Math.round(v * 1e6) / 1e6;
    }
}
