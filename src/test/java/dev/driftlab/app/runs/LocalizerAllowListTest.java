package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.springframework.mock.env.MockEnvironment;

/** The administrator's list of outside localizers: read from the properties, checked at start. */
class LocalizerAllowListTest {

    @Test
    void properties_giveNamesCommandsLimitsAndDescriptions_inNameOrder() {
        MockEnvironment env = new MockEnvironment()
                .withProperty("driftlab.localizers.zeta.command", "/opt/loc/zeta --fast")
                .withProperty("driftlab.localizers.dead-reckoning.command", "java 'my dir/DeadReckoning.java'")
                .withProperty("driftlab.localizers.dead-reckoning.answer-limit", "250ms")
                .withProperty("driftlab.localizers.dead-reckoning.description", "  odometry only ");
        LocalizerAllowList list = new LocalizerAllowList(env);

        assertThat(list.names()).containsExactly("dead-reckoning", "zeta");
        LocalizerAllowList.Allowed dr = list.find("dead-reckoning").orElseThrow();
        // quoting as a POSIX shell splits it, never run through a shell
        assertThat(dr.command()).containsExactly("java", "my dir/DeadReckoning.java");
        assertThat(dr.limits().answer()).isEqualTo(Duration.ofMillis(250));
        assertThat(dr.description()).isEqualTo("odometry only");
        assertThat(list.find("zeta").orElseThrow().limits().answer()).isEqualTo(Duration.ofSeconds(5));
        assertThat(dr.source().name()).isEqualTo("java my dir/DeadReckoning.java");
        assertThat(list.find("absent")).isEmpty();
        assertThat(list.find(null)).isEmpty();
    }

    @Test
    void noProperties_noOutsideLocalizers() {
        assertThat(new LocalizerAllowList(new MockEnvironment()).names()).isEmpty();
    }

    @Test
    void entriesThatDoNotRead_stopTheStart_namingTheProperty() {
        record Case(String name, LocalizerAllowList.Entry entry, String says) {}
        List<Case> cases = List.of(
                new Case(
                        "Dead_Reckoning",
                        new LocalizerAllowList.Entry("java A.java", null, null),
                        "driftlab.localizers.Dead_Reckoning: a localizer's name"),
                new Case("a", new LocalizerAllowList.Entry(null, null, null), "driftlab.localizers.a.command"),
                new Case(
                        "b",
                        new LocalizerAllowList.Entry("   ", null, null),
                        "driftlab.localizers.b.command needs a command"),
                new Case(
                        "c",
                        new LocalizerAllowList.Entry("java 'A.java", null, null),
                        "driftlab.localizers.c.command has an unclosed single quote"),
                new Case(
                        "d",
                        new LocalizerAllowList.Entry("java A.java", Duration.ofMillis(5), null),
                        "driftlab.localizers.d.answer-limit"),
                new Case(
                        "e",
                        new LocalizerAllowList.Entry("java A.java", Duration.ofHours(1), null),
                        "driftlab.localizers.e.answer-limit"),
                new Case(
                        "f",
                        new LocalizerAllowList.Entry("java A.java", null, "x".repeat(201)),
                        "driftlab.localizers.f.description"));
        for (Case c : cases) {
            assertThatThrownBy(() -> new LocalizerAllowList(Map.of(c.name(), c.entry())))
                    .as(c.name())
                    .isInstanceOf(IllegalStateException.class)
                    .hasMessageContaining(c.says());
        }
    }

    @Test
    void aRunsLocalizerField_takesANameOrNothing_neverACommand() {
        assertThat(LocalizerAllowList.requestedName(null)).isNull();
        assertThat(LocalizerAllowList.requestedName("  ")).isNull();
        assertThat(LocalizerAllowList.requestedName("built-in")).isNull();
        assertThat(LocalizerAllowList.requestedName(" dead-reckoning ")).isEqualTo("dead-reckoning");
        for (String bad : List.of("java Evil.java", "../x", "a;b", "-x", "UPPER")) {
            assertThatThrownBy(() -> LocalizerAllowList.requestedName(bad))
                    .as(bad)
                    .isInstanceOf(RunRefused.class)
                    .hasMessageContaining("never accepted");
        }
    }
}
