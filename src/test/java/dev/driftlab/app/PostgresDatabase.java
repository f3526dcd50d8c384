package dev.driftlab.app;

import io.zonky.test.db.postgres.embedded.EmbeddedPostgres;
import java.io.IOException;
import java.io.UncheckedIOException;
import org.springframework.test.context.DynamicPropertyRegistry;
import org.testcontainers.DockerClientFactory;
import org.testcontainers.postgresql.PostgreSQLContainer;

/**
 * A real PostgreSQL server for the {@code *PostgresTest} classes, found in this order so the tests
 * run on every machine and never skip: a container when a container engine answers, else the
 * server named by {@code DRIFTLAB_TEST_POSTGRES_URL} (with {@code DRIFTLAB_TEST_POSTGRES_USER} and
 * {@code DRIFTLAB_TEST_POSTGRES_PASSWORD}), else an embedded server run from a Maven artifact.
 * Started once per test JVM; each test class gets its own database on it.
 */
public final class PostgresDatabase {

    private static String baseUrl;
    private static String user;
    private static String password;
    private static String source;
    private static EmbeddedPostgres embedded;
    private static int databases;

    private PostgresDatabase() {}

    /** Points the Spring data source at a fresh database on the shared server. */
    public static void register(DynamicPropertyRegistry registry) {
        Database db = create();
        registry.add("spring.datasource.url", db::url);
        registry.add("spring.datasource.username", db::user);
        registry.add("spring.datasource.password", db::password);
    }

    /** Where a fresh database is and how to log in, for tests that start processes of their own. */
    public record Database(String url, String user, String password) {}

    /** Creates a fresh database on the shared server. */
    public static synchronized Database create() {
        start();
        String db = "driftlab_t" + (++databases) + "_" + ProcessHandle.current().pid();
        try (var c = java.sql.DriverManager.getConnection(baseUrl, user, password);
                var s = c.createStatement()) {
            s.execute("CREATE DATABASE " + db);
        } catch (java.sql.SQLException e) {
            throw new IllegalStateException("cannot create a test database on " + source, e);
        }
        return new Database(baseUrl.replaceAll("/[^/?]*(\\?.*)?$", "/" + db + "$1"), user, password);
    }

    /** Which server the tests use, for messages. */
    public static synchronized String source() {
        start();
        return source;
    }

    private static void start() {
        if (baseUrl != null) {
            return;
        }
        String envUrl = System.getenv("DRIFTLAB_TEST_POSTGRES_URL");
        if (dockerAvailable()) {
            PostgreSQLContainer container = new PostgreSQLContainer("postgres:17-alpine");
            container.start();
            baseUrl = container.getJdbcUrl();
            user = container.getUsername();
            password = container.getPassword();
            source = "container";
        } else if (envUrl != null && !envUrl.isBlank()) {
            baseUrl = envUrl;
            user = System.getenv().getOrDefault("DRIFTLAB_TEST_POSTGRES_USER", "postgres");
            password = System.getenv().getOrDefault("DRIFTLAB_TEST_POSTGRES_PASSWORD", "");
            source = "DRIFTLAB_TEST_POSTGRES_URL";
        } else {
            try {
                embedded = EmbeddedPostgres.builder().start();
            } catch (IOException e) {
                throw new UncheckedIOException("cannot start the embedded PostgreSQL server", e);
            }
            baseUrl = embedded.getJdbcUrl("postgres", "postgres");
            user = "postgres";
            password = "postgres";
            source = "embedded";
        }
    }

    private static boolean dockerAvailable() {
        try {
            return DockerClientFactory.instance().isDockerAvailable();
        } catch (RuntimeException | LinkageError e) {
            return false;
        }
    }
}
