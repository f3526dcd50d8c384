package dev.driftlab.app.editor;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import javax.imageio.ImageIO;

/**
 * Turns an occupancy image (dark = occupied) into wall blocks for the site plan. PNG and P5
 * greymap (Netpbm) images are read; pixels at or above {@link #DARK_BELOW} brightness, and transparent ones, are
 * free or unknown and add nothing. Dark cells are
 * merged into runs along each row, and runs with the same span on consecutive rows into one
 * rectangle, which keeps a typical scanned map to a few hundred blocks. The counts are capped so a
 * noisy photo is refused with a message instead of producing a plan nobody can edit.
 */
public final class OccupancyImport {

    /** Largest image side accepted, in pixels. */
    public static final int MAX_SIDE = 2000;

    /** Most pixels one image may have; the decoded image takes about 8 bytes a pixel. */
    public static final long MAX_PIXELS = (long) MAX_SIDE * MAX_SIDE;

    /** Images decoded at once: each may take tens of megabytes while it is read. */
    static final int CONCURRENT_DECODES = 2;

    private static final java.util.concurrent.Semaphore DECODES =
            new java.util.concurrent.Semaphore(CONCURRENT_DECODES);

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

    /**
     * What an image gives the plan.
     *
     * @param blocks wall blocks
     * @param extent the whole image as a rectangle in the site frame, for a room around it
     */
    public record Result(List<Block> blocks, Block extent) {}

    /** Brightness 0 to 255 of each pixel, row-major from the top row; -1 for transparent. */
    private record Grey(int width, int height, int[] values) {
        boolean dark(int x, int row) {
            int v = values[row * width + x];
            return v >= 0 && v < DARK_BELOW;
        }
    }

    private OccupancyImport() {}

    /**
     * Reads a PNG or PGM image and returns its dark regions as blocks. The image's bottom-left
     * pixel corner sits at the origin; each pixel is {@code cellSize} metres square.
     *
     * @throws ImportRefused for an unreadable image, bad sizes or too many blocks
     */
    public static Result read(byte[] file, double cellSize, double originX, double originY) {
        if (!(cellSize >= 0.005 && cellSize <= 1)) {
            throw new ImportRefused("cellSize", "must be between 0.005 and 1 m per pixel");
        }
        if (!Double.isFinite(originX) || Math.abs(originX) > 1000) {
            throw new ImportRefused("originX", "must be a number of metres between -1000 and 1000");
        }
        if (!Double.isFinite(originY) || Math.abs(originY) > 1000) {
            throw new ImportRefused("originY", "must be a number of metres between -1000 and 1000");
        }
        if (file.length == 0) {
            throw new ImportRefused("image", "no file was sent");
        }
        Grey image = decodeBounded(file);
        int w = image.width();
        int h = image.height();
        if (w * cellSize > 1000 || h * cellSize > 1000) {
            throw new ImportRefused("cellSize", "the image would cover more than 1 km across; use smaller cells");
        }
        Block extent =
                new Block(round(originX), round(originY), round(originX + w * cellSize), round(originY + h * cellSize));
        return new Result(merge(image, cellSize, originX, originY), extent);
    }

    /** Decodes under the bound on concurrent decodes; waits briefly for a turn, then refuses. */
    private static Grey decodeBounded(byte[] file) {
        boolean pgm = file.length > 2 && file[0] == 'P' && file[1] == '5';
        if (!pgm) {
            pngSides(file);
        }
        boolean turn;
        try {
            turn = DECODES.tryAcquire(2, java.util.concurrent.TimeUnit.SECONDS);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            turn = false;
        }
        if (!turn) {
            throw new ImportRefused("image", "other images are being read just now; try again in a few seconds");
        }
        try {
            return pgm ? Netpbm.greymap(file) : png(file);
        } finally {
            DECODES.release();
        }
    }

    /**
     * Checks the PNG's declared size from its header, before anything is decoded: a small file can
     * declare an image of billions of pixels that decodes to gigabytes.
     */
    private static void pngSides(byte[] png) {
        boolean isPng = png.length > 8 && (png[0] & 0xff) == 0x89 && png[1] == 'P' && png[2] == 'N' && png[3] == 'G';
        if (!isPng) {
            throw new ImportRefused("image", "neither a PNG nor a binary PGM (P5) file");
        }
        try (javax.imageio.stream.ImageInputStream in = ImageIO.createImageInputStream(new ByteArrayInputStream(png))) {
            java.util.Iterator<javax.imageio.ImageReader> readers = ImageIO.getImageReaders(in);
            if (!readers.hasNext()) {
                throw new ImportRefused("image", "the PNG could not be read");
            }
            javax.imageio.ImageReader reader = readers.next();
            try {
                reader.setInput(in, true, true);
                checkSides(reader.getWidth(0), reader.getHeight(0));
            } finally {
                reader.dispose();
            }
        } catch (IOException | RuntimeException e) {
            if (e instanceof ImportRefused r) {
                throw r;
            }
            throw new ImportRefused("image", "the PNG could not be read");
        }
    }

    private static Grey png(byte[] png) {
        boolean isPng = png.length > 8 && (png[0] & 0xff) == 0x89 && png[1] == 'P' && png[2] == 'N' && png[3] == 'G';
        if (!isPng) {
            throw new ImportRefused("image", "neither a PNG nor a binary PGM (P5) file");
        }
        try {
            BufferedImage image = ImageIO.read(new ByteArrayInputStream(png));
            if (image == null) {
                throw new ImportRefused("image", "the PNG could not be read");
            }
            int w = image.getWidth();
            int h = image.getHeight();
            checkSides(w, h);
            int[] values = new int[w * h];
            for (int row = 0; row < h; row++) {
                for (int x = 0; x < w; x++) {
                    values[row * w + x] = brightness(image.getRGB(x, row));
                }
            }
            return new Grey(w, h, values);
        } catch (IOException | RuntimeException e) {
            if (e instanceof ImportRefused r) {
                throw r;
            }
            throw new ImportRefused("image", "the PNG could not be read");
        }
    }

    private static List<Block> merge(Grey image, double cell, double ox, double oy) {
        int w = image.width();
        int h = image.height();
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

    private static List<int[]> runs(Grey image, int row, int w) {
        List<int[]> runs = new ArrayList<>();
        int start = -1;
        for (int x = 0; x <= w; x++) {
            boolean dark = x < w && image.dark(x, row);
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

    private static void checkSides(int w, int h) {
        if (w > MAX_SIDE || h > MAX_SIDE || (long) w * h > MAX_PIXELS) {
            throw new ImportRefused(
                    "image",
                    String.format(
                            java.util.Locale.ROOT,
                            "%d x %d pixels is over the limit of %d pixels a side (%,d pixels in all)",
                            w,
                            h,
                            MAX_SIDE,
                            MAX_PIXELS));
        }
    }

    /** Luma of a pixel (ITU-R BT.601 weights), or -1 when it is transparent: unknown, not a wall. */
    private static int brightness(int argb) {
        int a = (argb >>> 24) & 0xff;
        int r = (argb >>> 16) & 0xff;
        int g = (argb >>> 8) & 0xff;
        int b = argb & 0xff;
        return a < 128 ? -1 : (r * 299 + g * 587 + b * 114) / 1000;
    }

    /** The binary greymap of the Netpbm formats: a short text header, then one sample per pixel. */
    private static final class Netpbm {

        private final byte[] data;
        private int at = 2;

        private Netpbm(byte[] data) {
            this.data = data;
        }

        static Grey greymap(byte[] data) {
            Netpbm p = new Netpbm(data);
            int w = p.number("width");
            int h = p.number("height");
            int max = p.number("maximum grey value");
            if (w < 1 || h < 1 || max < 1 || max > 65535) {
                throw new ImportRefused("image", "the PGM header is not valid");
            }
            checkSides(w, h);
            p.at++; // the single whitespace byte that ends the header
            int bytes = max < 256 ? 1 : 2;
            if ((long) data.length - p.at < (long) w * h * bytes) {
                throw new ImportRefused("image", "the PGM file ends before its last pixel");
            }
            int[] values = new int[w * h];
            for (int k = 0; k < values.length; k++) {
                int v = bytes == 1
                        ? data[p.at + k] & 0xff
                        : ((data[p.at + 2 * k] & 0xff) << 8) | (data[p.at + 2 * k + 1] & 0xff);
                values[k] = (int) Math.round(v * 255.0 / max);
            }
            return new Grey(w, h, values);
        }

        /** The next decimal number of the header, skipping whitespace and # comments. */
        private int number(String what) {
            while (at < data.length) {
                if (data[at] == '#') {
                    while (at < data.length && data[at] != '\n' && data[at] != '\r') {
                        at++;
                    }
                } else if (Character.isWhitespace(data[at])) {
                    at++;
                } else {
                    break;
                }
            }
            long v = 0;
            int digits = 0;
            while (at < data.length && data[at] >= '0' && data[at] <= '9' && digits < 7) {
                v = v * 10 + (data[at] - '0');
                at++;
                digits++;
            }
            if (digits == 0 || (at < data.length && !Character.isWhitespace(data[at]))) {
                throw new ImportRefused("image", "the PGM header has no valid " + what);
            }
            return (int) v;
        }
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
