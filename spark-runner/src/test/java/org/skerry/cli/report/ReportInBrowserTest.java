package org.skerry.cli.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.net.URI;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import javax.imageio.ImageIO;
import org.jsoup.Jsoup;
import org.jsoup.nodes.Document;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.skerry.cli.CommandRunner;
import org.skerry.cli.ConjugateRun;
import org.skerry.cli.ExitCodes;
import org.skerry.engine.Slow;

/**
 * The report page in a real headless browser (Chromium, found by {@link BrowserLocator}): its
 * screenshot shows something, the browser loaded every file the page names, and the title and the
 * first figure's image are there as the browser parsed and decoded them. A deliberately broken page
 * shows that each check can fail.
 */
@Slow
class ReportInBrowserTest {

    /** A report page at 1200 px wide inks well over this share of its 1200 × 2400 screenshot. */
    private static final double MIN_INK = 0.05;
    /** Charts in several colours, anti-aliased text: far more colours than a blank or text-only page. */
    private static final int MIN_COLOURS = 64;

    @TempDir
    static Path root;

    static HeadlessChromium browser;
    static Path report;

    @BeforeAll
    static void reportOfARun() throws IOException {
        // Each test skips or fails on its own (below), so the reports say why; a class-level skip
        // shows up in surefire's reports as no tests at all.
        Optional<Path> executable = BrowserLocator.find(System.getenv());
        if (executable.isEmpty()) {
            return;
        }
        browser = new HeadlessChromium(executable.get(), Files.createDirectories(root.resolve("browser")));
        Files.writeString(root.resolve("data.csv"), ConjugateRun.DATA);
        Path file = Files.writeString(root.resolve("run.conf"), ConjugateRun.RUN_FILE);
        Path run = root.resolve("conjugate");
        CommandRunner.Result ran = CommandRunner.run("run", file.toString(), "--out", run.toString());
        assertEquals(ExitCodes.SUCCESS, ran.exitCode(), ran.err());
        CommandRunner.Result reported = CommandRunner.run("report", run.toString());
        assertEquals(ExitCodes.SUCCESS, reported.exitCode(), reported.err());
        report = run.resolve("report");
    }

    @BeforeEach
    void browserPresent() {
        BrowserLocator.require();
    }

    @Test
    @DisplayName("the screenshot decodes and is not blank; every file the browser's log says it loaded is in report/")
    void screenshot() throws Exception {
        Path png = root.resolve("report-shot.png");
        HeadlessChromium.Result result = browser.screenshot(page().toUri(), png);
        assertEquals(0, result.exitCode(), () -> HeadlessChromium.tail(result.log()));
        BufferedImage shot = ImageIO.read(png.toFile());
        assertNotNull(shot, "the screenshot is not a PNG");
        double ink = BrowserEvidence.inkShare(shot);
        int colours = BrowserEvidence.distinctColours(shot);
        assertTrue(ink > MIN_INK && colours > MIN_COLOURS, "blank: ink " + ink + ", colours " + colours);
        assertEquals(List.of(), BrowserEvidence.failedLoads(result.log(), report));
        // The log's format is Chromium's to change; without this an unreadable log would pass.
        URI firstFigure = report.resolve(firstFigureSrc()).toAbsolutePath().toUri();
        assertTrue(BrowserEvidence.fileLoads(result.log()).contains(firstFigure),
                "the log names no load of the first figure " + firstFigure + ": " + BrowserEvidence.fileLoads(result.log()));
        System.out.printf("report screenshot: %d x %d, ink %.3f, %d colours%n", shot.getWidth(), shot.getHeight(),
                ink, colours);
    }

    @Test
    @DisplayName("as the browser parsed it: the page's title, and the first figure's image loaded at the PNG's size")
    void titleAndFirstFigure() throws Exception {
        ProbePage.Seen seen = probe(page());
        assertEquals("", seen.error());
        Document parsed = Jsoup.parse(page().toFile(), "UTF-8");
        assertFalse(parsed.title().isBlank());
        assertEquals(parsed.title(), seen.title());
        ProbePage.Image first = seen.images().stream().filter(ProbePage.Image::inFigure).findFirst().orElseThrow(
                () -> new AssertionError("no figure image in the browser's DOM: " + seen));
        assertEquals(firstFigureSrc(), first.src());
        BufferedImage png = ImageIO.read(report.resolve(first.src()).toFile());
        // Only a decoded image has a natural size; the PNG's own size shows it is this file.
        assertEquals(List.of(true, png.getWidth(), png.getHeight()),
                List.of(first.complete(), first.naturalWidth(), first.naturalHeight()), first.toString());
        for (ProbePage.Image image : seen.images()) {
            assertTrue(image.complete() && image.naturalWidth() > 0, "not loaded: " + image);
        }
    }

    @Test
    @DisplayName("a broken page (a missing figure image, nothing drawn) fails every check above")
    void brokenPageIsCaught() throws Exception {
        Path folder = Files.createDirectories(root.resolve("broken"));
        Path page = Files.writeString(folder.resolve("index.html"), "<!DOCTYPE html>\n<html><head><meta charset=\"utf-8\">"
                + "<title>Broken</title></head><body><h1>Broken</h1><figure><img src=\"missing.png\" alt=\"gone\">"
                + "</figure></body></html>\n");
        Path png = root.resolve("broken-shot.png");
        HeadlessChromium.Result result = browser.screenshot(page.toUri(), png);
        assertEquals(0, result.exitCode(), () -> HeadlessChromium.tail(result.log()));
        BufferedImage shot = ImageIO.read(png.toFile());
        double ink = BrowserEvidence.inkShare(shot);
        int colours = BrowserEvidence.distinctColours(shot);
        assertFalse(ink > MIN_INK && colours > MIN_COLOURS, "judged not blank: ink " + ink + ", colours " + colours);
        List<String> failed = BrowserEvidence.failedLoads(result.log(), folder);
        assertTrue(failed.size() == 1 && failed.get(0).endsWith("/broken/missing.png"), failed.toString());
        ProbePage.Image first = probe(page).images().get(0);
        assertTrue(first.inFigure() && first.complete() && first.naturalWidth() == 0, first.toString());
    }

    private static Path page() {
        return report.resolve("index.html");
    }

    private static String firstFigureSrc() throws IOException {
        return Jsoup.parse(page().toFile(), "UTF-8").selectFirst("figure img").attr("src");
    }

    private static ProbePage.Seen probe(Path page) throws Exception {
        Path probe = ProbePage.write(page.toUri(), Files.createTempFile(root, "probe-", ".html"));
        HeadlessChromium.Result result = browser.dumpDom(probe.toUri());
        assertEquals(0, result.exitCode(), () -> HeadlessChromium.tail(result.log()));
        return ProbePage.read(result.out());
    }
}
