// The HTML reports in a real browser: headless Chromium (Debian's `chromium`, installed by
// scripts/test.sh) opens `check --html` from a file with the network unused, renders it to a
// screenshot and dumps the document it built. The test checks that nothing failed to load,
// that the page shows the verdict and every crew member's row, and that the chart's plots are
// in the rendered document; then the same for the pages of `storm --sweep --html` and
// `shelter --html` (the verdict or answer, its rows, the chart inline).
#include "shell_run.hpp"

#include <catch2/catch.hpp>

#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <unistd.h>

namespace fs = std::filesystem;

namespace {

std::string read_file(const fs::path& p) {
    std::ifstream in(p, std::ios::binary);
    std::ostringstream ss;
    ss << in.rdbuf();
    return ss.str();
}

std::size_t count(const std::string& text, const std::string& what) {
    std::size_t n = 0;
    for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) {
        ++n;
    }
    return n;
}

// Chromium's document of `page` after loading, and what it printed on its error stream.
struct Loaded {
    ShellResult dom;
    std::string errors;
};

Loaded load_in_chromium(const fs::path& dir, const fs::path& page) {
    const std::string browser =
        "chromium --headless --no-sandbox --disable-gpu --disable-dev-shm-usage "
        "--user-data-dir=" +
        (dir / "profile").string() + " --window-size=1200,2400 ";
    const fs::path err = dir / (page.stem().string() + ".err");
    Loaded l{run_shell(browser + "--dump-dom file://" + page.string() + " 2>" + err.string()), ""};
    l.errors = read_file(err);
    return l;
}

// Loaded without errors: no resource failed, no script error (the pages have no script, and
// must fetch nothing). Chromium's own complaints about the missing desktop bus are not the
// page's.
void check_no_load_errors(const std::string& errors) {
    INFO(errors);
    for (const char* bad : {"net::ERR_", "Failed to load", "Uncaught", "Refused to"}) {
        CHECK(errors.find(bad) == std::string::npos);
    }
}

} // namespace

TEST_CASE("check --html: headless Chromium loads it without errors and shows the verdict and "
          "every plot",
          "[cli][browser]") {
    REQUIRE(run_shell("command -v chromium >/dev/null 2>&1").exit_code == 0); // scripts/test.sh
    const fs::path dir =
        fs::temp_directory_path() / ("crewdose-browser-test-" + std::to_string(::getpid()));
    fs::remove_all(dir);
    fs::create_directories(dir);
    const fs::path page = dir / "lunar.html";
    const std::string source = CREWDOSE_SOURCE_DIR;
    const ShellResult made =
        run_shell(std::string(CREWDOSE_BINARY) + " check " + source +
                  "/scenarios/lunar-demo.toml --html " + page.string() + " >/dev/null 2>&1");
    REQUIRE(made.exit_code == 0);
    // One profile folder per run; no sandbox (CI runs as root); no GPU; no /dev/shm (small in
    // containers). --dump-dom prints the document after the page has loaded; --screenshot
    // renders it.
    const std::string browser =
        "chromium --headless --no-sandbox --disable-gpu --disable-dev-shm-usage "
        "--user-data-dir=" +
        (dir / "profile").string() + " --window-size=1200,2400 ";
    const ShellResult dom = run_shell(browser + "--dump-dom file://" + page.string() + " 2>" +
                                      (dir / "dom.err").string());
    REQUIRE(dom.exit_code == 0);
    const ShellResult shot = run_shell("cd " + dir.string() + " && " + browser +
                                       "--screenshot=" + (dir / "page.png").string() + " file://" +
                                       page.string() + " 2>" + (dir / "shot.err").string());
    REQUIRE(shot.exit_code == 0);
    // Loaded without errors: no resource failed, no script error (the page has no script, and
    // must fetch nothing). Chromium's own complaints about the missing desktop bus are not the
    // page's.
    const std::string errors = read_file(dir / "dom.err") + read_file(dir / "shot.err");
    INFO(errors);
    for (const char* bad : {"net::ERR_", "Failed to load", "Uncaught", "Refused to"}) {
        CHECK(errors.find(bad) == std::string::npos);
    }
    // The rendered document shows the verdict, a row per crew member of the demo (4) and the
    // chart: one SVG with two plots per crew member, each with its curve and its limit line.
    const std::string& html = dom.out;
    CHECK(html.find("Verdict: every evaluated planning limit is met.") != std::string::npos);
    for (const char* name : {"Amara Osei", "Tomasz Wren", "Ines Halvorsen", "Kenji Marlow"}) {
        INFO(name);
        CHECK(html.find(std::string("<td>") + name + "</td>") != std::string::npos);
    }
    CHECK(count(html, "<svg") == 1);
    CHECK(count(html, "planning limit 1000 mGy-Eq") == 4);
    CHECK(count(html, "career planning limit 600 mSv") == 4);
    // The screenshot: a PNG (its signature) of the window's size, not an empty file.
    const std::string png = read_file(dir / "page.png");
    REQUIRE(png.size() > 24);
    CHECK(png.compare(0, 8, "\x89PNG\r\n\x1a\n") == 0);
    const auto be32 = [&](std::size_t at) {
        return (static_cast<unsigned>(static_cast<unsigned char>(png[at])) << 24) |
               (static_cast<unsigned>(static_cast<unsigned char>(png[at + 1])) << 16) |
               (static_cast<unsigned>(static_cast<unsigned char>(png[at + 2])) << 8) |
               static_cast<unsigned>(static_cast<unsigned char>(png[at + 3]));
    };
    CHECK(be32(16) == 1200);   // IHDR width
    CHECK(be32(20) == 2400);   // IHDR height
    CHECK(png.size() > 50000); // a blank page of this size compresses to a few kB
    fs::remove_all(dir);
}

TEST_CASE("storm --sweep --html and shelter --html: headless Chromium loads them without errors "
          "and shows the verdict, the answer and the chart",
          "[cli][browser]") {
    REQUIRE(run_shell("command -v chromium >/dev/null 2>&1").exit_code == 0); // scripts/test.sh
    const fs::path dir =
        fs::temp_directory_path() / ("crewdose-browser-test-2-" + std::to_string(::getpid()));
    fs::remove_all(dir);
    fs::create_directories(dir);
    const std::string binary = CREWDOSE_BINARY;
    const std::string demo = std::string(CREWDOSE_SOURCE_DIR) + "/scenarios/lunar-demo.toml";

    // The sweep over two days around the long traverse of 2032-03-09: the verdict's rows give
    // the worst onset per crew member (tests/expected/storm-sweep.txt: osei and wren at
    // 11:20 on that day).
    const fs::path storm = dir / "storm.html";
    REQUIRE(run_shell(binary + " storm " + demo +
                      " --event design-spe --sweep --step 12h --from 2032-03-08T00:00:00Z --to "
                      "2032-03-10T00:00:00Z --html " +
                      storm.string() + " >/dev/null 2>&1")
                .exit_code == 0);
    const Loaded s = load_in_chromium(dir, storm);
    REQUIRE(s.dom.exit_code == 0);
    check_no_load_errors(s.errors);
    const std::string& sh = s.dom.out;
    CHECK(sh.find("Verdict: every evaluated 30-day planning limit is met at every onset tried") !=
          std::string::npos);
    for (const char* name : {"Amara Osei", "Tomasz Wren", "Ines Halvorsen", "Kenji Marlow"}) {
        INFO(name);
        CHECK(sh.find(std::string("<tr><td>") + name + "</td>") != std::string::npos);
    }
    CHECK(sh.find("<td>2032-03-09T11:20:00Z</td>") != std::string::npos);
    CHECK(count(sh, "<svg") == 1);
    CHECK(sh.find("Verdict: ") < sh.find("<svg"));
    // The chart's 100 % line and its worst onset, the verdict's.
    CHECK(sh.find("30-day planning limit (100 %)") > sh.find("<svg"));
    CHECK(sh.find("worst t0 2032-03-09T11:20:00Z: 35 %") > sh.find("<svg"));

    // The shelter with a BFO target the bare shelter misses: a thickness per material.
    const fs::path shelter = dir / "shelter.html";
    REQUIRE(run_shell(binary + " shelter " + demo +
                      " --event design-spe --location storm-shelter --material water --material "
                      "polyethylene --target bfo=40 --html " +
                      shelter.string() + " >/dev/null 2>&1")
                .exit_code == 0);
    const Loaded h = load_in_chromium(dir, shelter);
    REQUIRE(h.dom.exit_code == 0);
    check_no_load_errors(h.errors);
    const std::string& hh = h.dom.out;
    CHECK(hh.find("Answer: add at least ") != std::string::npos);
    CHECK(hh.find("<tr><td>water</td>") != std::string::npos);
    CHECK(hh.find("<tr><td>polyethylene</td>") != std::string::npos);
    CHECK(count(hh, "class=\"within\">needs ") == 2);
    CHECK(count(hh, "<svg") == 1);
    CHECK(hh.find("Answer: ") < hh.find("<svg"));
    fs::remove_all(dir);
}
