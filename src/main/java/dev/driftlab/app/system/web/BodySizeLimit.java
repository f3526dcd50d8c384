package dev.driftlab.app.system.web;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ReadListener;
import jakarta.servlet.ServletException;
import jakarta.servlet.ServletInputStream;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletRequestWrapper;
import jakarta.servlet.http.HttpServletResponse;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import org.springframework.core.Ordered;
import org.springframework.core.annotation.Order;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.stereotype.Component;
import org.springframework.web.filter.OncePerRequestFilter;
import org.springframework.web.multipart.MaxUploadSizeExceededException;
import org.springframework.web.multipart.MultipartException;
import org.springframework.web.multipart.support.StandardMultipartHttpServletRequest;
import org.springframework.web.util.HtmlUtils;

/**
 * The 2 MB limit for every request body read through the servlet API (scenario documents sent raw,
 * the editor's live check, JSON bodies of the pages). A declared length over the limit is refused
 * before reading; a chunked body declares none, so the bytes actually read are counted and reading
 * fails at the limit. Form posts are parsed by the container, which has its own limit
 * ({@code server.tomcat.max-http-form-post-size}). Multipart uploads are parsed here, before any
 * other filter asks for a parameter: the container counts their parts against
 * {@code spring.servlet.multipart.*} (chunked ones included), and an upload past it is answered 413
 * here. Parsed later, by the CSRF filter looking for its field, the failure left the field missing
 * and a browser's upload was answered with a generic error page instead.
 *
 * <p>First in the chain, so no filter reads a body before it is counted.
 */
@Component
@Order(Ordered.HIGHEST_PRECEDENCE)
class BodySizeLimit extends OncePerRequestFilter {

    static final long MAX_BYTES = 2L * 1024 * 1024;

    static final String MESSAGE = "body: larger than the 2 MB limit; nothing was stored.";

    /** Thrown by a read past the limit; an {@link IOException} so readers treat it as a failed read. */
    static final class TooLarge extends IOException {
        TooLarge() {
            super(MESSAGE);
        }
    }

    private static boolean multipart(HttpServletRequest request) {
        String type = request.getContentType();
        return type != null && type.toLowerCase(java.util.Locale.ROOT).startsWith("multipart/");
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
        if (multipart(request)) {
            if (request.getContentLengthLong() > MAX_BYTES || uploadTooLarge(request)) {
                refuse(request, response, "Too large", UploadLimits.message(request));
                return;
            }
            chain.doFilter(request, response);
            return;
        }
        if (request.getContentLengthLong() > MAX_BYTES) {
            refuse(request, response);
            return;
        }
        Counted counted = new Counted(request);
        try {
            chain.doFilter(counted, response);
        } catch (IOException | ServletException | RuntimeException e) {
            if (!counted.over) {
                throw e;
            }
        }
        // whatever the reader made of the failed read (a 400, an error page), the answer is 413
        if (counted.over && !response.isCommitted()) {
            response.resetBuffer();
            refuse(request, response);
        }
    }

    /**
     * Parses the parts now (the container keeps them for the handler): whether the upload is past
     * the multipart limits. Another parse failure is left for the handler to report.
     */
    private static boolean uploadTooLarge(HttpServletRequest request) {
        try {
            // Spring's own reading of the container's failure (the same one the handler would meet)
            new StandardMultipartHttpServletRequest(request, false);
            return false;
        } catch (MaxUploadSizeExceededException e) {
            return true;
        } catch (MultipartException e) {
            return false;
        }
    }

    static void refuse(HttpServletRequest request, HttpServletResponse response) throws IOException {
        refuse(request, response, "Too large", MESSAGE);
    }

    /**
     * One answer per kind of client ({@link #wantsJson}): a problem document for the API and for
     * script calls, a page for a browser's form post.
     */
    static void refuse(HttpServletRequest request, HttpServletResponse response, String heading, String message)
            throws IOException {
        response.setStatus(HttpStatus.CONTENT_TOO_LARGE.value());
        response.setCharacterEncoding(StandardCharsets.UTF_8.name());
        response.setHeader("Connection", "close");
        if (wantsJson(request)) {
            response.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
            response.getWriter()
                    .write("{\"status\":413,\"title\":\"Content Too Large\",\"detail\":\""
                            + message.replace("\\", "\\\\").replace("\"", "\\\"") + "\"}");
        } else {
            response.setContentType(MediaType.TEXT_HTML_VALUE);
            response.getWriter()
                    .write("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Driftlab: too"
                            + " large</title><link rel=\"stylesheet\" href=\"/assets/css/driftlab.css\"></head><body>"
                            + "<main class=\"page\"><h1>" + HtmlUtils.htmlEscape(heading) + "</h1><p>"
                            + HtmlUtils.htmlEscape(message)
                            + "</p><p><a href=\"/\">Scenarios</a></p></main><footer class=\"caution\">Simulation"
                            + " results do not certify safety.</footer></body></html>");
        }
    }

    /** Whether a failure was a read past the limit, however a reader wrapped it. */
    static boolean isTooLarge(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof TooLarge) {
                return true;
            }
        }
        return false;
    }

    /**
     * The one rule for which kind of client a request comes from, for every refusal made before a
     * handler is chosen: a script (the API, htmx, the editor's own calls, a fetch sending or asking
     * for JSON) reads a problem document; a browser's form post or page load reads a page.
     */
    static boolean wantsJson(HttpServletRequest request) {
        String accept = request.getHeader("Accept");
        String type = request.getContentType();
        String path = request.getRequestURI();
        return path.startsWith("/api/")
                || path.endsWith(EDITOR_CHECK)
                || path.endsWith(EDITOR_IMPORT)
                || request.getHeader(Htmx.HEADER) != null
                || (accept != null && accept.contains("json"))
                || (type != null && type.contains("json"));
    }

    /** Addresses of pages called only by the editor's script, which reads JSON answers. */
    static final String EDITOR_CHECK = "/editor/check";

    static final String EDITOR_IMPORT = "/editor/import";

    /** The request with its body counted as it is read. */
    private static final class Counted extends HttpServletRequestWrapper {
        boolean over;
        private ServletInputStream stream;
        private BufferedReader reader;

        Counted(HttpServletRequest request) {
            super(request);
        }

        @Override
        public ServletInputStream getInputStream() throws IOException {
            if (stream == null) {
                stream = new CountingStream(super.getInputStream());
            }
            return stream;
        }

        @Override
        public BufferedReader getReader() throws IOException {
            if (reader == null) {
                String enc = getCharacterEncoding();
                Charset cs = enc == null ? StandardCharsets.UTF_8 : Charset.forName(enc);
                reader = new BufferedReader(new InputStreamReader(getInputStream(), cs));
            }
            return reader;
        }

        private final class CountingStream extends ServletInputStream {
            private final ServletInputStream in;
            private long read;

            CountingStream(ServletInputStream in) {
                this.in = in;
            }

            private int counted(int n) throws TooLarge {
                if (n > 0) {
                    read += n;
                    if (read > MAX_BYTES) {
                        over = true;
                        throw new TooLarge();
                    }
                }
                return n;
            }

            @Override
            public int read() throws IOException {
                int b = in.read();
                if (b >= 0) {
                    counted(1);
                }
                return b;
            }

            @Override
            public int read(byte[] b, int off, int len) throws IOException {
                return counted(in.read(b, off, len));
            }

            @Override
            public boolean isFinished() {
                return in.isFinished();
            }

            @Override
            public boolean isReady() {
                return in.isReady();
            }

            @Override
            public void setReadListener(ReadListener listener) {
                in.setReadListener(listener);
            }
        }
    }
}
