package dev.driftlab.scenario;

import static org.assertj.core.api.Assertions.assertThat;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The door width warnings at their boundaries. Outside figures: ADA 2010 Standards for Accessible
 * Design, 404.2.3 (door clear width at least 32 in, given there as 815 mm); UK Approved Document M
 * vol. 2 (Buildings other than dwellings), 2015 edition, Table 2 (effective clear width at least 800
 * mm for a new building's door used by the public, table number from memory). The validator warns
 * below the larger of the two, the ADA figure.
 */
class DoorWidthRuleTest {

    private static final String WIDTH = "site.doors[0].width";

    /** The width warnings of the corridor with its door set to {@code width} metres. */
    private static List<Problem> widthWarnings(String width) {
        ValidationReport r =
                ScenarioFiles.check(Docs.corridor().set(WIDTH, width).json()).report();
        assertThat(r.hasErrors()).as("errors: %s", r.problems()).isFalse();
        return r.warnings().stream().filter(p -> p.path().equals(WIDTH)).toList();
    }

    @Test
    void threshold_isTheAdaFigure() {
        // ADA 2010 404.2.3: 815 mm; it is also above the UK 800 mm, so a door meeting ADA meets both
        assertThat(SiteChecks.ACCESSIBLE_DOOR_WIDTH).isEqualTo(0.815);
        assertThat(SiteChecks.ACCESSIBLE_DOOR_WIDTH).isGreaterThanOrEqualTo(0.800);
    }

    @ParameterizedTest(name = "{0} m warns")
    @CsvSource({
        "0.8149, 0.815", // just under 815 mm (shown rounded to the millimetre)
        "0.814, 0.814",
        "0.800, 0.8", // the UK minimum: allowed there, still under the ADA figure
        "0.7999, 0.8", // just under the UK minimum
        "0.6, 0.6" // exactly the robot's width (0.6 m across): it fits, so the accessibility warning
    })
    void underAccessibleWidth_warnsNamingTheSource(String width, String shown) {
        assertThat(widthWarnings(width))
                .singleElement()
                .satisfies(p -> assertThat(p.message())
                        .isEqualTo(
                                shown + " m is under the 0.815 m accessible clear width (ADA 2010 Standards 404.2.3)"));
    }

    @ParameterizedTest(name = "{0} m is clean")
    @CsvSource({
        "0.815", // exactly the minimum
        "0.8151", // just over
        "0.816", "0.9"
    })
    void atOrOverAccessibleWidth_noWidthWarning(String width) {
        assertThat(widthWarnings(width)).isEmpty();
    }

    @Test
    void narrowerThanTheRobot_warnsAboutTheRobotOnly() {
        // just under the robot's 0.6 m: the robot warning replaces the accessibility one
        assertThat(widthWarnings("0.599"))
                .singleElement()
                .satisfies(p -> assertThat(p.message()).contains("narrower than the robot (0.6 m across)"));
    }
}
