package dev.driftlab.app.reports;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.evaluation.Episode;
import dev.driftlab.evaluation.KidnapOutcome;
import dev.driftlab.evaluation.TrialOutcome;
import dev.driftlab.report.ResultJson;
import java.util.List;
import org.assertj.core.data.Offset;
import org.junit.jupiter.api.Test;
import tools.jackson.databind.json.JsonMapper;
import tools.jackson.databind.node.ObjectNode;

/** Trials read back from a stored result document equal the ones written. */
class RunReportsTest {

    @Test
    void trials_roundTripThroughTheResultDocument_missingFiguresStayMissing() {
        TrialOutcome t = new TrialOutcome(
                "no injection",
                11,
                120.5,
                0.25,
                0.2,
                4.1,
                Math.toRadians(12),
                Double.NaN,
                List.of(new Episode(85, 120.5, false)),
                List.of(new KidnapOutcome(85, 1.3, Double.NaN)),
                2,
                812.5,
                new dev.driftlab.evaluation.TrialEnd(dev.driftlab.evaluation.TrialEnd.Kind.CONTACT, 37.25, 5.2, 5.9),
                List.of(
                        new dev.driftlab.sim.FaultFiring("carried", true, 85, ""),
                        new dev.driftlab.sim.FaultFiring("late", false, Double.NaN, "the trial ended first")),
                0.031,
                Double.NaN);
        JsonMapper mapper = JsonMapper.builder().build();
        ObjectNode doc = mapper.createObjectNode();
        ResultJson.trialNode(doc.putArray("trials").addObject(), t);

        TrialOutcome back = RunReports.trials(doc).get(0);

        assertThat(back.variant()).isEqualTo("no injection");
        assertThat(back.seed()).isEqualTo(11);
        assertThat(back.finalHeadingError()).isCloseTo(t.finalHeadingError(), Offset.offset(1e-6));
        assertThat(back.converged()).isFalse();
        assertThat(back.lost()).containsExactly(new Episode(85, 120.5, false));
        assertThat(back.kidnaps().get(0).recovered()).isFalse();
        assertThat(back.kidnaps().get(0).noticedAfter()).isEqualTo(1.3);
        assertThat(back.collisions()).isEqualTo(2);
        assertThat(back.meanParticles()).isEqualTo(812.5);
        assertThat(back.end()).isEqualTo(t.end());
        assertThat(back.faults()).isEqualTo(t.faults());
        assertThat(back.rpe1()).isEqualTo(0.031);
        assertThat(back.rpe5()).isNaN();
    }

    @Test
    void trials_ofAVersionOneDocument_readAsHavingDrivenTheWholeRoute() {
        JsonMapper mapper = JsonMapper.builder().build();
        ObjectNode doc = mapper.createObjectNode();
        ObjectNode t = doc.putArray("trials").addObject();
        t.put("variant", "base");
        t.put("seed", 3);
        t.put("duration", 42.5);

        TrialOutcome back = RunReports.trials(doc).get(0);

        assertThat(back.end().early()).isFalse();
        assertThat(back.end().time()).isEqualTo(42.5);
        assertThat(back.faults()).isEmpty();
    }
}
