package dev.driftlab.app.sharing.web;

import dev.driftlab.app.sharing.Access;
import dev.driftlab.app.sharing.Grant;
import dev.driftlab.app.sharing.ShareLinks;
import org.springframework.stereotype.Controller;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;

/** The share panel's buttons: reissue or revoke the view or edit link. Edit links only. */
@Controller
class SharePages {

    private final ShareLinks links;

    SharePages(ShareLinks links) {
        this.links = links;
    }

    @PostMapping("/s/{token}/links/{access}/reissue")
    String reissue(@PathVariable String token, @PathVariable String access) {
        Grant g = links.requireEdit(token);
        Access a = Access.inPath(access);
        String fresh = links.reissue(g.scenarioId(), a);
        // reissuing the edit link retires the one in the address bar, so move to the new one
        return "redirect:/s/" + (a == Access.EDIT ? fresh : token) + "#share";
    }

    @PostMapping("/s/{token}/links/{access}/revoke")
    String revoke(@PathVariable String token, @PathVariable String access) {
        Grant g = links.requireEdit(token);
        Access a = Access.inPath(access);
        links.revoke(g.scenarioId(), a);
        return a == Access.EDIT ? "redirect:/" : "redirect:/s/" + token + "#share";
    }
}
