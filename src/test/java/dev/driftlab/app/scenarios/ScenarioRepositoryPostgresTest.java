package dev.driftlab.app.scenarios;

import dev.driftlab.app.PostgresDatabase;
import org.springframework.boot.jdbc.test.autoconfigure.AutoConfigureTestDatabase;
import org.springframework.boot.jdbc.test.autoconfigure.JdbcTest;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.springframework.test.context.DynamicPropertySource;

/** The scenario store, its migration and its concurrency guard on a real PostgreSQL server. */
@JdbcTest
@AutoConfigureTestDatabase(replace = AutoConfigureTestDatabase.Replace.NONE)
class ScenarioRepositoryPostgresTest extends ScenarioStoreContract {

    @DynamicPropertySource
    static void postgres(DynamicPropertyRegistry registry) {
        PostgresDatabase.register(registry);
    }
}
