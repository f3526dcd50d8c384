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

    private static final Pattern LABEL = Pattern.compile("aria-label=\"([^\"]*)\"");

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
        StringBuilder sb = new StringBuilder(xhtml.length());
        int at = 0;
        while (true) {
            int open = xhtml.indexOf("<svg", at);
            if (open < 0) {
                sb.append(xhtml, at, xhtml.length());
                break;
            }
            sb.append(xhtml, at, open);
            // a drawing may hold nested svg elements (key frames do), so skip to the matching end
            int depth = 0;
            int i = open;
            int close = xhtml.length();
            while (i < xhtml.length()) {
                int nextOpen = xhtml.indexOf("<svg", i);
                int nextClose = xhtml.indexOf("</svg>", i);
                if (nextClose < 0) {
                    break;
                }
                if (nextOpen >= 0 && nextOpen < nextClose) {
                    depth++;
                    i = nextOpen + 4;
                } else {
                    depth--;
                    i = nextClose + 6;
                    if (depth == 0) {
                        close = i;
                        break;
                    }
                }
            }
            Matcher m = LABEL.matcher(xhtml.substring(open, Math.min(close, xhtml.indexOf('>', open) + 1)));
            String label = m.find() ? m.group(1) : "Plot";
            sb.append("<p class=\"note\">[").append(label).append(": drawn in the web page]</p>");
            at = close;
        }
        return sb.toString()
                .replace(
                        "</style>",
                        "@page{size:A4;margin:15mm}body{max-width:none;font-family:sans-serif;font-size:10pt}"
                                + "table{width:100%;font-size:9pt}details>*{display:block}</style>");
    }
}
