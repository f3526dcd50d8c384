package dev.driftlab.report;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.scenario.Scenario;
import dev.driftlab.scenario.ScenarioJson;
import dev.driftlab.scenario.Scenarios;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

class SitePlanSvgTest {

    private static Document parse(String svg) throws Exception {
        var f = DocumentBuilderFactory.newInstance();
        f.setNamespaceAware(true);
        return f.newDocumentBuilder().parse(new ByteArrayInputStream(svg.getBytes(StandardCharsets.UTF_8)));
    }

    @Test
    void render_isWellFormedSvg_withWallsDoorsFixturesAndRoute() throws Exception {
        Scenario s = ScenarioJson.read(Files.readString(Path.of("sample-projects/storage-hall-kidnap.json")));

        Document doc = parse(SitePlanSvg.render(s));

        assertThat(doc.getDocumentElement().getLocalName()).isEqualTo("svg");
        assertThat(byClass(doc, "line", "door-open")).isEqualTo(1);
        assertThat(byClass(doc, "polygon", "fixture"))
                .isEqualTo(s.site().fixtures().size());
        assertThat(byClass(doc, "polyline", "route")).isEqualTo(1);
        assertThat(byClass(doc, "polygon", "kidnap-to")).isEqualTo(1);
        assertThat(byClass(doc, "line", "wall")).isGreaterThanOrEqualTo(12);
    }

    @Test
    void closedMappedDoor_isDrawnAsClosed() throws Exception {
        Scenario s = Scenarios.corridor().build();
        String open = SitePlanSvg.render(s);
        String closed = SitePlanSvg.render(
                ScenarioJson.read(ScenarioJson.write(s).replace("\"mapped\" : \"open\"", "\"mapped\" : \"closed\"")));

        assertThat(byClass(parse(open), "line", "door-open")).isEqualTo(1);
        assertThat(byClass(parse(closed), "line", "door-closed")).isEqualTo(1);
    }

    @Test
    void namesAreEscaped() throws Exception {
        Scenario s = Scenarios.corridor()
                .withName("<script>alert(1)</script> & \"quotes\"")
                .build();

        String svg = SitePlanSvg.render(s);

        assertThat(svg)
                .doesNotContain("<script>")
                .contains("&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;quotes&quot;");
        parse(svg);
    }

    private static int byClass(Document doc, String tag, String cls) {
        NodeList nodes = doc.getElementsByTagNameNS("http://www.w3.org/2000/svg", tag);
        int n = 0;
        for (int i = 0; i < nodes.getLength(); i++) {
            String c = ((Element) nodes.item(i)).getAttribute("class");
            if (c.equals(cls)) {
                n++;
            }
        }
        return n;
    }
}
