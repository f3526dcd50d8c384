package dev.driftlab.recording;

import dev.driftlab.geometry.Bounds;
import dev.driftlab.geometry.Pose;
import java.io.ByteArrayOutputStream;
import java.io.DataInputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.DataFormatException;
import java.util.zip.Deflater;
import java.util.zip.Inflater;

/**
 * Compact, lossy encoding of frames for playback. Particles are quantised for display, sorted by x
 * and stored as byte planes so that the general-purpose deflate step finds the redundancy of a
 * clustered particle set. Quantisation bounds, which the tests check:
 *
 * <ul>
 *   <li>particle position: within half of the position step, {@code max(1 cm, extent / 65535)}
 *       (so within 5 mm for sites up to 655 m across);
 *   <li>particle heading: within pi / 256 rad (0.7 degrees);
 *   <li>particle weight: relative error within 2.8 % for weights above a millionth of the largest;
 *       smaller weights read back as a millionth of the largest;
 *   <li>ranges: within half of {@code maxRange / 65535} metres (under 1 mm for a 100 m scanner).
 * </ul>
 *
 * Poses, hypotheses and filter figures are kept at full double precision.
 */
public final class FrameCodec {

    private static final int VERSION = 1;
    private static final double WEIGHT_RANGE = Math.log(1e6);

    private final double originX;
    private final double originY;
    private final double step;
    private final double maxRange;

    /**
     * A codec for one run.
     *
     * @param bounds where particles may be, metres (site bounds)
     * @param maxRange the rangefinder's max range, metres
     */
    public FrameCodec(Bounds bounds, double maxRange) {
        if (!(bounds.width() > 0 && bounds.height() > 0 && maxRange > 0)) {
            throw new IllegalArgumentException("frame codec needs a non-empty area and a positive max range");
        }
        this.originX = bounds.minX();
        this.originY = bounds.minY();
        this.step = Math.max(0.01, Math.max(bounds.width(), bounds.height()) / 65535.0);
        this.maxRange = maxRange;
    }

    /** Position quantisation step, metres. */
    public double positionStep() {
        return step;
    }

    /** Encodes and deflates one frame. */
    public byte[] encode(Frame f) {
        try {
            ByteArrayOutputStream bytes = new ByteArrayOutputStream(4096 + f.particleCount() * 6);
            DataOutputStream out = new DataOutputStream(bytes);
            out.writeInt(VERSION);
            out.writeInt(f.index());
            out.writeDouble(f.time());
            pose(out, f.truth());
            pose(out, f.odometry());
            pose(out, f.estimate());
            out.writeDouble(f.effectiveSize());
            out.writeDouble(f.meanLikelihood());
            out.writeDouble(f.slowAverage());
            out.writeDouble(f.fastAverage());
            out.writeInt(f.injected());
            out.writeInt(f.hypotheses().size());
            for (FrameHypothesis h : f.hypotheses()) {
                out.writeDouble(h.weight());
                out.writeDouble(h.x());
                out.writeDouble(h.y());
                out.writeDouble(h.heading());
                out.writeDouble(h.cxx());
                out.writeDouble(h.cxy());
                out.writeDouble(h.cyy());
            }
            out.writeInt(f.events().size());
            for (String e : f.events()) {
                out.writeUTF(e);
            }
            out.writeInt(f.ranges().length);
            for (float r : f.ranges()) {
                out.writeShort(quantRange(r));
            }
            particles(out, f);
            out.flush();
            return deflate(bytes.toByteArray());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private void particles(DataOutputStream out, Frame f) throws IOException {
        int n = f.particleCount();
        out.writeInt(n);
        if (n == 0) {
            return;
        }
        int[] qx = new int[n];
        long[] keys = new long[n];
        float wMax = 0;
        for (int i = 0; i < n; i++) {
            wMax = Math.max(wMax, f.particleWeight()[i]);
        }
        for (int i = 0; i < n; i++) {
            qx[i] = quantPos(f.particleX()[i], originX);
            keys[i] = ((long) qx[i] << 32) | i;
        }
        java.util.Arrays.sort(keys);
        out.writeFloat(wMax);
        byte[] plane = new byte[n];
        int prev = 0;
        int[] dx = new int[n];
        for (int k = 0; k < n; k++) {
            int i = (int) keys[k];
            dx[k] = qx[i] - prev;
            prev = qx[i];
        }
        writePlane(out, plane, n, k -> dx[k] >>> 8);
        writePlane(out, plane, n, k -> dx[k]);
        writePlane(out, plane, n, k -> quantPos(f.particleY()[(int) keys[k]], originY) >>> 8);
        writePlane(out, plane, n, k -> quantPos(f.particleY()[(int) keys[k]], originY));
        writePlane(out, plane, n, k -> quantHeading(f.particleHeading()[(int) keys[k]]));
        final float wm = wMax;
        writePlane(out, plane, n, k -> quantWeight(f.particleWeight()[(int) keys[k]], wm));
    }

    private interface ByteAt {
        int at(int k);
    }

    private static void writePlane(DataOutputStream out, byte[] plane, int n, ByteAt f) throws IOException {
        for (int k = 0; k < n; k++) {
            plane[k] = (byte) f.at(k);
        }
        out.write(plane, 0, n);
    }

    /** Inflates and decodes one frame. */
    public Frame decode(byte[] data) {
        try {
            DataInputStream in = new DataInputStream(new java.io.ByteArrayInputStream(inflate(data)));
            int version = in.readInt();
            if (version != VERSION) {
                throw new IllegalArgumentException("frame format " + version + " is not readable by this build");
            }
            int index = in.readInt();
            double time = in.readDouble();
            Pose truth = pose(in);
            Pose odom = pose(in);
            Pose est = pose(in);
            double ess = in.readDouble();
            double lik = in.readDouble();
            double slow = in.readDouble();
            double fast = in.readDouble();
            int injected = in.readInt();
            int nh = in.readInt();
            List<FrameHypothesis> hyps = new ArrayList<>(nh);
            for (int i = 0; i < nh; i++) {
                hyps.add(new FrameHypothesis(
                        in.readDouble(),
                        in.readDouble(),
                        in.readDouble(),
                        in.readDouble(),
                        in.readDouble(),
                        in.readDouble(),
                        in.readDouble()));
            }
            int ne = in.readInt();
            List<String> events = new ArrayList<>(ne);
            for (int i = 0; i < ne; i++) {
                events.add(in.readUTF());
            }
            int nb = in.readInt();
            float[] ranges = new float[nb];
            for (int i = 0; i < nb; i++) {
                ranges[i] = (float) (in.readUnsignedShort() * maxRange / 65535.0);
            }
            int n = in.readInt();
            float[] x = new float[n];
            float[] y = new float[n];
            float[] h = new float[n];
            float[] w = new float[n];
            if (n > 0) {
                float wMax = in.readFloat();
                byte[] hi = new byte[n];
                byte[] lo = new byte[n];
                in.readFully(hi);
                in.readFully(lo);
                int q = 0;
                for (int k = 0; k < n; k++) {
                    q += ((hi[k] & 0xff) << 8) | (lo[k] & 0xff);
                    x[k] = (float) (originX + q * step);
                }
                in.readFully(hi);
                in.readFully(lo);
                for (int k = 0; k < n; k++) {
                    y[k] = (float) (originY + (((hi[k] & 0xff) << 8) | (lo[k] & 0xff)) * step);
                }
                in.readFully(lo);
                for (int k = 0; k < n; k++) {
                    h[k] = (float) dev.driftlab.geometry.Angles.wrap((lo[k] & 0xff) * (2 * Math.PI / 256));
                }
                in.readFully(lo);
                for (int k = 0; k < n; k++) {
                    w[k] = (float) (wMax * Math.exp(-(lo[k] & 0xff) * WEIGHT_RANGE / 255.0));
                }
            }
            return new Frame(
                    index, time, truth, odom, est, hyps, ess, lik, slow, fast, injected, ranges, x, y, h, w, events);
        } catch (IOException e) {
            throw new IllegalArgumentException("frame data is damaged: " + e.getMessage(), e);
        }
    }

    /**
     * How much one frame holds, for a size estimate before decoding it.
     *
     * @param hypotheses hypotheses (clusters) listed
     * @param eventChars characters of its event texts together
     * @param beams ranges of the scan
     * @param particles particles
     */
    public record Shape(int hypotheses, int eventChars, int beams, int particles) {}

    /**
     * Reads what a frame holds from its head alone: only the start of the deflated data is
     * inflated (the particles, most of a frame, come last and are never read), so this costs a few
     * kilobytes whatever the particle count.
     *
     * @throws IllegalArgumentException when the frame is damaged
     */
    public static Shape shape(byte[] data) {
        try (DataInputStream in =
                new DataInputStream(new java.util.zip.InflaterInputStream(new java.io.ByteArrayInputStream(data)))) {
            int version = in.readInt();
            if (version != VERSION) {
                throw new IllegalArgumentException("frame format " + version + " is not readable by this build");
            }
            // index, time, three poses, four filter figures, injected
            in.skipNBytes(4 + 8 + 3 * 24 + 4 * 8 + 4);
            int nh = in.readInt();
            in.skipNBytes(56L * Math.max(0, nh));
            int ne = in.readInt();
            int chars = 0;
            for (int i = 0; i < ne; i++) {
                chars += in.readUTF().length();
            }
            int nb = in.readInt();
            in.skipNBytes(2L * Math.max(0, nb));
            int n = in.readInt();
            if (nh < 0 || ne < 0 || nb < 0 || n < 0) {
                throw new IllegalArgumentException("frame data is damaged: negative count");
            }
            return new Shape(nh, chars, nb, n);
        } catch (IOException e) {
            throw new IllegalArgumentException("frame data is damaged: " + e.getMessage(), e);
        }
    }

    private int quantPos(float v, double origin) {
        long q = Math.round((v - origin) / step);
        return (int) Math.max(0, Math.min(65535, q));
    }

    private static int quantHeading(float h) {
        double a = h % (2 * Math.PI);
        if (a < 0) {
            a += 2 * Math.PI;
        }
        return (int) (Math.round(a / (2 * Math.PI) * 256) & 0xff);
    }

    private static int quantWeight(float w, float wMax) {
        if (!(wMax > 0) || !(w > 0)) {
            return 255;
        }
        double code = -Math.log(w / wMax) * 255.0 / WEIGHT_RANGE;
        return (int) Math.max(0, Math.min(255, Math.round(code)));
    }

    private int quantRange(float r) {
        long q = Math.round(Math.max(0, Math.min(maxRange, r)) / maxRange * 65535.0);
        return (int) q;
    }

    private static void pose(DataOutputStream out, Pose p) throws IOException {
        out.writeDouble(p.x());
        out.writeDouble(p.y());
        out.writeDouble(p.heading());
    }

    private static Pose pose(DataInputStream in) throws IOException {
        return Pose.of(in.readDouble(), in.readDouble(), in.readDouble());
    }

    private static byte[] deflate(byte[] raw) {
        Deflater d = new Deflater(Deflater.BEST_SPEED);
        try {
            d.setInput(raw);
            d.finish();
            ByteArrayOutputStream out = new ByteArrayOutputStream(raw.length / 2 + 64);
            byte[] buf = new byte[8192];
            while (!d.finished()) {
                int n = d.deflate(buf);
                out.write(buf, 0, n);
            }
            return out.toByteArray();
        } finally {
            d.end();
        }
    }

    private static byte[] inflate(byte[] data) throws IOException {
        Inflater inf = new Inflater();
        try {
            inf.setInput(data);
            ByteArrayOutputStream out = new ByteArrayOutputStream(data.length * 3);
            byte[] buf = new byte[16384];
            while (!inf.finished()) {
                int n = inf.inflate(buf);
                if (n == 0 && (inf.needsInput() || inf.needsDictionary())) {
                    throw new IOException("truncated frame");
                }
                out.write(buf, 0, n);
            }
            return out.toByteArray();
        } catch (DataFormatException e) {
            throw new IOException(e.getMessage(), e);
        } finally {
            inf.end();
        }
    }
}
