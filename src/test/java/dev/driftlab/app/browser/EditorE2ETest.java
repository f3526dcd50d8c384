package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.JavascriptExecutor;
import org.openqa.selenium.Keys;
import org.openqa.selenium.StaleElementReferenceException;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.openqa.selenium.interactions.Actions;
import org.openqa.selenium.support.ui.Select;
import org.openqa.selenium.support.ui.WebDriverWait;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;
import tools.jackson.databind.JsonNode;
import tools.jackson.databind.json.JsonMapper;

/**
 * The scenario editor in a real browser: draw, place the route and a kidnap, break and mend the
 * check, save, reload, and find the view link read-only in a fresh browser.
 */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class EditorE2ETest {

    private static final JsonMapper JSON = JsonMapper.builder().build();

    /** The wall ink of the plan (plan.js COLOURS.wall). */
    private static final int[] WALL = {0x1b, 0x1e, 0x23};

    @LocalServerPort
    int port;

    private WebDriver browser;
    private WebDriver viewer;

    @AfterEach
    void close() {
        for (WebDriver d : new WebDriver[] {browser, viewer}) {
            if (d != null) {
                d.quit();
            }
        }
    }

    @Test
    void drawSaveReload_thenViewLinkRefusesEditing() {
        browser = Browser.open(1280, 800);
        browser.get("http://localhost:" + port + "/");
        browser.findElement(By.id("new-in-editor")).click();
        waitReady(browser);
        String editorUrl = browser.getCurrentUrl();
        assertThat(editorUrl).endsWith("/editor");

        WebElement plan = browser.findElement(By.id("ed-plan"));
        // zoom out so the room drawn east of the starter room fits on the canvas
        for (int i = 0; i < 3; i++) {
            plan.sendKeys("-");
        }

        // a second room east of the first, sharing its wall at x = 8
        tool("box-room");
        drag(8, 0, 12, 5);
        assertThat(props()).contains("Room").contains("(8, 0) (12, 0) (12, 5) (8, 5)");
        assertThat(inputValue("Id")).isEqualTo("room-2");

        // split its east wall with a new corner, then join the two walls again
        tool("pick");
        int[] east = offset(browser, 12, 2.5);
        new Actions(browser)
                .moveToElement(planInView(), east[0], east[1])
                .doubleClick()
                .perform();
        assertThat(props()).contains("5 corners").contains("(12, 2.5)");
        click(12, 2.5);
        browser.findElement(By.id("ed-plan")).sendKeys("x");
        assertThat(props()).contains("4 corners: (8, 0) (12, 0) (12, 5) (8, 5)");

        // a door on the shared wall
        tool("door");
        click(8, 2.5);
        assertThat(props()).contains("Door");
        assertThat(inputValue("Room")).isEqualTo("room-1");

        // route: start pose, then through the door into the new room
        tool("start");
        drag(1, 2.5, 3, 2.5);
        tool("waypoint");
        click(6, 2.5);
        click(10.5, 2.5);
        assertThat(browser.findElements(By.cssSelector("#ed-route tbody tr"))).hasSize(4);

        // a kidnap on the timeline, carried into the new room
        new Select(browser.findElement(By.id("ed-fault-kind"))).selectByValue("kidnap");
        WebElement at = browser.findElement(By.id("ed-fault-at"));
        at.clear();
        at.sendKeys("12");
        browser.findElement(By.cssSelector("#ed-fault-add button")).click();
        assertThat(browser.findElements(By.cssSelector(".ed-marker.kind-kidnap")))
                .hasSize(1);
        // moved in time from the keyboard, then undone
        WebElement marker = browser.findElement(By.cssSelector(".ed-marker.kind-kidnap"));
        marker.sendKeys(Keys.chord(Keys.SHIFT, Keys.ARROW_RIGHT));
        assertThat(browser.findElement(By.cssSelector(".ed-marker.kind-kidnap")).getDomAttribute("aria-label"))
                .isEqualTo("kidnap kidnap-1 at 22 s");
        browser.findElement(By.cssSelector(".ed-marker.kind-kidnap")).sendKeys("u");
        assertThat(browser.findElement(By.cssSelector(".ed-marker.kind-kidnap")).getDomAttribute("aria-label"))
                .isEqualTo("kidnap kidnap-1 at 12 s");
        tool("fault-target");
        click(11, 4);
        assertThat(props()).contains("Fault: kidnap");
        assertThat(inputValue("Carried to x (m)")).isEqualTo("11");

        // a fault triggered on entering the new room rather than at a time
        new Select(browser.findElement(By.id("ed-fault-kind"))).selectByValue("blackout");
        new Select(browser.findElement(By.id("ed-fault-when"))).selectByValue("room-1");
        assertThat(browser.findElement(By.id("ed-fault-at")).isEnabled()).isFalse();
        browser.findElement(By.cssSelector("#ed-fault-add button")).click();
        assertThat(browser.findElement(By.id("ed-places")).getText()).contains(": blackout on entering room-1");
        assertThat(props()).contains("When entering");
        new Select(browser.findElement(By.id("ed-fault-when"))).selectByValue("");

        // every kind of the server's list can be added and edited, spurious max range too
        new Select(browser.findElement(By.id("ed-fault-kind"))).selectByValue("spurious-max-range");
        WebElement spuriousAt = browser.findElement(By.id("ed-fault-at"));
        spuriousAt.clear();
        spuriousAt.sendKeys("5");
        browser.findElement(By.cssSelector("#ed-fault-add button")).click();
        assertThat(browser.findElements(By.cssSelector(".ed-marker.kind-spurious-max-range")))
                .hasSize(1);
        assertThat(props()).contains("Fault: spurious-max-range");
        assertThat(inputValue("Share of beams reading max range (0 to 1)")).isEqualTo("0.3");
        setInput("Share of beams reading max range (0 to 1)", "0.5");

        // renaming a room carries its doors and its "on entering" faults along
        tool("pick");
        click(4, 4.2);
        assertThat(inputValue("Id")).isEqualTo("room-1");
        setInput("Id", "office");
        assertThat(browser.findElement(By.id("ed-places")).getText()).contains(": blackout on entering office");
        click(8, 2.5);
        assertThat(props()).contains("Door");
        assertThat(inputValue("Room")).isEqualTo("office");

        waitChecked(false);

        // a robot setting through its server-rendered form, taken into the document
        browser.findElement(By.xpath("//summary[starts-with(normalize-space(), 'Robot, rangefinder')]"))
                .click();
        WebElement wheelbase = browser.findElement(By.id("robot-wheelbase"));
        wheelbase.sendKeys(Keys.chord(Keys.CONTROL, "a"), "0.45", Keys.TAB);
        patient(browser, 10)
                .until(d -> d.findElement(By.id("settings-robot")).getText().contains("Taken into the scenario"));
        assertThat(browser.findElement(By.id("ed-dirty")).getText()).isEqualTo("unsaved changes");

        // a settings variant through its form: naming the empty block adds it, a change is checked
        // on the server and taken into the document (the form is swapped on every change)
        browser.findElement(By.cssSelector("#settings-variants details.variant summary"))
                .click();
        browser.findElement(By.id("variant-0-name")).sendKeys("more particles", Keys.TAB);
        patient(browser, 10)
                .until(d -> d.findElement(By.id("settings-variants")).getText().contains("Taken into the scenario"));
        WebElement count = patient(browser, 10).until(d -> d.findElement(By.id("variant-0-particles_count")));
        count.sendKeys("3000", Keys.TAB);
        patient(browser, 10)
                .until(d -> d.findElement(By.id("variant-0-particles_count"))
                                .getDomProperty("value")
                                .equals("3000")
                        && d.findElement(By.id("settings-variants")).getText().contains("Taken into the scenario"));
        assertThat(browser.findElement(By.id("variant-1-name")).getDomAttribute("placeholder"))
                .isEqualTo("name a new variant");
        ((JavascriptExecutor) browser)
                .executeScript("document.getElementById('settings-variants').scrollIntoView({block: 'start'});");
        Browser.screenshot(browser, "editor-variants");

        // the keys overlay
        browser.findElement(By.id("ed-plan")).sendKeys("h");
        assertThat(browser.findElement(By.id("ed-keys")).getDomProperty("open")).isEqualTo("true");
        Browser.screenshot(browser, "editor-keys");
        browser.findElement(By.cssSelector("#ed-keys form button")).click();

        // break the check: a door of zero width, then mend it from the problem list
        browser.findElement(By.cssSelector("button[data-tool=pick]")).click();
        click(8, 2.5);
        assertThat(props()).contains("Door");
        setInput("Clear width (m)", "0");
        WebElement problem = patient(browser, 10)
                .until(d -> d.findElements(By.cssSelector("#ed-problems li.error .ed-problem")).stream()
                        .filter(b -> b.getText().contains("site.doors[0].width"))
                        .findFirst()
                        .orElse(null));
        Browser.screenshot(browser, "editor-error");
        click(1, 1); // picks the room so the problem click has something to change
        problem.click();
        assertThat(props()).contains("Door");
        setInput("Clear width (m)", "0.9");
        waitChecked(false);
        assertThat(browser.findElements(By.cssSelector("#ed-problems li.error")))
                .isEmpty();

        // the plan shows walls where walls are, and the door's opening in the shared wall
        assertThat(isWall(pixel(browser, 12, 1.0)))
                .as("east wall of the drawn room")
                .isTrue();
        assertThat(isWall(pixel(browser, 8, 4.5)))
                .as("shared wall beside the door")
                .isTrue();
        assertThat(isWall(pixel(browser, 8, 2.5))).as("door opening").isFalse();
        assertThat(isWall(pixel(browser, 10, 1.5))).as("floor of the new room").isFalse();

        browser.findElement(By.id("ed-message")).sendKeys("second room, door, kidnap");
        browser.findElement(By.id("ed-save-button")).click();
        patient(browser, 10)
                .until(d -> d.findElement(By.id("ed-notice")).getText().contains("Saved as revision 2"));
        assertThat(browser.findElement(By.id("ed-dirty")).getText()).isEqualTo("no unsaved changes");
        Browser.screenshot(browser, "editor-saved");
        JsonNode saved = JSON.readTree(browser.findElement(By.id("editor")).getDomAttribute("data-saved-document"));

        browser.navigate().refresh();
        waitReady(browser);
        JsonNode reloaded = JSON.readTree(browser.findElement(By.id("editor")).getDomAttribute("data-document"));
        assertThat(browser.findElement(By.id("ed-revision")).getText()).isEqualTo("revision 2");
        assertThat(reloaded.path("site").path("rooms")).hasSize(2);
        assertThat(reloaded.path("site").path("rooms").get(1).path("outline").toString())
                .isEqualTo("[[8,0],[12,0],[12,5],[8,5]]");
        assertThat(reloaded).isEqualTo(saved);
        assertThat(reloaded.path("faults").toString())
                .contains("\"kind\":\"blackout\",\"duration\":2,\"enters\":\"office\"");
        assertThat(reloaded.path("variants").toString())
                .isEqualTo("[{\"name\":\"more particles\",\"localizer\":{\"particles\":{\"count\":3000}}}]");
        JsonNode door = reloaded.path("site").path("doors").get(0);
        assertThat(door.path("room").asString()).isEqualTo("office");
        assertThat(door.path("wall").asInt()).isEqualTo(1);
        assertThat(door.path("along").asDouble()).isEqualTo(2.5);
        assertThat(door.path("width").asDouble()).isEqualTo(0.9);
        assertThat(reloaded.path("route").path("waypoints")).hasSize(3);
        assertThat(reloaded.path("route").path("start").path("heading").asDouble())
                .isEqualTo(0.0);
        assertThat(reloaded.path("faults").toString())
                .contains("\"kind\":\"spurious-max-range\",\"duration\":2,\"share\":0.5,\"at\":5");
        JsonNode kidnap = reloaded.path("faults").get(0);
        assertThat(kidnap.path("kind").asString()).isEqualTo("kidnap");
        assertThat(kidnap.path("at").asDouble()).isEqualTo(12.0);
        assertThat(kidnap.path("to").path("x").asDouble()).isEqualTo(11.0);
        assertThat(kidnap.path("to").path("y").asDouble()).isEqualTo(4.0);
        assertThat(browser.findElements(By.cssSelector(".ed-marker.kind-kidnap")))
                .hasSize(1);
        assertThat(browser.findElements(By.cssSelector("#ed-route tbody tr"))).hasSize(4);
        assertThat(reloaded.path("robot").path("wheelbase").asDouble()).isEqualTo(0.45);
        assertThat(isWall(pixel(browser, 8, 4.5))).isTrue();
        Browser.screenshot(browser, "editor-reloaded");

        // someone else saves meanwhile: this browser's next save is refused with a way to reload
        String editToken = editorUrl.replaceAll(".*/s/([^/]+)/editor$", "$1");
        Object other = ((JavascriptExecutor) browser)
                .executeAsyncScript(
                        "const done = arguments[arguments.length - 1];"
                                + "fetch('/api/s/' + arguments[0] + '/revisions?base=2&message=elsewhere',"
                                + " {method: 'POST', headers: {'Content-Type': 'application/json'},"
                                + " body: document.getElementById('editor').dataset.document})"
                                + ".then(r => done(r.status));",
                        editToken);
        assertThat(((Number) other).intValue()).isEqualTo(201);
        tool("waypoint");
        click(11, 1);
        browser.findElement(By.id("ed-save-button")).click();
        WebElement conflict = patient(browser, 10)
                .until(d -> d.findElement(By.id("ed-notice")).getText().contains("Not saved")
                        ? d.findElement(By.id("ed-notice"))
                        : null);
        assertThat(conflict.getText())
                .contains("revision 2")
                .contains("revision 3")
                .contains("Reload");
        Browser.screenshot(browser, "editor-conflict");
        conflict.findElement(By.xpath(".//button[normalize-space()='Reload the latest revision']"))
                .click();
        waitReady(browser);
        assertThat(browser.findElement(By.id("ed-revision")).getText()).isEqualTo("revision 3");
        assertThat(browser.findElements(By.cssSelector("#ed-route tbody tr"))).hasSize(4);

        // a run of the saved revision from the editor, with its progress row and link
        browser.findElement(By.xpath("//summary[normalize-space()='Run']")).click();
        WebElement seeds = browser.findElement(By.id("seedCount"));
        seeds.clear();
        seeds.sendKeys("1");
        browser.findElement(By.cssSelector("#runs form button[type=submit]")).click();
        WebElement runLink = patient(browser, 15)
                .until(d -> d.findElements(By.cssSelector("#runs table a")).stream()
                        .findFirst()
                        .orElse(null));
        assertThat(runLink.getDomAttribute("href")).matches("/s/[^/]+/runs/\\d+");
        assertThat(browser.findElement(By.id("runs")).getText()).contains("base");

        // the view link, in a fresh browser: drawn, but editing is refused
        browser.findElement(By.cssSelector("#ed-share summary")).click();
        String viewPath = browser.findElement(By.id("ed-view-link")).getDomProperty("value");
        viewer = Browser.open(1280, 800);
        viewer.get("http://localhost:" + port + viewPath + "/editor");
        waitReady(viewer);
        assertThat(viewer.findElement(By.id("ed-readonly")).getText()).contains("editing is refused");
        assertThat(viewer.findElements(By.id("ed-save"))).isEmpty();
        assertThat(viewer.findElements(By.cssSelector("button[data-tool=box-room]")))
                .isEmpty();
        assertThat(viewer.findElements(By.id("ed-fault-add"))).isEmpty();
        assertThat(viewer.findElements(By.id("ed-share"))).isEmpty();
        viewer.findElement(By.id("ed-plan")).sendKeys("r");
        assertThat(viewer.findElement(By.id("ed-notice")).getText()).contains("editing is refused");
        assertThat(viewer.findElement(By.cssSelector("#settings-robot fieldset"))
                        .getDomProperty("disabled"))
                .isEqualTo("true");
        assertThat(isWall(pixel(viewer, 12, 1.0))).isTrue();
        Object status = ((JavascriptExecutor) viewer)
                .executeAsyncScript("const done = arguments[arguments.length - 1];"
                        + "const h = JSON.parse(document.body.getAttribute('hx-headers'));"
                        + "fetch(location.pathname.replace('/editor', '/editor/settings/robot'),"
                        + " {method: 'POST', headers: h, body: new URLSearchParams({wheelbase: '0.5'})})"
                        + ".then(r => done(r.status));");
        assertThat(((Number) status).intValue()).isEqualTo(403);
        Browser.screenshot(viewer, "editor-view-link");
    }

    @Test
    void withoutAPointer_placesByCursorAndByCoordinates_picksFromTheItemList_andKeepsFocus() {
        browser = Browser.open(1280, 800);
        browser.get("http://localhost:" + port + "/");
        browser.findElement(By.id("new-in-editor")).click();
        waitReady(browser);
        WebElement plan = browser.findElement(By.id("ed-plan"));
        assertThat(plan.getDomAttribute("aria-describedby")).contains("ed-plan-desc");
        assertThat(browser.findElement(By.id("ed-plan-desc")).getDomProperty("textContent"))
                .contains("Site plan with 1 rooms");
        int rows = browser.findElements(By.cssSelector("#ed-route tbody tr")).size();

        // a waypoint with the keyboard cursor: w, two steps east, Enter
        plan.sendKeys("w", Keys.ARROW_RIGHT, Keys.ARROW_RIGHT, Keys.ENTER);
        assertThat(browser.findElements(By.cssSelector("#ed-route tbody tr"))).hasSize(rows + 1);
        assertThat(browser.findElement(By.id("ed-cursor")).getText()).contains("cursor x");

        // a room with the cursor: r, Enter at one corner, four steps north-east, Enter
        plan.sendKeys("r", Keys.ENTER);
        for (int i = 0; i < 4; i++) {
            plan.sendKeys(Keys.ARROW_RIGHT, Keys.ARROW_UP);
        }
        plan.sendKeys(Keys.ENTER);
        assertThat(props()).contains("Room").contains("4 corners: (4.5, 2.5) (5.5, 2.5)");
        assertThat(inputValue("Id")).isEqualTo("room-2");

        // a fixture, a door and a waypoint from the "Add by coordinates" forms
        browser.findElement(By.xpath("//summary[normalize-space()='Add by coordinates']"))
                .click();
        new Select(browser.findElement(By.id("ed-add-kind"))).selectByValue("fixture");
        type("ed-add-x0", "1");
        type("ed-add-y0", "1");
        type("ed-add-x1", "2");
        type("ed-add-y1", "1.5");
        browser.findElement(By.cssSelector("#ed-add-outline button")).click();
        assertThat(props()).contains("Fixture").contains("(1, 1) (2, 1) (2, 1.5) (1, 1.5)");
        new Select(browser.findElement(By.id("ed-add-door-room"))).selectByValue("room-1");
        type("ed-add-door-wall", "0");
        type("ed-add-door-along", "2");
        browser.findElement(By.cssSelector("#ed-add-door button")).click();
        assertThat(props()).contains("Door");
        assertThat(inputValue("Room")).isEqualTo("room-1");
        type("ed-add-wx", "3");
        type("ed-add-wy", "2");
        browser.findElement(By.cssSelector("#ed-add-waypoint button")).click();
        assertThat(browser.findElements(By.cssSelector("#ed-route tbody tr"))).hasSize(rows + 2);

        // the item list picks from the keyboard and keeps the focus in the list
        WebElement fixture = browser.findElements(By.cssSelector("#ed-items button")).stream()
                .filter(b -> b.getText().startsWith("Fixture"))
                .findFirst()
                .orElseThrow();
        fixture.sendKeys(Keys.ENTER);
        assertThat(props()).contains("Fixture");
        assertThat(activeIn("ed-items")).isTrue();
        assertThat(browser.switchTo().activeElement().getText()).startsWith("Fixture");
        assertThat(browser.switchTo().activeElement().getDomAttribute("aria-pressed"))
                .isEqualTo("true");

        // a change in the route table rebuilds it; the focus stays in the table
        WebElement x = browser.findElement(By.cssSelector("#ed-route tbody tr:last-child input"));
        x.sendKeys(Keys.chord(Keys.CONTROL, "a"), "4", Keys.ENTER);
        patient(browser, 5)
                .until(d -> d.findElement(By.cssSelector("#ed-route tbody tr:last-child input"))
                        .getDomProperty("value")
                        .equals("4"));
        assertThat(activeIn("ed-route"))
                .as("focus after rebuilding the route table")
                .isTrue();

        // single keys belong to the plan: on a button they do nothing
        browser.findElement(By.id("ed-fit")).sendKeys("s");
        assertThat(browser.findElement(By.cssSelector("button[data-tool='box-room']"))
                        .getDomAttribute("aria-pressed"))
                .isEqualTo("true");

        assertThat(Axe.violations(browser)).as("axe-core on the editor").isEmpty();
    }

    private void type(String id, String value) {
        WebElement input = browser.findElement(By.id(id));
        input.clear();
        input.sendKeys(value);
    }

    private boolean activeIn(String id) {
        return (Boolean) ((JavascriptExecutor) browser)
                .executeScript("return document.getElementById(arguments[0]).contains(document.activeElement);", id);
    }

    /** A wait that also rides out htmx swapping an element while it is read. */
    private static WebDriverWait patient(WebDriver d, int seconds) {
        WebDriverWait w = new WebDriverWait(d, Duration.ofSeconds(seconds));
        w.ignoring(StaleElementReferenceException.class);
        return w;
    }

    private void waitReady(WebDriver d) {
        patient(d, 15).until(x -> "true".equals(x.findElement(By.id("editor")).getDomAttribute("data-ready")));
    }

    /** Waits until the check has answered for the latest change (and, if asked, has errors). */
    @Test
    void importOccupancyMap_addsARoomTheSizeOfTheImageWithItsWallBlocks() throws Exception {
        // a 40 x 20 pixel greymap at 0.1 m: a dark 4 x 4 pillar, the rest grey (unknown) or white
        byte[] header = "P5\n40 20\n255\n".getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        byte[] pgm = java.util.Arrays.copyOf(header, header.length + 800);
        java.util.Arrays.fill(pgm, header.length, pgm.length, (byte) 254);
        for (int row = 8; row < 12; row++) {
            for (int x = 18; x < 22; x++) {
                pgm[header.length + row * 40 + x] = 0;
            }
        }
        pgm[header.length] = (byte) 180;
        java.nio.file.Path file = java.nio.file.Files.createTempFile("occupancy", ".pgm");
        java.nio.file.Files.write(file, pgm);

        browser = Browser.open(1280, 800);
        browser.get("http://localhost:" + port + "/");
        browser.findElement(By.id("new-in-editor")).click();
        waitReady(browser);
        browser.findElement(By.xpath("//summary[normalize-space()='Import a floor plan image']"))
                .click();
        browser.findElement(By.id("ed-import-file"))
                .sendKeys(file.toAbsolutePath().toString());
        WebElement cell = browser.findElement(By.id("ed-import-cell"));
        cell.clear();
        cell.sendKeys("0.1");
        WebElement x = browser.findElement(By.id("ed-import-x"));
        x.clear();
        x.sendKeys("20");
        assertThat(browser.findElement(By.id("ed-import-room")).isSelected()).isTrue();
        browser.findElement(By.cssSelector("#ed-import button[type=submit]")).click();
        patient(browser, 10)
                .until(d -> d.findElement(By.id("ed-import-msg")).getText().contains("inside a room the size"));
        assertThat(browser.findElement(By.id("ed-import-msg")).getText()).startsWith("Added 1 wall block(s)");
        waitChecked(false);

        browser.findElement(By.id("ed-message")).sendKeys("imported map");
        browser.findElement(By.id("ed-save-button")).click();
        patient(browser, 10)
                .until(d -> d.findElement(By.id("ed-notice")).getText().contains("Saved as revision 2"));
        JsonNode saved = JSON.readTree(browser.findElement(By.id("editor")).getDomAttribute("data-saved-document"));
        JsonNode rooms = saved.path("site").path("rooms");
        JsonNode area = rooms.get(rooms.size() - 1);
        assertThat(area.path("id").asString()).startsWith("imported-area");
        assertThat(area.path("outline").toString()).isEqualTo("[[20,0],[24,0],[24,2],[20,2]]");
        JsonNode fixtures = saved.path("site").path("fixtures");
        assertThat(fixtures.get(fixtures.size() - 1).path("outline").toString())
                .isEqualTo("[[21.8,0.8],[22.2,0.8],[22.2,1.2],[21.8,1.2]]");
        java.nio.file.Files.deleteIfExists(file);
    }

    private void waitChecked(boolean errors) {
        patient(browser, 10).until(d -> {
            String s = d.findElement(By.id("ed-check-state")).getText();
            return !s.contains("checking") && !s.isEmpty() && (errors == s.matches("^[1-9].*error.*"));
        });
    }

    private void tool(String name) {
        browser.findElement(By.cssSelector("button[data-tool='" + name + "']")).click();
    }

    private String props() {
        return browser.findElement(By.id("ed-props")).getText();
    }

    private WebElement field(String label) {
        WebElement l = browser.findElement(By.xpath("//div[@id='ed-props']//label[normalize-space()='" + label + "']"));
        return browser.findElement(By.id(l.getDomAttribute("for")));
    }

    private String inputValue(String label) {
        return field(label).getDomProperty("value");
    }

    private void setInput(String label, String value) {
        WebElement input = field(label);
        input.sendKeys(Keys.chord(Keys.CONTROL, "a"), value, Keys.TAB);
    }

    /** Canvas-centre offsets of a point in metres, from the view the editor publishes on the canvas. */
    private int[] offset(WebDriver d, double x, double y) {
        @SuppressWarnings("unchecked")
        Map<String, Object> v = (Map<String, Object>) ((JavascriptExecutor) d)
                .executeScript("const c = document.getElementById('ed-plan'); const v = JSON.parse(c.dataset.view);"
                        + " const r = c.getBoundingClientRect(); v.w = r.width; v.h = r.height; return v;");
        double scale = ((Number) v.get("scale")).doubleValue();
        double px = ((Number) v.get("ox")).doubleValue() + x * scale;
        double py = ((Number) v.get("oy")).doubleValue() - y * scale;
        return new int[] {
            (int) Math.round(px - ((Number) v.get("w")).doubleValue() / 2),
            (int) Math.round(py - ((Number) v.get("h")).doubleValue() / 2)
        };
    }

    private WebElement planInView() {
        WebElement plan = browser.findElement(By.id("ed-plan"));
        ((JavascriptExecutor) browser).executeScript("arguments[0].scrollIntoView({block: 'center'});", plan);
        return plan;
    }

    private void click(double x, double y) {
        WebElement plan = planInView();
        int[] o = offset(browser, x, y);
        new Actions(browser).moveToElement(plan, o[0], o[1]).click().perform();
    }

    private void drag(double x0, double y0, double x1, double y1) {
        WebElement plan = planInView();
        int[] a = offset(browser, x0, y0);
        int[] b = offset(browser, x1, y1);
        new Actions(browser)
                .moveToElement(plan, a[0], a[1])
                .clickAndHold()
                .moveToElement(plan, (a[0] + b[0]) / 2, (a[1] + b[1]) / 2)
                .moveToElement(plan, b[0], b[1])
                .release()
                .perform();
    }

    /** RGB of the canvas pixel at a point in metres, read with getImageData. */
    private int[] pixel(WebDriver d, double x, double y) {
        @SuppressWarnings("unchecked")
        List<Number> rgb = (List<Number>) ((JavascriptExecutor) d)
                .executeScript(
                        "const c = document.getElementById('ed-plan'); const v = JSON.parse(c.dataset.view);"
                                + " const px = (v.ox + arguments[0] * v.scale) * v.dpr;"
                                + " const py = (v.oy - arguments[1] * v.scale) * v.dpr;"
                                + " return Array.from(c.getContext('2d').getImageData(Math.round(px), Math.round(py), 1, 1).data);",
                        x,
                        y);
        return new int[] {
            rgb.get(0).intValue(), rgb.get(1).intValue(), rgb.get(2).intValue()
        };
    }

    private static boolean isWall(int[] rgb) {
        return Math.abs(rgb[0] - WALL[0]) < 24 && Math.abs(rgb[1] - WALL[1]) < 24 && Math.abs(rgb[2] - WALL[2]) < 24;
    }
}
