package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.Color;
import java.awt.geom.Line2D;
import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.SplittableRandom;
import java.util.zip.CRC32;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The report's PNG encoder against the JDK's own PNG reader (ImageIO, an independent decoder):
 * every pixel reads back exactly; and the file's framing against the PNG specification (W3C, 2nd
 * edition): the signature, IHDR first with the image's size, 8-bit truecolour, IEND last, and each
 * chunk's CRC-32 over its type and data.
 */
class PngFileTest {

    @Test
    @DisplayName("random pixels (incompressible: several IDAT chunks) read back exactly through ImageIO")
    void randomPixels() throws IOException {
        BufferedImage image = new BufferedImage(613, 401, BufferedImage.TYPE_INT_RGB);
        SplittableRandom random = new SplittableRandom(7);
        for (int y = 0; y < image.getHeight(); y++) {
            for (int x = 0; x < image.getWidth(); x++) {
                image.setRGB(x, y, random.nextInt(1 << 24));
            }
        }
        byte[] file = encode(image);
        assertSamePixels(image, file);
        List<String> chunks = checkFraming(file, 613, 401);
        assertTrue(chunks.stream().filter("IDAT"::equals).count() > 1, "several IDAT chunks: " + chunks);
    }

    @Test
    @DisplayName("a drawn chart (antialiased lines and text) and a 1 × 1 image read back exactly; same pixels, same bytes")
    void drawnAndTiny() throws IOException {
        BufferedImage chart = FigureFile.bitmap(900, 520, (g, area) -> {
            g.setColor(new Color(0, 114, 178));
            for (int i = 0; i < 50; i++) {
                g.draw(new Line2D.Double(10 + i * 17, 500, 40 + i * 13, 20 + i * 7));
            }
            g.setColor(Color.BLACK);
            g.drawString("posterior of mu_max (1/day)", 100, 40);
        });
        byte[] file = encode(chart);
        assertSamePixels(chart, file);
        checkFraming(file, 900, 520);
        assertArrayEquals(file, encode(chart), "the same pixels give the same bytes");

        BufferedImage tiny = new BufferedImage(1, 1, BufferedImage.TYPE_INT_RGB);
        tiny.setRGB(0, 0, 0x123456);
        byte[] small = encode(tiny);
        assertSamePixels(tiny, small);
        checkFraming(small, 1, 1);
    }

    @Test
    @DisplayName("a bitmap of another type is refused, naming its type")
    void otherTypeRefused() {
        BufferedImage argb = new BufferedImage(2, 2, BufferedImage.TYPE_INT_ARGB);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> PngFile.write(argb, new ByteArrayOutputStream()));
        assertTrue(e.getMessage().contains("type " + BufferedImage.TYPE_INT_ARGB), e.getMessage());
    }

    private static byte[] encode(BufferedImage image) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        PngFile.write(image, out);
        return out.toByteArray();
    }

    private static void assertSamePixels(BufferedImage expected, byte[] file) throws IOException {
        BufferedImage back = ImageIO.read(new ByteArrayInputStream(file));
        assertEquals(expected.getWidth(), back.getWidth());
        assertEquals(expected.getHeight(), back.getHeight());
        for (int y = 0; y < expected.getHeight(); y++) {
            for (int x = 0; x < expected.getWidth(); x++) {
                if ((expected.getRGB(x, y) & 0xffffff) != (back.getRGB(x, y) & 0xffffff)) {
                    throw new AssertionError("pixel (" + x + ", " + y + "): wrote "
                            + Integer.toHexString(expected.getRGB(x, y)) + ", read " + Integer.toHexString(back.getRGB(x, y)));
                }
            }
        }
    }

    /** Checks the chunk layout and CRCs; returns the chunk types in order. */
    private static List<String> checkFraming(byte[] file, int width, int height) {
        byte[] signature = {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'};
        for (int i = 0; i < signature.length; i++) {
            assertEquals(signature[i], file[i], "signature byte " + i);
        }
        ByteBuffer in = ByteBuffer.wrap(file, 8, file.length - 8);
        List<String> types = new ArrayList<>();
        while (in.hasRemaining()) {
            int length = in.getInt();
            byte[] typeAndData = new byte[4 + length];
            in.get(typeAndData);
            String type = new String(typeAndData, 0, 4, StandardCharsets.US_ASCII);
            CRC32 crc = new CRC32();
            crc.update(typeAndData);
            assertEquals((int) crc.getValue(), in.getInt(), "CRC of chunk " + types.size() + " (" + type + ")");
            if (type.equals("IHDR")) {
                ByteBuffer header = ByteBuffer.wrap(typeAndData, 4, length);
                assertEquals(width, header.getInt());
                assertEquals(height, header.getInt());
                assertEquals(8, header.get(), "bit depth");
                assertEquals(2, header.get(), "colour type: truecolour");
            }
            types.add(type);
        }
        assertEquals("IHDR", types.get(0));
        assertEquals("IEND", types.get(types.size() - 1));
        return types;
    }
}
