package dev.driftlab.app.system.web;

import jakarta.servlet.http.HttpServletResponse;
import java.util.List;
import org.springframework.context.annotation.Configuration;
import org.springframework.core.MethodParameter;
import org.springframework.http.HttpHeaders;
import org.springframework.web.bind.support.WebDataBinderFactory;
import org.springframework.web.context.request.NativeWebRequest;
import org.springframework.web.method.support.HandlerMethodArgumentResolver;
import org.springframework.web.method.support.ModelAndViewContainer;
import org.springframework.web.servlet.config.annotation.WebMvcConfigurer;

/**
 * The one place that reads {@code HX-Request}: a handler that takes an {@link Htmx} parameter answers
 * differently by that header, so its response always carries {@code Vary: HX-Request}, whichever way
 * this request went (the header is what a cache must key on, also when it was absent).
 */
@Configuration
class HtmxArgument implements WebMvcConfigurer, HandlerMethodArgumentResolver {

    @Override
    public void addArgumentResolvers(List<HandlerMethodArgumentResolver> resolvers) {
        resolvers.add(this);
    }

    @Override
    public boolean supportsParameter(MethodParameter parameter) {
        return parameter.getParameterType() == Htmx.class;
    }

    @Override
    public Htmx resolveArgument(
            MethodParameter parameter,
            ModelAndViewContainer mavContainer,
            NativeWebRequest webRequest,
            WebDataBinderFactory binderFactory) {
        HttpServletResponse response = webRequest.getNativeResponse(HttpServletResponse.class);
        if (response != null && !varies(response)) {
            response.addHeader(HttpHeaders.VARY, Htmx.HEADER);
        }
        // htmx sends "true"; presence alone counts, as it always has for these handlers
        return new Htmx(webRequest.getHeader(Htmx.HEADER) != null);
    }

    private static boolean varies(HttpServletResponse response) {
        for (String v : response.getHeaders(HttpHeaders.VARY)) {
            for (String name : v.split(",")) {
                if (name.trim().equalsIgnoreCase(Htmx.HEADER)) {
                    return true;
                }
            }
        }
        return false;
    }
}
