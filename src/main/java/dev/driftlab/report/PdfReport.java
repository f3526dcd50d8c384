package dev.driftlab.report;

import com.openhtmltopdf.pdfboxout.PdfRendererBuilder;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;

/**
 * Renders a report as a PDF document from the same page as {@link HtmlReport}, plots, site plan and
 * key frames included (SVG drawn by the renderer's SVG support).
 */
public final class PdfReport {

    private PdfReport() {}

    /** The PDF as bytes, its drawings within {@link DrawingBudget#PDF}. */
    public static byte[] render(Report r) {
        return render(r, DrawingBudget.PDF);
    }

    /**
     * The PDF as bytes; drawings over the budget are never drawn, a note stands where they would
     * have been.
     */
    public static byte[] render(Report r, DrawingBudget budget) {
        return pdf(printable(HtmlReport.renderXhtml(r, budget)));
    }

    /** The suite report as a PDF, from the same page as {@link HtmlReport#render(SuiteReport)}. */
    public static byte[] render(SuiteReport r) {
        return pdf(printable(HtmlReport.renderXhtml(r)));
    }

    private static byte[] pdf(String page) {
        ByteArrayOutputStream out = new ByteArrayOutputStream(256 * 1024);
        try {
            PdfRendererBuilder b = new PdfRendererBuilder();
            b.useFastMode();
            b.useSVGDrawer(new com.openhtmltopdf.svgsupport.BatikSVGDrawer());
            b.withHtmlContent(page, null);
            b.toStream(out);
            b.run();
        } catch (IOException e) {
            throw new UncheckedIOException("the PDF could not be written", e);
        }
        return out.toByteArray();
    }

    /** The XHTML page with page-friendly styles; drawings stay. */
    static String printable(String xhtml) {
        return withPageStyle(xhtml);
    }

    private static String withPageStyle(String xhtml) {
        return xhtml.replace(
                "</style>",
                "@page{size:A4;margin:15mm}body{max-width:none;font-family:sans-serif;font-size:10pt}"
                        + "table{width:100%;font-size:9pt}details>*{display:block}</style>");
    }
}
