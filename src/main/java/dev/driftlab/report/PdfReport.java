package dev.driftlab.report;

import com.openhtmltopdf.pdfboxout.PdfRendererBuilder;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Renders a report as a PDF document from the same page as {@link HtmlReport}. The PDF renderer
 * has no SVG support in this build, so each plot and key frame is replaced by its text label
 * (title and caption stay); the numbers are all in the tables.
 */
public final class PdfReport {

    private static final Pattern SVG =
            Pattern.compile("<svg\\b[^>]*?(?:aria-label=\"([^\"]*)\")?[^>]*>.*?</svg>", Pattern.DOTALL);

    private PdfReport() {}

    /** The PDF as bytes. */
    public static byte[] render(Report r) {
        String page = printable(HtmlReport.renderXhtml(r));
        ByteArrayOutputStream out = new ByteArrayOutputStream(256 * 1024);
        try {
            PdfRendererBuilder b = new PdfRendererBuilder();
            b.useFastMode();
            b.withHtmlContent(page, null);
            b.toStream(out);
            b.run();
        } catch (IOException e) {
            throw new UncheckedIOException("the PDF could not be written", e);
        }
        return out.toByteArray();
    }

    /** The XHTML page with plots replaced by their labels and page-friendly styles. */
    static String printable(String xhtml) {
        Matcher m = SVG.matcher(xhtml);
        StringBuilder sb = new StringBuilder(xhtml.length());
        while (m.find()) {
            String label = m.group(1) == null ? "Plot" : m.group(1);
            m.appendReplacement(
                    sb, Matcher.quoteReplacement("<p class=\"note\">[" + label + ": drawn in the web page]</p>"));
        }
        m.appendTail(sb);
        return sb.toString()
                .replace(
                        "</style>",
                        "@page{size:A4;margin:15mm}body{max-width:none;font-family:sans-serif;font-size:10pt}"
                                + "table{width:100%;font-size:9pt}details>*{display:block}</style>");
    }
}
