package dev.driftlab.app.runs;

import dev.driftlab.app.PostgresDatabase;
import java.util.HashMap;
import java.util.Map;
import java.util.function.Supplier;
import javax.sql.DataSource;
import org.springframework.jdbc.datasource.DriverManagerDataSource;

/** The verdict migration on a real PostgreSQL server. */
class VerdictMigrationPostgresTest extends VerdictMigrationContract {

    @Override
    DataSource freshDatabase() {
        Map<String, Supplier<Object>> props = new HashMap<>();
        PostgresDatabase.register(props::put);
        return new DriverManagerDataSource(
                (String) props.get("spring.datasource.url").get(),
                (String) props.get("spring.datasource.username").get(),
                (String) props.get("spring.datasource.password").get());
    }
}
