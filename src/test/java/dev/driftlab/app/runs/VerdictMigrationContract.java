package dev.driftlab.app.runs;

import static org.assertj.core.api.Assertions.assertThat;

import dev.driftlab.app.runs.persistence.RunRepository;
import dev.driftlab.evaluation.Verdict;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import javax.sql.DataSource;
import org.flywaydb.core.Flyway;
import org.flywaydb.core.api.output.MigrateResult;
import org.junit.jupiter.api.Test;
import org.springframework.jdbc.core.simple.JdbcClient;

/**
 * The verdict column added to a database that already holds runs: migrated from version 1 with
 * finished, failed and running runs in it, every earlier run reads with no verdict until the
 * start-up backfill gives the finished ones the verdict their result documents name.
 */
abstract class VerdictMigrationContract {

    /** A fresh, empty database. */
    abstract DataSource freshDatabase();

    private static final OffsetDateTime T = OffsetDateTime.of(2026, 11, 30, 9, 0, 0, 0, ZoneOffset.UTC);

    @Test
    void migrationFromVersion1_keepsEarlierRuns_andTheBackfillReadsTheirVerdicts() throws Exception {
        DataSource ds = freshDatabase();
        Flyway.configure().dataSource(ds).target("1").load().migrate();
        JdbcClient jdbc = JdbcClient.create(ds);
        jdbc.sql("INSERT INTO scenario (id, name, description, latest_revision, created_at, updated_at)"
                        + " VALUES (1, 'corridor', '', 1, ?, ?)")
                .params(T, T)
                .update();
        jdbc.sql("INSERT INTO scenario_revision (id, scenario_id, revision_no, author, message, created_at, document)"
                        + " VALUES (1, 1, 1, 'Ana', 'start', ?, '{}')")
                .param(T)
                .update();
        // format 1 said only "passed"; format 2 names the verdict; a failed run has no result
        long passedV1 = oldRun(jdbc, 1, "done", "{\"format\":\"driftlab-result/1\",\"passed\":true}");
        long failedV1 = oldRun(jdbc, 2, "done", "{\"format\":\"driftlab-result/1\",\"passed\":false}");
        long earlyV2 = oldRun(
                jdbc, 3, "done", "{\"format\":\"driftlab-result/2\",\"passed\":false,\"verdict\":\"ended-early\"}");
        long unreadable = oldRun(jdbc, 4, "done", "not json");
        long failed = oldRun(jdbc, 5, "failed", null);

        MigrateResult migrated = Flyway.configure().dataSource(ds).load().migrate();

        // every later migration applies on top of version 1 too
        assertThat(migrated.targetSchemaVersion).isEqualTo(latestMigration());
        RunRepository runs = new RunRepository(jdbc);
        for (long id : new long[] {passedV1, failedV1, earlyV2, unreadable, failed}) {
            assertThat(runs.find(id).orElseThrow().verdict())
                    .as("run %d before the backfill", id)
                    .isEmpty();
        }
        assertThat(RunQueue.fillMissingVerdicts(runs)).isEqualTo(3);
        assertThat(runs.find(passedV1).orElseThrow().verdict()).hasValue(Verdict.PASS);
        assertThat(runs.find(failedV1).orElseThrow().verdict()).hasValue(Verdict.FAIL);
        assertThat(runs.find(earlyV2).orElseThrow().verdict()).hasValue(Verdict.ENDED_EARLY);
        assertThat(runs.find(unreadable).orElseThrow().verdict()).isEmpty();
        assertThat(runs.find(failed).orElseThrow().verdict()).isEmpty();
        // every verdict's file name fits the column
        for (Verdict v : Verdict.values()) {
            jdbc.sql("UPDATE run SET verdict = NULL WHERE id = ?")
                    .param(unreadable)
                    .update();
            runs.fillVerdict(unreadable, v);
            assertThat(runs.find(unreadable).orElseThrow().verdict()).hasValue(v);
        }
        assertThat(RunQueue.fillMissingVerdicts(runs)).isZero();
    }

    private static long oldRun(JdbcClient jdbc, long id, String state, String result) {
        jdbc.sql("INSERT INTO run (id, scenario_id, revision_id, batch_key, view_token, variant, seeds, options,"
                        + " state, progress, progress_message, queued_at, result) VALUES (?, 1, 1, 'b', ?, 'base',"
                        + " '1', '{}', ?, 1, '', ?, ?)")
                .params(id, "token" + id, state, T, result)
                .update();
        return id;
    }

    /** The highest version among the migrations in the source tree ({@code V5__...sql} is 5). */
    private static String latestMigration() throws java.io.IOException {
        try (var files = java.nio.file.Files.list(java.nio.file.Path.of("src/main/resources/db/migration"))) {
            return String.valueOf(files.map(f -> f.getFileName().toString())
                    .filter(n -> n.matches("V\\d+__.*\\.sql"))
                    .mapToInt(n -> Integer.parseInt(n.substring(1, n.indexOf("__"))))
                    .max()
                    .orElseThrow());
        }
    }
}
