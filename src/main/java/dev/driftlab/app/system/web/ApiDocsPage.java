package dev.driftlab.app.system.web;

import jakarta.servlet.http.HttpServletRequest;
import jakarta.servlet.http.HttpServletRequestWrapper;
import java.util.Locale;
import org.springdoc.webmvc.api.OpenApiWebMvcResource;
import org.springframework.beans.factory.ObjectProvider;
import org.springframework.beans.factory.annotation.Value;
import org.springframework.http.HttpStatus;
import org.springframework.stereotype.Controller;
import org.springframework.ui.Model;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.server.ResponseStatusException;
import org.springframework.web.servlet.support.ServletUriComponentsBuilder;
import tools.jackson.databind.json.JsonMapper;

/**
 * The API page: the operations of the OpenAPI document (the one served at {@code /v3/api-docs}),
 * listed by tag in a plain page of our own that passes the same accessibility check as every other
 * page, in place of a bundled interactive viewer that did not.
 */
@Controller
class ApiDocsPage {

    private final ObjectProvider<OpenApiWebMvcResource> openApi;
    private final String documentPath;

    /**
     * @param openApi springdoc's document endpoint; absent in test slices without springdoc, where
     *     the page answers 404
     */
    ApiDocsPage(
            ObjectProvider<OpenApiWebMvcResource> openApi,
            @Value("${springdoc.api-docs.path:/v3/api-docs}") String documentPath) {
        this.openApi = openApi;
        this.documentPath = documentPath;
    }

    @GetMapping("/api-docs.html")
    String page(HttpServletRequest request, Locale locale, Model model) throws Exception {
        OpenApiWebMvcResource resource = openApi.getIfAvailable();
        if (resource == null) {
            throw new ResponseStatusException(HttpStatus.NOT_FOUND);
        }
        byte[] doc = resource.openapiJson(asDocumentRequest(request), documentPath, locale);
        model.addAttribute("api", ApiOperations.of(JsonMapper.shared().readTree(doc)));
        model.addAttribute("documentPath", documentPath);
        return "system/api-docs";
    }

    /**
     * The request as if it asked for the document itself: the document's server address is worked
     * out from the request address less the document's path, so this page's address would give a
     * wrong one (and a shorter path than the document's would not work out at all).
     */
    private HttpServletRequest asDocumentRequest(HttpServletRequest request) {
        String uri = ServletUriComponentsBuilder.fromContextPath(request)
                .path(documentPath)
                .build()
                .toUriString();
        return new HttpServletRequestWrapper(request) {
            @Override
            public StringBuffer getRequestURL() {
                return new StringBuffer(uri);
            }

            @Override
            public String getRequestURI() {
                return request.getContextPath() + documentPath;
            }

            @Override
            public String getServletPath() {
                return documentPath;
            }
        };
    }
}
