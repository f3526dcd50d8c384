package dev.driftlab.app.sharing.web;

import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import io.swagger.v3.oas.annotations.Operation;
import io.swagger.v3.oas.annotations.tags.Tag;
import org.springframework.web.bind.annotation.GetMapping;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestMapping;
import org.springframework.web.bind.annotation.RestController;

/** The links of a scenario through the API. Edit tokens only. */
@RestController
@RequestMapping("/api/s/{token}/links")
@Tag(name = "Sharing", description = "View and edit links of a scenario")
class ShareApi {

    /**
     * The active links; a revoked kind is null.
     *
     * @param view view token, or null
     * @param edit edit token, or null
     */
    record LinksBody(String view, String edit) {}

    /**
     * A freshly issued link.
     *
     * @param access view or edit
     * @param token the new token
     */
    record IssuedBody(String access, String token) {}

    private final ShareLinks links;

    ShareApi(ShareLinks links) {
        this.links = links;
    }

    @GetMapping
    @Operation(summary = "The active view and edit tokens (edit token required)")
    LinksBody current(@PathVariable String token) {
        Grant g = links.requireEdit(token);
        ShareLinks.Links l = links.current(g.scenarioId());
        return new LinksBody(l.view().orElse(null), l.edit().orElse(null));
    }

    @PostMapping("/{access}/reissue")
    @Operation(summary = "Revoke the current view or edit link and issue a new one")
    IssuedBody reissue(@PathVariable String token, @PathVariable String access) {
        Grant g = links.requireEdit(token);
        Access a = Access.inPath(access);
        return new IssuedBody(a.word(), links.reissue(g.scenarioId(), a));
    }

    @PostMapping("/{access}/revoke")
    @Operation(summary = "Revoke the current view or edit link; it then answers 404")
    LinksBody revoke(@PathVariable String token, @PathVariable String access) {
        Grant g = links.requireEdit(token);
        Access a = Access.inPath(access);
        links.revoke(g.scenarioId(), a);
        ShareLinks.Links l = links.current(g.scenarioId());
        return new LinksBody(l.view().orElse(null), l.edit().orElse(null));
    }
}
