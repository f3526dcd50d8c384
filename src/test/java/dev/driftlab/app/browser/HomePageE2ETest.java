package dev.driftlab.app.browser;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.openqa.selenium.By;
import org.openqa.selenium.WebDriver;
import org.openqa.selenium.WebElement;
import org.springframework.boot.test.context.SpringBootTest;
import org.springframework.boot.test.web.server.LocalServerPort;

/** The home page in a real browser: every sample listed with its drawn site plan. */
@Tag("e2e")
@SpringBootTest(webEnvironment = SpringBootTest.WebEnvironment.RANDOM_PORT)
class HomePageE2ETest {

    @LocalServerPort
    int port;

    private WebDriver browser;

    @BeforeEach
    void open() {
        browser = Browser.open(1280, 900);
    }

    @AfterEach
    void close() {
        if (browser != null) {
            browser.quit();
        }
    }

    @Test
    void home_showsEverySampleWithItsPlan() {
        browser.get("http://localhost:" + port + "/");

        // other browser tests share this server's database, so the list may hold more scenarios
        // than the samples; the page draws plans within its drawing budget and says so for the rest
        List<WebElement> cards = browser.findElements(By.cssSelector("li.scenario-card"));
        assertThat(cards).isNotEmpty();
        int drawn = 0;
        for (WebElement card : cards) {
            boolean plan = !card.findElements(By.cssSelector("svg.site-plan")).isEmpty();
            boolean note = card.getText().contains("Plan too large to");
            assertThat(plan && note)
                    .as("a card draws its plan or says why not: %s", card.getText())
                    .isFalse();
            drawn += plan ? 1 : 0;
        }
        assertThat(drawn).isGreaterThanOrEqualTo(1);
        List<WebElement> plans = browser.findElements(By.cssSelector("svg.site-plan"));
        assertThat(plans.get(0).getSize().getWidth()).isGreaterThan(200);
        assertThat(browser.getPageSource())
                .contains("Storage hall: robot carried away mid-route")
                .contains("Clinic corridor with look-alike doors")
                .contains("Open office: carpet edge and a silent wheel stall")
                .contains("Ward: door shut against the map, carts in the corridor");
        // the sample picker stays inside its card, whatever the length of the sample names
        WebElement picker = browser.findElement(By.id("sample"));
        WebElement card = picker.findElement(By.xpath("ancestor::form[1]"));
        assertThat(picker.getRect().getX() + picker.getRect().getWidth())
                .isLessThanOrEqualTo(card.getRect().getX() + card.getRect().getWidth());
        assertThat(Axe.serious(browser)).as("axe-core on the home page").isEmpty();
        assertThat(Browser.screenshot(browser, "home")).exists();
    }
}
