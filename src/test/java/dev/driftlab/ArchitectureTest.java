package dev.driftlab;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * Keeps the core plain Java and the layering one-way, as the Layout section of DEVELOPERS.md
 * describes: nothing outside {@code dev.driftlab.app} uses Spring, servlets or JDBC, and packages
 * have no dependency cycles.
 */
class ArchitectureTest {

    private static JavaClasses classes;

    @BeforeAll
    static void importClasses() {
        classes = new ClassFileImporter()
                .withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
                .importPackages("dev.driftlab");
    }

    @Test
    void core_isFreeOfSpringServletAndJdbc() {
        noClasses()
                .that()
                .resideOutsideOfPackage("dev.driftlab.app..")
                .and()
                .doNotHaveFullyQualifiedName("dev.driftlab.Driftlab")
                .should()
                .dependOnClassesThat()
                .resideInAnyPackage(
                        "org.springframework..",
                        "jakarta.servlet..",
                        "javax.servlet..",
                        "java.sql..",
                        "javax.sql..",
                        "org.thymeleaf..",
                        "org.flywaydb..")
                .because("the core must run from the command line and in tests without a web server or database")
                .check(classes);
    }

    @Test
    void core_doesNotReachIntoTheWebApp() {
        noClasses()
                .that()
                .resideOutsideOfPackage("dev.driftlab.app..")
                .and()
                .doNotHaveFullyQualifiedName("dev.driftlab.Driftlab")
                .should()
                .dependOnClassesThat()
                .resideInAPackage("dev.driftlab.app..")
                .check(classes);
    }

    @Test
    void corePackages_haveNoCycles() {
        slices().matching("dev.driftlab.(**)").should().beFreeOfCycles().check(classes);
    }
}
