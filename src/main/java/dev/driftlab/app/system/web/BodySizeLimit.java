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
import org.springframework.web.util.HtmlUtils;

/**
 * The 2 MB limit for every request body read through the servlet API (scenario documents sent raw,
 * the editor's live check, JSON bodies of the pages). A declared length over the limit is refused
 * before reading; a chunked body declares none, so the bytes actually read are counted and reading
 * fails at the limit. Form posts are parsed by the container, which has its own limit
 * ({@code server.tomcat.max-http-form-post-size}), and multipart uploads have theirs
 * ({@code spring.servlet.multipart.*}, answered by {@link UploadLimits}).
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

    @Override
    protected boolean shouldNotFilter(HttpServletRequest request) {
        String type = request.getContentType();
        return type != null && type.toLowerCase(java.util.Locale.ROOT).startsWith("multipart/");
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
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
     * One answer per kind of client: a problem document for the API and for script calls (htmx, or
     * a fetch asking for JSON), a page for a browser's form post.
     */
    static void refuse(HttpServletRequest request, HttpServletResponse response) throws IOException {
        response.setStatus(HttpStatus.CONTENT_TOO_LARGE.value());
        response.setCharacterEncoding(StandardCharsets.UTF_8.name());
        response.setHeader("Connection", "close");
        if (wantsJson(request)) {
            response.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
            response.getWriter()
                    .write("{\"status\":413,\"title\":\"Content Too Large\",\"detail\":\"" + MESSAGE + "\"}");
        } else {
            response.setContentType(MediaType.TEXT_HTML_VALUE);
            response.getWriter()
                    .write("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><title>Driftlab: too"
                            + " large</title><link rel=\"stylesheet\" href=\"/assets/css/driftlab.css\"></head><body>"
                            + "<main class=\"page\"><h1>Too large</h1><p>" + HtmlUtils.htmlEscape(MESSAGE)
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

    static boolean wantsJson(HttpServletRequest request) {
        String accept = request.getHeader("Accept");
        String type = request.getContentType();
        return request.getRequestURI().startsWith("/api/")
                || request.getHeader(Htmx.HEADER) != null
                || (accept != null && accept.contains("json"))
                || (type != null && type.contains("json"));
    }

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
