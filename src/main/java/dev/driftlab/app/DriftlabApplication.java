package dev.driftlab.app;

import org.springframework.boot.SpringApplication;
import org.springframework.boot.autoconfigure.SpringBootApplication;

/** The Driftlab web app: scenarios, runs and reports over the plain-Java core. */
@SpringBootApplication
public class DriftlabApplication {

    /** Starts the web app. */
    public static void start(String[] args) {
        SpringApplication.run(DriftlabApplication.class, args);
    }

    /** Lets IDEs and {@code spring-boot:run} start the app directly. */
    public static void main(String[] args) {
        start(args);
    }
}
