package dev.driftlab.app.system.web;

import jakarta.servlet.FilterChain;
import jakarta.servlet.ServletException;
import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletResponse;
import java.io.IOException;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.stereotype.Component;
import org.springframework.web.filter.OncePerRequestFilter;

/**
 * The 2 MB limit for API bodies (scenario documents sent raw). Multipart uploads and forms have
 * their own limits in the servlet container; a raw body has none unless set here.
 */
@Component
class BodySizeLimit extends OncePerRequestFilter {

    static final long MAX_BYTES = 2L * 1024 * 1024;

    @Override
    protected boolean shouldNotFilter(HttpServletRequest request) {
        return !request.getRequestURI().startsWith("/api/");
    }

    @Override
    protected void doFilterInternal(HttpServletRequest request, HttpServletResponse response, FilterChain chain)
            throws ServletException, IOException {
        long length = request.getContentLengthLong();
        if (length > MAX_BYTES) {
            response.setStatus(HttpStatus.CONTENT_TOO_LARGE.value());
            response.setContentType(MediaType.APPLICATION_PROBLEM_JSON_VALUE);
            response.getWriter()
                    .write("{\"status\":413,\"title\":\"Content Too Large\",\"detail\":\"body: larger than the 2 MB"
                            + " limit; nothing was stored.\"}");
            return;
        }
        chain.doFilter(request, response);
    }
}
