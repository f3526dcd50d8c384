package dev.driftlab.app.editor.web;

import dev.driftlab.app.editor.ImportRefused;
import dev.driftlab.app.editor.OccupancyImport;
import dev.driftlab.app.sharing.ShareLinks;
import dev.driftlab.scenario.DoorState;
import dev.driftlab.scenario.ScenarioFiles;
import dev.driftlab.site.WallPieces;
import java.io.IOException;
import java.util.List;
import org.springframework.http.HttpStatus;
import org.springframework.http.MediaType;
import org.springframework.http.ResponseEntity;
import org.springframework.web.bind.annotation.ExceptionHandler;
import org.springframework.web.bind.annotation.PathVariable;
import org.springframework.web.bind.annotation.PostMapping;
import org.springframework.web.bind.annotation.RequestBody;
import org.springframework.web.bind.annotation.RequestParam;
import org.springframework.web.bind.annotation.RestController;
import org.springframework.web.multipart.MultipartFile;

/**
 * What the editor's script calls while a document is being edited: the live check (changes
 * nothing, so view links may use it) and the occupancy image import (edit links only; it returns
 * wall blocks for the browser to add and stores nothing).
 */
@RestController
class EditorApi {

    /**
     * One finding of the check.
     *
     * @param severity error or warning
     * @param path field path in the file
     * @param message plain explanation
     */
    record ProblemBody(String severity, String path, String message) {}

    /**
     * The check of a document.
     *
     * @param ok whether the document could be saved
     * @param problems every finding
     * @param walls the wall pieces as x0, y0, x1, y1 in metres, every door's opening cut out by
     *     {@link WallPieces} (the editor draws these and cuts nothing itself); null when the
     *     document could not be read
     */
    record CheckBody(boolean ok, List<ProblemBody> problems, List<double[]> walls) {}

    /**
     * Wall blocks from an image, in metres.
     *
     * @param blocks rectangles as x0, y0, x1, y1
     * @param extent the whole image as a rectangle, for a room around it
     */
    record ImportBody(List<OccupancyImport.Block> blocks, OccupancyImport.Block extent) {}

    /**
     * A refused import.
     *
     * @param field the form field at fault
     * @param message plain explanation naming the field
     */
    record RefusedBody(String field, String message) {}

    private final ShareLinks links;

    EditorApi(ShareLinks links) {
        this.links = links;
    }

    @PostMapping(value = "/s/{token}/editor/check", consumes = MediaType.APPLICATION_JSON_VALUE)
    CheckBody check(@PathVariable String token, @RequestBody String document) {
        links.require(token);
        ScenarioFiles.Checked c = ScenarioFiles.check(document);
        List<double[]> walls = c.scenario()
                .map(s -> WallPieces.of(s.site(), d -> DoorState.OPEN).stream()
                        .map(w -> new double[] {w.a().x(), w.a().y(), w.b().x(), w.b().y()})
                        .toList())
                .orElse(null);
        return new CheckBody(
                c.ok(),
                c.report().problems().stream()
                        .map(p -> new ProblemBody(p.isError() ? "error" : "warning", p.path(), p.message()))
                        .toList(),
                walls);
    }

    @PostMapping(value = "/s/{token}/editor/import", consumes = MediaType.MULTIPART_FORM_DATA_VALUE)
    ImportBody importImage(
            @PathVariable String token,
            @RequestParam(required = false) MultipartFile image,
            @RequestParam(defaultValue = "0.05") String cellSize,
            @RequestParam(defaultValue = "0") String originX,
            @RequestParam(defaultValue = "0") String originY)
            throws IOException {
        links.requireEdit(token);
        byte[] bytes = image == null ? new byte[0] : image.getBytes();
        OccupancyImport.Result r = OccupancyImport.read(
                bytes, number("cellSize", cellSize), number("originX", originX), number("originY", originY));
        return new ImportBody(r.blocks(), r.extent());
    }

    @ExceptionHandler(ImportRefused.class)
    ResponseEntity<RefusedBody> refused(ImportRefused e) {
        return ResponseEntity.status(HttpStatus.UNPROCESSABLE_CONTENT).body(new RefusedBody(e.field(), e.getMessage()));
    }

    private static double number(String field, String text) {
        try {
            return Double.parseDouble(text.trim());
        } catch (NumberFormatException e) {
            throw new ImportRefused(field, "not a number");
        }
    }
}
