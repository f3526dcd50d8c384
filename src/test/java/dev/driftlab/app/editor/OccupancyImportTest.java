package dev.driftlab.app.editor;

import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.io.ByteArrayOutputStream;
import java.io.DataOutputStream;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.util.zip.CRC32;
import java.util.zip.Deflater;
import org.junit.jupiter.api.Test;

/** Images are refused by their declared size before any pixel is decoded. */
class OccupancyImportTest {

    private static void chunk(DataOutputStream out, String type, byte[] data) throws IOException {
        byte[] t = type.getBytes(StandardCharsets.US_ASCII);
        out.writeInt(data.length);
        out.write(t);
        out.write(data);
        CRC32 crc = new CRC32();
        crc.update(t);
        crc.update(data);
        out.writeInt((int) crc.getValue());
    }

    /**
     * A PNG (layout from the PNG specification, ISO/IEC 15948: signature, IHDR, IDAT, IEND) whose
     * header declares {@code side} x {@code side} 8-bit grey pixels, with one deflated row of data:
     * a few dozen bytes that would decode to {@code side}^2 bytes.
     */
    static byte[] declaredPng(int side) throws IOException {
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        DataOutputStream out = new DataOutputStream(bytes);
        out.write(new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'});
        ByteArrayOutputStream ihdr = new ByteArrayOutputStream();
        DataOutputStream h = new DataOutputStream(ihdr);
        h.writeInt(side);
        h.writeInt(side);
        h.write(new byte[] {8, 0, 0, 0, 0});
        chunk(out, "IHDR", ihdr.toByteArray());
        Deflater d = new Deflater();
        d.setInput(new byte[side + 1]);
        d.finish();
        byte[] buf = new byte[side + 64];
        int n = d.deflate(buf);
        chunk(out, "IDAT", java.util.Arrays.copyOf(buf, n));
        chunk(out, "IEND", new byte[0]);
        return bytes.toByteArray();
    }

    @Test
    void read_pngDeclaringFortyThousandPixelsASide_isRefusedFromItsHeader() throws IOException {
        byte[] bomb = declaredPng(40_000);

        assertThatThrownBy(() -> OccupancyImport.read(bomb, 0.05, 0, 0))
                .isInstanceOf(ImportRefused.class)
                .hasMessageContaining("image")
                .hasMessageContaining("40000 x 40000 pixels is over the limit of 2000 pixels a side");
    }

    @Test
    void read_pngWithinTheLimit_stillReads() throws IOException {
        byte[] small = declaredPng(1);

        OccupancyImport.read(small, 0.05, 0, 0);
    }
}
