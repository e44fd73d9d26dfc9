package org.loopform.architecture;

import static com.tngtech.archunit.lang.syntax.ArchRuleDefinition.noClasses;
import static com.tngtech.archunit.library.dependencies.SlicesRuleDefinition.slices;

import com.tngtech.archunit.core.importer.ImportOption;
import com.tngtech.archunit.junit.AnalyzeClasses;
import com.tngtech.archunit.junit.ArchTest;
import com.tngtech.archunit.lang.ArchRule;

/**
 * The one-way flow of DEVELOPERS.md as rules the build enforces: {@code io} reads -> domain objects ->
 * {@code form}/{@code law} -> {@code scan} + {@code simulate} + {@code analysis} -> {@code findings}
 * -> {@code check} -> {@code audit} -> {@code report} -> {@code cli} prints. A rule that is only
 * written down erodes. Source: plumbing test (the project's own architecture); no published figure.
 */
@AnalyzeClasses(packages = "org.loopform", importOptions = ImportOption.DoNotIncludeTests.class)
class LayeringTest {

    /** The packages that compute: they know nothing of files, rendering or the terminal. */
    private static final String[] COMPUTATION = {"org.loopform.units..", "org.loopform.lti..", "org.loopform.law..",
            "org.loopform.form..", "org.loopform.process..", "org.loopform.scan..", "org.loopform.simulate..",
            "org.loopform.analysis..", "org.loopform.findings..", "org.loopform.check..", "org.loopform.identify..",
            "org.loopform.tuning..", "org.loopform.replay.."};

    @ArchTest
    static final ArchRule computation_imports_no_io_report_or_cli = noClasses().that()
            .resideInAnyPackage(COMPUTATION)
            .should().dependOnClassesThat().resideInAnyPackage("org.loopform.io..", "org.loopform.report..",
                    "org.loopform.cli..")
            .because("computation packages are pure: reading, rendering and printing sit at the edge");

    @ArchTest
    static final ArchRule computation_touches_no_files_or_terminal = noClasses().that()
            .resideInAnyPackage(COMPUTATION)
            .should().dependOnClassesThat().resideInAnyPackage("java.nio.file..")
            .orShould().accessField(System.class, "out")
            .orShould().accessField(System.class, "err")
            .because("computation packages never touch files and never print");

    @ArchTest
    static final ArchRule io_renders_nothing = noClasses().that().resideInAPackage("org.loopform.io..")
            .should().dependOnClassesThat().resideInAnyPackage("org.loopform.report..", "org.loopform.cli..")
            .because("io reads and writes bytes; rendering lives in report, printing in cli");

    @ArchTest
    static final ArchRule report_prints_nothing = noClasses().that().resideInAPackage("org.loopform.report..")
            .should().dependOnClassesThat().resideInAnyPackage("org.loopform.cli..")
            .because("report renders; only cli prints and exits");

    @ArchTest
    static final ArchRule audit_orchestrates_checks_it_does_not_render = noClasses().that()
            .resideInAPackage("org.loopform.audit..")
            .should().dependOnClassesThat().resideInAnyPackage("org.loopform.io..", "org.loopform.report..",
                    "org.loopform.cli..")
            .because("audit orchestrates many checks; files and output belong to io, report and cli");

    @ArchTest
    static final ArchRule a_check_knows_nothing_of_audits = noClasses().that().resideInAPackage("org.loopform.check..")
            .should().dependOnClassesThat().resideInAPackage("org.loopform.audit..")
            .because("check evaluates one loop; audit orchestrates many checks on top of it");

    @ArchTest
    static final ArchRule no_package_cycles = slices().matching("org.loopform.(*)..").should().beFreeOfCycles();

    @ArchTest
    static final ArchRule picocli_only_in_cli = noClasses().that().resideOutsideOfPackage("org.loopform.cli..")
            .should().dependOnClassesThat().resideInAPackage("picocli..")
            .because("picocli is the command line's business");

    @ArchTest
    static final ArchRule file_formats_only_in_io_and_report = noClasses().that()
            .resideOutsideOfPackages("org.loopform.io..", "org.loopform.report..")
            .should().dependOnClassesThat().resideInAnyPackage("org.yaml.snakeyaml..", "org.apache.commons.csv..",
                    "com.fasterxml.jackson..", "org.dhatim.fastexcel..", "org.apache.poi..")
            .because("SnakeYAML, Commons CSV, Jackson, FastExcel and Apache POI read and write files: io and report only");
}
