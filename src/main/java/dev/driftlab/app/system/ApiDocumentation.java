package dev.driftlab.app.system;

import dev.driftlab.report.Report;
import io.swagger.v3.oas.models.OpenAPI;
import io.swagger.v3.oas.models.info.Info;
import org.springframework.context.annotation.Bean;
import org.springframework.context.annotation.Configuration;

/**
 * Names the API in its OpenAPI document (served at {@code /v3/api-docs}); without it springdoc calls
 * it "OpenAPI definition v0", and the document would be the one place missing the safety caution.
 */
@Configuration
class ApiDocumentation {

    /**
     * The API's own version, raised when a path or a document it answers changes incompatibly; the
     * jar's version moves for reasons a client does not care about.
     */
    static final String VERSION = "1";

    @Bean
    OpenAPI driftlabOpenApi() {
        return new OpenAPI()
                .info(new Info()
                        .title("Driftlab API")
                        .version(VERSION)
                        .description("Scenarios, runs and results of the Driftlab test bench for Monte Carlo"
                                + " localization of indoor robots: submit runs of a scenario, follow their"
                                + " progress and download results, recorded frames and reports.\n\n"
                                + "**Caution.** "
                                + Report.CAUTION));
    }
}
