package dev.driftlab.app.sharing;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import dev.driftlab.app.sharing.persistence.LinkOwners;
import dev.driftlab.app.sharing.persistence.LinkTable;
import java.time.Clock;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.springframework.beans.factory.annotation.Autowired;
import org.springframework.boot.jdbc.test.autoconfigure.AutoConfigureTestDatabase;
import org.springframework.boot.jdbc.test.autoconfigure.JdbcTest;
import org.springframework.jdbc.core.simple.JdbcClient;

/**
 * The link rules shared by scenarios and suites, on both link tables: a new owner gets one link of
 * each kind, only well-formed, known, unrevoked tokens open anything, reissuing replaces one kind
 * only, and listings see view links only.
 */
@JdbcTest
@AutoConfigureTestDatabase(replace = AutoConfigureTestDatabase.Replace.NONE)
class OwnerLinksTest {

    static final Instant NOW = Instant.parse("2026-03-01T12:00:00Z");

    @Autowired
    JdbcClient jdbc;

    OwnerLinks links(String table, String column) {
        return new OwnerLinks(new LinkTable(jdbc, table, column), Clock.fixed(NOW, ZoneOffset.UTC));
    }

    long owner(String ownerTable) {
        return LinkOwners.insert(jdbc, ownerTable, OffsetDateTime.ofInstant(NOW, ZoneOffset.UTC));
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void aNewOwnerGetsOneLinkOfEachKind_andEachOpensWithItsAccess(String table, String column, String ownerTable) {
        OwnerLinks links = links(table, column);
        long id = owner(ownerTable);
        OwnerLinks.Issued issued = links.issueBoth(id);

        assertThat(Tokens.wellFormed(issued.view())).isTrue();
        assertThat(Tokens.wellFormed(issued.edit())).isTrue();
        assertThat(issued.view()).isNotEqualTo(issued.edit());
        assertThat(links.current(id)).isEqualTo(Map.of(Access.VIEW, issued.view(), Access.EDIT, issued.edit()));
        assertThat(links.resolve(issued.view())).contains(new OwnerLinks.Opened(id, Access.VIEW, issued.view()));
        assertThat(links.require(issued.edit())).isEqualTo(new OwnerLinks.Opened(id, Access.EDIT, issued.edit()));
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void reissue_replacesOneKindOnly_andTheOldTokenOpensNothing(String table, String column, String ownerTable) {
        OwnerLinks links = links(table, column);
        long id = owner(ownerTable);
        OwnerLinks.Issued issued = links.issueBoth(id);

        String fresh = links.reissue(id, Access.VIEW);

        assertThat(fresh).isNotEqualTo(issued.view());
        assertThat(links.resolve(issued.view())).isEmpty();
        assertThat(links.current(id)).isEqualTo(Map.of(Access.VIEW, fresh, Access.EDIT, issued.edit()));
        assertThat(links.lastRevoked(id, Access.VIEW).orElseThrow().toInstant()).isEqualTo(NOW);
        assertThat(links.lastRevoked(id, Access.EDIT)).isEmpty();

        links.revoke(id, Access.EDIT);
        assertThat(links.current(id)).isEqualTo(Map.of(Access.VIEW, fresh));
        assertThatThrownBy(() -> links.require(issued.edit()))
                .isInstanceOf(LinkNotFound.class)
                .hasMessageContaining("may have been revoked");
    }

    @ParameterizedTest
    @CsvSource({"share_link, scenario_id, scenario", "suite_link, suite_id, suite"})
    void listingsSeeViewTokensOnly(String table, String column, String ownerTable) {
        OwnerLinks links = links(table, column);
        long a = owner(ownerTable);
        long b = owner(ownerTable);
        OwnerLinks.Issued ia = links.issueBoth(a);
        OwnerLinks.Issued ib = links.issueBoth(b);
        links.revoke(b, Access.VIEW);

        assertThat(links.viewTokens(List.of(a, b))).isEqualTo(Map.of(a, ia.view()));
        assertThat(links.viewTokens()).containsEntry(a, ia.view()).doesNotContainValue(ib.edit());
    }

    @Test
    void malformedTokens_openNothing() {
        OwnerLinks links = links("share_link", "scenario_id");
        assertThat(links.resolve(null)).isEmpty();
        assertThat(links.resolve("short")).isEmpty();
        assertThat(links.resolve("x".repeat(42) + "!")).isEmpty();
        assertThatThrownBy(() -> links.require("short")).isInstanceOf(LinkNotFound.class);
    }

    @Test
    void onlyEditAccessMayChange_andAViewLinkIsToldWhatItCanDo() {
        assertThat(Access.EDIT.canEdit()).isTrue();
        assertThat(Access.VIEW.canEdit()).isFalse();
        Access.EDIT.requireEdit(ReadOnlyLink.SUITE);
        assertThatThrownBy(() -> Access.VIEW.requireEdit(ReadOnlyLink.SUITE))
                .isInstanceOf(ReadOnlyLink.class)
                .hasMessage(ReadOnlyLink.SUITE);
        assertThatThrownBy(() -> new Grant(1, Access.VIEW, "t").requireEdit())
                .isInstanceOf(ReadOnlyLink.class)
                .hasMessage(ReadOnlyLink.SCENARIO);
        assertThat(Access.inPath("edit")).isEqualTo(Access.EDIT);
        assertThatThrownBy(() -> Access.inPath("owner")).isInstanceOf(LinkNotFound.class);
    }
}
