package dev.driftlab.app.runs;

import java.util.UUID;
import javax.sql.DataSource;
import org.springframework.jdbc.datasource.DriverManagerDataSource;

/** The verdict migration on H2, the default database. */
class VerdictMigrationTest extends VerdictMigrationContract {

    @Override
    DataSource freshDatabase() {
        return new DriverManagerDataSource(
                "jdbc:h2:mem:migration-" + UUID.randomUUID() + ";DB_CLOSE_DELAY=-1", "sa", "");
    }
}
