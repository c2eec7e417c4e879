// End-to-end runs of the crewdose binary.
#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <array>
#include <cstdio>
#include <string>
#include <sys/wait.h>

namespace {

struct Run {
    int exit_code;
    std::string out; // stdout and stderr together
};

Run run(const std::string& args) {
    const std::string cmd = std::string(CREWDOSE_BINARY) + " " + args + " 2>&1";
    Run r{-1, {}};
    FILE* pipe = popen(cmd.c_str(), "r");
    REQUIRE(pipe != nullptr);
    std::array<char, 4096> buf{};
    std::size_t n = 0;
    while ((n = std::fread(buf.data(), 1, buf.size(), pipe)) > 0) {
        r.out.append(buf.data(), n);
    }
    const int status = pclose(pipe);
    r.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
    return r;
}

} // namespace

TEST_CASE("range prints a table in text", "[cli]") {
    const Run r = run("range --material water --particle proton --energy 1,10,100,1000");
    INFO(r.out);
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("proton in water") != std::string::npos);
    CHECK(r.out.find("MeV cm2/g") != std::string::npos);
    // Source: ICRU Report 49 / PSTAR water at 100 MeV, S = 7.286 MeV cm2/g: the text shows
    // 4 significant figures, and crewdose is within 0.05 % there.
    CHECK(r.out.find("7.287") != std::string::npos);
}

TEST_CASE("range json carries full precision that agrees with the text", "[cli]") {
    const Run j = run("range -m aluminium -p proton -e 100 --format json");
    REQUIRE(j.exit_code == 0);
    const auto doc = nlohmann::json::parse(j.out);
    const double s = doc["rows"][0]["stopping_MeV_cm2_g"].get<double>();
    const double R = doc["rows"][0]["csda_range_g_cm2"].get<double>();
    // Source: ICRU Report 49 / PSTAR aluminium 100 MeV: 5.676 MeV cm2/g, 10.01 g/cm2.
    CHECK(s == Approx(5.676).epsilon(5e-3));
    CHECK(R == Approx(10.01).epsilon(1e-2));
    CHECK(doc["rows"][0]["csda_range_cm"].get<double>() == Approx(R / 2.699).epsilon(1e-12));
    const Run t = run("range -m aluminium -p proton -e 100");
    char buf[64];
    std::snprintf(buf, sizeof buf, "%#.4g", s);
    CHECK(t.out.find(buf) != std::string::npos);
}

TEST_CASE("range csv has a header and one row per energy", "[cli]") {
    const Run r = run("range -m lead -p alpha -e 2,20,200 -f csv");
    REQUIRE(r.exit_code == 0);
    CHECK(r.out.rfind("energy_MeV_per_n,stopping_MeV_cm2_g,let_keV_um,csda_range_g_cm2,"
                      "csda_range_cm\n",
                      0) == 0);
    std::size_t lines = 0;
    for (char c : r.out) {
        lines += c == '\n' ? 1U : 0U;
    }
    CHECK(lines == 4);
}

TEST_CASE("materials lists the library", "[cli]") {
    const Run r = run("materials");
    CHECK(r.exit_code == 0);
    for (const char* id :
         {"water", "soft-tissue", "cortical-bone", "aluminium", "al-6061", "polyethylene",
          "borated-polyethylene", "aramid", "ceramic-fabric", "lithium-hydride", "lead",
          "mare-regolith", "highland-regolith", "mars-regolith", "mars-atmosphere", "air",
          "silicon", "carbon-composite"}) {
        CHECK(r.out.find(id) != std::string::npos);
    }
    const Run j = run("materials --format json");
    REQUIRE(j.exit_code == 0);
    CHECK(nlohmann::json::parse(j.out).size() == 18);
}

TEST_CASE("bad input exits 2 and names the option and what is allowed", "[cli]") {
    struct Case {
        const char* args;
        const char* must_say;
    };
    for (const Case& c :
         {Case{"range --material cheese", "--material: no built-in material 'cheese'"},
          Case{"range --particle muon", "--particle: 'muon'"},
          Case{"range --particle N", "--particle"},
          Case{"range --energy 1,abc", "--energy: 'abc' is not a number"},
          Case{"range --energy 0.001", "outside the tables; allowed: 0.01"},
          Case{"range --energy 1,,2", "--energy"},
          Case{"range --format xml", "--format: 'xml' is not a format; allowed"},
          Case{"range --bogus", "bogus"}, Case{"", "subcommand"}}) {
        const Run r = run(c.args);
        INFO(c.args << "\n" << r.out);
        CHECK(r.exit_code == 2);
        CHECK(r.out.find(c.must_say) != std::string::npos);
    }
}

TEST_CASE("help teaches the commands", "[cli]") {
    const Run r = run("--help");
    CHECK(r.exit_code == 0);
    CHECK(r.out.find("range") != std::string::npos);
    CHECK(r.out.find("materials") != std::string::npos);
    const Run rr = run("range --help");
    CHECK(rr.exit_code == 0);
    CHECK(rr.out.find("MeV/n") != std::string::npos);
}
