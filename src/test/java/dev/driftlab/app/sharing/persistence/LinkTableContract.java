package dev.driftlab.app.sharing.persistence;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.jdbc.core.simple.JdbcClient;

/**
 * The shared link queries on both link tables (scenarios' {@code share_link}, suites' {@code
 * suite_link}) and on every supported database: run on H2 and on PostgreSQL by the subclasses.
 */
abstract class LinkTableContract {

    static final OffsetDateTime T0 = OffsetDateTime.of(2026, 3, 1, 12, 0, 0, 0, ZoneOffset.UTC);
    static final OffsetDateTime T1 = T0.plusMinutes(5);
    static final OffsetDateTime T2 = T0.plusMinutes(9);

    @Autowired
    JdbcClient jdbc;

    /** A new row in the owner table ({@code scenario} or {@code suite}: the same head columns). */
    long owner(String ownerTable) {
        return LinkOwners.insert(jdbc, ownerTable, T0);
    }

    /** Tokens of this test only: rows stay behind between tests on a shared database. */
    final String prefix =
            java.util.UUID.randomUUID().toString().replace("-", "").substring(0, 20);

    String token(char c) {
        return prefix + String.valueOf(c).repeat(23);
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void linksResolveUntilRevoked_andEachOwnerSeesOnlyItsOwn(String table, String column, String ownerTable) {
        LinkTable links = new LinkTable(jdbc, table, column);
        long a = owner(ownerTable);
        long b = owner(ownerTable);
        links.insert(token('v'), a, "view", T0);
        links.insert(token('e'), a, "edit", T1);
        links.insert(token('w'), b, "view", T0);

        LinkTable.LinkRow v = links.findActive(token('v')).orElseThrow();
        assertThat(v).isEqualTo(new LinkTable.LinkRow(token('v'), a, "view", T0, false));
        assertThat(links.activeFor(a)).extracting(LinkTable.LinkRow::token).containsExactly(token('v'), token('e'));
        assertThat(links.activeFor(b)).extracting(LinkTable.LinkRow::token).containsExactly(token('w'));
        assertThat(links.findActive(token('x'))).isEmpty();

        assertThat(links.revoke(a, "edit", T2)).isEqualTo(1);
        assertThat(links.revoke(a, "edit", T2)).isZero();
        assertThat(links.findActive(token('e'))).isEmpty();
        assertThat(links.findActive(token('v'))).isPresent();
        assertThat(links.activeFor(a)).extracting(LinkTable.LinkRow::token).containsExactly(token('v'));
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void viewLinksOfManyOwners_neverAnEditLink(String table, String column, String ownerTable) {
        LinkTable links = new LinkTable(jdbc, table, column);
        long a = owner(ownerTable);
        long b = owner(ownerTable);
        long c = owner(ownerTable);
        links.insert(token('a'), a, "view", T0);
        links.insert(token('A'), a, "edit", T0);
        links.insert(token('b'), b, "view", T0);
        links.insert(token('C'), c, "edit", T0);

        assertThat(links.activeViewLinks(List.of(a, c, c + 1000)))
                .extracting(LinkTable.LinkRow::token)
                .containsExactly(token('a'));
        assertThat(links.activeViewLinks(List.of())).isEmpty();
        assertThat(links.activeViewLinks())
                .extracting(LinkTable.LinkRow::token)
                .contains(token('a'), token('b'))
                .doesNotContain(token('A'), token('C'));
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void reissue_revokesTheOldLinkOfThatKindOnly_andRemembersWhen(String table, String column, String ownerTable) {
        LinkTable links = new LinkTable(jdbc, table, column);
        long a = owner(ownerTable);
        links.insert(token('v'), a, "view", T0);
        links.insert(token('e'), a, "edit", T0);
        assertThat(links.lastRevoked(a, "view")).isEmpty();

        links.reissue(a, "view", token('n'), T1);
        links.reissue(a, "view", token('m'), T2);

        assertThat(links.findActive(token('v'))).isEmpty();
        assertThat(links.findActive(token('n'))).isEmpty();
        assertThat(links.findActive(token('m')).orElseThrow().createdAt()).isEqualTo(T2);
        assertThat(links.findActive(token('e'))).isPresent();
        assertThat(links.lastRevoked(a, "view").orElseThrow().toInstant()).isEqualTo(T2.toInstant());
        assertThat(links.lastRevoked(a, "edit")).isEmpty();
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void deletingTheOwner_deletesItsLinks(String table, String column, String ownerTable) {
        LinkTable links = new LinkTable(jdbc, table, column);
        long a = owner(ownerTable);
        links.insert(token('v'), a, "view", T0);
        jdbc.sql("DELETE FROM " + ownerTable + " WHERE id = ?").param(a).update();
        assertThat(links.findActive(token('v'))).isEmpty();
        assertThat(links.activeFor(a)).isEmpty();
    }

    @Test
    void theTwoTablesAreApart() {
        LinkTable scenarios = new LinkTable(jdbc, "share_link", "scenario_id");
        LinkTable suites = new LinkTable(jdbc, "suite_link", "suite_id");
        long s = owner("scenario");
        scenarios.insert(token('s'), s, "view", T0);
        assertThat(suites.findActive(token('s'))).isEmpty();
    }

    @Test
    void namesThatAreNotPlainIdentifiers_areRefused() {
        assertThatThrownBy(() -> new LinkTable(jdbc, "share_link; DROP TABLE scenario", "scenario_id"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageStartingWith("table:");
        assertThatThrownBy(() -> new LinkTable(jdbc, "share_link", "Scenario_Id"))
                .isInstanceOf(IllegalArgumentException.class)
                .hasMessageStartingWith("ownerColumn:");
    }
}
