package dev.driftlab;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.Architectures.layeredArchitecture;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * Keeps the core plain Java and the layering one-way, as the Layout section of DEVELOPERS.md
 * describes: nothing outside {@code dev.driftlab.app} uses Spring, servlets or JDBC, only the
 * reports and the web app use the template engine, and packages have no dependency cycles.
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
                        "org.flywaydb..")
                .because("the core must run from the command line and in tests without a web server or database")
                .check(classes);
    }

    @Test
    void templateEngine_onlyInTheReportsAndTheWebApp() {
        noClasses()
                .that()
                .resideOutsideOfPackages("dev.driftlab.app..", "dev.driftlab.report..")
                .and()
                .doNotHaveFullyQualifiedName("dev.driftlab.Driftlab")
                .should()
                .dependOnClassesThat()
                .resideInAPackage("org.thymeleaf..")
                .because("the report's markup is a template that the command line and the web app share, rendered"
                        + " by Thymeleaf as a plain library (no Spring); every other stage computes, it does not write"
                        + " markup")
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

    /**
     * The stages of the data flow, each using only the ones before it: geometry, scenario (the
     * file format), site (believed map and actual world), then the simulator and the localizer
     * side by side, recording, evaluation, trial (lockstep runs, batches, sweeps), report, and the
     * two front ends, the command line and the web app.
     */
    @Test
    void stages_dependOnlyOnEarlierStages() {
        layeredArchitecture()
                .consideringOnlyDependenciesInLayers()
                .layer("Geometry")
                .definedBy("dev.driftlab.geometry..")
                .layer("Scenario")
                .definedBy("dev.driftlab.scenario..")
                .layer("Site")
                .definedBy("dev.driftlab.site..")
                .layer("Sim")
                .definedBy("dev.driftlab.sim..")
                .layer("Localizer")
                .definedBy("dev.driftlab.localizer..")
                .layer("Recording")
                .definedBy("dev.driftlab.recording..")
                .layer("Evaluation")
                .definedBy("dev.driftlab.evaluation..")
                .layer("Trial")
                .definedBy("dev.driftlab.trial..")
                .layer("Report")
                .definedBy("dev.driftlab.report..")
                .layer("Cli")
                .definedBy("dev.driftlab.cli..")
                .layer("App")
                .definedBy("dev.driftlab.app..")
                .whereLayer("App")
                .mayNotBeAccessedByAnyLayer()
                .whereLayer("Cli")
                .mayOnlyBeAccessedByLayers("App")
                .whereLayer("Report")
                .mayOnlyBeAccessedByLayers("Cli", "App")
                .whereLayer("Trial")
                .mayOnlyBeAccessedByLayers("Report", "Cli", "App")
                .whereLayer("Evaluation")
                .mayOnlyBeAccessedByLayers("Trial", "Report", "Cli", "App")
                .whereLayer("Recording")
                .mayOnlyBeAccessedByLayers("Evaluation", "Trial", "Report", "Cli", "App")
                .whereLayer("Sim")
                .mayOnlyBeAccessedByLayers("Evaluation", "Trial", "Report", "Cli", "App")
                .whereLayer("Localizer")
                .mayOnlyBeAccessedByLayers("Trial", "Report", "Cli", "App")
                .whereLayer("Site")
                .mayOnlyBeAccessedByLayers("Sim", "Localizer", "Trial", "Report", "Cli", "App")
                .whereLayer("Scenario")
                .mayOnlyBeAccessedByLayers("Site", "Sim", "Localizer", "Evaluation", "Trial", "Report", "Cli", "App")
                .check(classes);
    }

    /**
     * One slice per web feature (scenarios, runs, player, reports, ...): their services and storage
     * do not depend on each other in a circle. Controllers under {@code web/} may call any
     * feature's services, so they are left out.
     */
    @Test
    void webFeatures_haveNoCycles() {
        slices().matching("dev.driftlab.app.(*)..")
                .should()
                .beFreeOfCycles()
                .check(classes.that(
                        com.tngtech.archunit.core.domain.JavaClass.Predicates.resideOutsideOfPackages("..web..")));
    }

    /** Every package says what it is for. */
    @Test
    void everyPackage_hasAPackageInfo() {
        java.util.Set<String> packages = new java.util.TreeSet<>();
        classes.forEach(c -> packages.add(c.getPackageName()));
        java.util.List<String> missing = packages.stream()
                .filter(p -> !p.equals("dev.driftlab"))
                .filter(p -> {
                    try {
                        Class.forName(p + ".package-info");
                        return false;
                    } catch (ClassNotFoundException e) {
                        return true;
                    }
                })
                .toList();
        org.assertj.core.api.Assertions.assertThat(missing).isEmpty();
    }
}
