// No silent nonsense: the pieces that keep a result that was not computed from ever reading as
// a dose (expected values are by construction unless a source is named).
#include "exposure/fragment_transport.hpp"
#include "exposure/gcr.hpp"
#include "exposure/material_library.hpp"
#include "exposure/parameter_error.hpp"
#include "exposure/spectrum.hpp"
#include "planner/analyses/storm.hpp"
#include "planner/scenario/input_error.hpp"
#include "planner/scenario/scenario.hpp"
#include "planner/scenario/toml_text.hpp"
#include "planner/study/ledger.hpp"
#include "planner/study/result_guard.hpp"

#include <boost/date_time/gregorian/gregorian_types.hpp>
#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <cmath>
#include <limits>
#include <string>

using namespace crewdose;
using namespace crewdose::exposure;

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();
constexpr double kInf = std::numeric_limits<double>::infinity();
const FitRange kWide{10.0, 1000.0};

std::string spectrum_error(const SpectrumForm& f, FitRange fit = kWide) {
    try {
        const ProtonSpectrum s(f, fit);
    } catch (const ParameterError& e) {
        return e.what();
    }
    return "no error";
}

std::string toml_error(const std::string& text) {
    try {
        planner::check_toml_text(text, "t.toml");
    } catch (const InputError& e) {
        return e.what();
    }
    return "no error";
}

} // namespace

TEST_CASE("spectra: every accepted spectrum is finite and non-negative on the whole grid",
          "[robustness][spectrum]") {
    // The cases that used to reach the doses as NaN, infinity or a negative fluence.
    CHECK(spectrum_error(PowerLawEnergy{1e10, 300.0, 10.0}).find("gamma") != std::string::npos);
    CHECK(spectrum_error(WeibullEnergy{1e10, 1.0, 100.0}).find("alpha") != std::string::npos);
    CHECK(spectrum_error(TabulatedIntegral{{10.0, 100.0}, {1e9, 1e-300}}).find("faster than") !=
          std::string::npos);
    CHECK(spectrum_error(BandRigidity{1e12, -5.0, 3.0, 0.2}).find("gamma_a") != std::string::npos);
    CHECK(spectrum_error(ExponentialEnergy{kNaN, 30.0}).find("J0") != std::string::npos);
    CHECK(spectrum_error(ExponentialEnergy{1e9, kInf}).find("E0_MeV") != std::string::npos);
    // Weibull that underflows to zero everywhere in the fit range.
    CHECK(spectrum_error(WeibullEnergy{1e9, 50.0, 2.0}).find("no fluence inside its fit range") !=
          std::string::npos);
    // 7e15 protons/cm2 above 10 MeV.
    CHECK(spectrum_error(ExponentialEnergy{1e16, 30.0}).find("J(>10 MeV)") != std::string::npos);
    CHECK(spectrum_error(ExponentialEnergy{1e9, 30.0}, FitRange{0.001, 1000.0}).find("fit_range") !=
          std::string::npos);
    // Scaling at an energy where the shape is zero, or to an overflowing fluence.
    const ProtonSpectrum soft(ExponentialEnergy{1e9, 0.1}, kWide);
    CHECK_THROWS_AS(soft.scaled_to(1e9, 1e5), ParameterError);
    const ProtonSpectrum e20(ExponentialEnergy{1e9, 20.0}, kWide);
    CHECK_THROWS_AS(e20.scaled_to(1e9, 1000.0), ParameterError);
    CHECK_THROWS_AS(e20.scaled_to(kNaN, 30.0), ParameterError);
    // The extremes of every range that is accepted stay finite and non-negative.
    for (const SpectrumForm& f :
         {SpectrumForm{PowerLawEnergy{1e9, 20.0, 100.0}},
          SpectrumForm{PowerLawEnergy{1e3, 0.01, 0.01}},
          SpectrumForm{BandRigidity{1e9, 0.0, 20.0, 0.005}},
          SpectrumForm{BandRigidity{1e5, 19.0, 20.0, 10.0}},
          SpectrumForm{BandDifferentialRigidity{1e9, 0.0, 20.0, 0.005}},
          SpectrumForm{BandDifferentialRigidity{1e-30, 20.0, 20.0001, 10.0}},
          SpectrumForm{BandDifferentialRigidity{1e5, 0.0, 1.0001, 10.0}},
          SpectrumForm{WeibullEnergy{1e9, 100.0, 0.05}},
          SpectrumForm{WeibullEnergy{1e9, 1e-3, 5.0}},
          SpectrumForm{ExponentialRigidity{1e9, 0.005}},
          SpectrumForm{ExponentialEnergy{1e9, 1e4}}}) {
        const std::string err = spectrum_error(f);
        if (err != "no error") {
            // A refusal is fine (the form may be empty in the fit range or too large), as long
            // as it is a ParameterError with a message.
            CHECK(!err.empty());
            continue;
        }
        const ProtonSpectrum s(f, kWide);
        for (double E = 0.01; E <= 1e5; E *= 1.2) {
            const double J = s.integral_fluence_per_cm2(E);
            const double phi = s.differential_fluence_per_cm2_MeV(E);
            INFO(E);
            CHECK(std::isfinite(J));
            CHECK(std::isfinite(phi));
            CHECK(J >= 0.0);
            CHECK(phi >= 0.0);
        }
    }
}

TEST_CASE("the event time profile stays a fraction for every allowed rise and decay",
          "[robustness][scenario]") {
    // rise 0.01-240 h, decay 0.1-2400 h (scenarios/README.md).
    for (const double rise : {0.01, 1.0, 240.0}) {
        for (const double decay : {0.1, 12.0, 2400.0}) {
            planner::EventProfile p{rise, decay};
            double last = 0.0;
            for (double t = 0.0; t < 1e5; t = t * 1.5 + 0.01) {
                const double f = p.fraction_by(t);
                INFO(rise << " " << decay << " " << t);
                REQUIRE(std::isfinite(f));
                CHECK(f >= last);
                CHECK(f <= 1.0);
                CHECK(std::isfinite(p.rate_per_h(t)));
                last = f;
            }
            CHECK(p.fraction_by(1e7) == Approx(1.0).epsilon(1e-9));
        }
    }
}

TEST_CASE("a shield far thicker than any habitat is crossed in bounded time, to zero",
          "[robustness][fragments]") {
    TableLibrary tables;
    FragmentTransport march(tables);
    IonField field = gcr_free_space_field(march, 400.0);
    // 2.5e7 g/cm2: 10 km of the densest material the loader allows. The field is extinct
    // (below 1e-30 of what entered) long before: the march stops and sets it to zero.
    march.cross(field, *find_builtin_material("aluminium"), 2.5e7);
    for (const auto& psi : field.psi) {
        for (const double v : psi) {
            CHECK(v == 0.0);
        }
    }
    CHECK_THROWS_AS(march.cross(field, *find_builtin_material("aluminium"), 1e300),
                    std::invalid_argument);
}

TEST_CASE("results that were not computed never pass: the guard and the comparisons",
          "[robustness][ledger]") {
    CHECK_THROWS_AS(planner::require_dose(kNaN, "x"), planner::ResultFault);
    CHECK_THROWS_AS(planner::require_dose(-1e-9, "x"), planner::ResultFault);
    CHECK_THROWS_AS(planner::require_finite(kInf, "x"), planner::ResultFault);
    CHECK(planner::require_dose(0.0, "x") == 0.0);
    CHECK_THROWS_AS(planner::require_dose(DoseQuantities{1.0, kNaN, 1.0}, "x"),
                    planner::ResultFault);
    nlohmann::json j{{"fine", 1.0}, {"rows", {{{"dose", kNaN}}}}};
    try {
        (void)planner::dump_checked(j);
        FAIL("NaN in JSON must not be written");
    } catch (const planner::ResultFault& e) {
        CHECK(std::string(e.what()).find("/rows/0/dose") != std::string::npos);
    }
    // A what-if organ whose dose is not a number reads as exceeded, never as within.
    planner::StormOrgan o{"bfo", 1.0, kNaN, 0.0, 250.0};
    CHECK(o.exceeded());
    planner::StormCrew c;
    c.organs = {planner::StormOrgan{"lens", 1.0, 1.0, 0.0, 1000.0}, o};
    CHECK(c.exceeded());
    // A rolling window over a piece that is not a number is a fault, not a zero.
    const planner::Time t0(boost::gregorian::date(2032, 1, 1));
    const std::vector<planner::DosePiece> pieces{
        {t0, t0 + boost::posix_time::hours(24), {kNaN, kNaN, kNaN}, nullptr, "test", "test"}};
    CHECK_THROWS_AS(planner::window_maximum(pieces, boost::posix_time::hours(24 * 30),
                                            boost::posix_time::minutes(10)),
                    planner::ResultFault);
}

TEST_CASE("the TOML text check: UTF-8, control characters, non-ASCII only where TOML allows",
          "[robustness][scenario]") {
    CHECK(toml_error("a = 1\n# caf\u00e9\nb = \"\u03eb\"\nc = '\u03eb'\n") == "no error");
    CHECK(toml_error("d = \"\"\"\n\u03eb \\\" \"\"\"\ne = '''\u03eb'''''\n") == "no error");
    CHECK(toml_error("a\u03eb = 1\n").find("t.toml:1: syntax: character U+03EB outside") !=
          std::string::npos);
    CHECK(toml_error("a = 1\n\u00a0\n").find("t.toml:2:") != std::string::npos);
    CHECK(toml_error("a = \"x\xff\"\n").find("not valid UTF-8") != std::string::npos);
    CHECK(toml_error("a = \"\xc0\xaf\"\n").find("not valid UTF-8") !=
          std::string::npos); // overlong
    CHECK(toml_error("a = \"\xed\xa0\x80\"\n").find("not valid UTF-8") !=
          std::string::npos); // surrogate
    CHECK(toml_error(std::string("a = \"x\0y\"\n", 10)).find("control character U+0000") !=
          std::string::npos);
    CHECK(toml_error("s = \"\"\"x \\\n   \u03eb\"\"\"\n").find("line-ending backslash") !=
          std::string::npos);
    // Keys are ASCII: toml++ 3.3 tests each character of a key for whitespace.
    CHECK(toml_error("\"k\u03eb\" = 1\n").find("in a quoted key") != std::string::npos);
    CHECK(toml_error("[\"t\u03eb\"]\n").find("in a quoted key") != std::string::npos);
    CHECK(toml_error("a = { b = 1, \"\u03eb\" = 2 }\n").find("in a quoted key") !=
          std::string::npos);
    CHECK(toml_error("a = [\"\u03eb\", '\u03eb']\nb = { c = \"\u03eb\" }\n") == "no error");
    // Found by the fuzzer: toml++ tests the character after any backslash of a multi-line
    // basic string for whitespace.
    CHECK(toml_error("s = \"\"\"x\\\u03eb\"\"\"\n").find("a backslash before") !=
          std::string::npos);
    // Found by the fuzzer: a quote inside a bare word does not start a string for toml++,
    // which scans the word on (and tests each character for whitespace).
    CHECK(toml_error("id =-\"hu\u03eb\"\n").find("outside a quoted string") != std::string::npos);
    CHECK(toml_error("a = [1, \"\u03eb\"]\n") == "no error");
    // Found by the fuzzer: blanks after a backslash are skipped by toml++, testing what comes
    // next for whitespace.
    CHECK(toml_error("s = \"\"\"x\\ \t\u03eb\"\"\"\n").find("a backslash before") !=
          std::string::npos);
    // An escaped quote does not end the string, so what follows is still inside it.
    CHECK(toml_error("a = \"x\\\" \u03eb\"\n") == "no error");
    // After the string ends, a non-ASCII character is outside again (line 2).
    CHECK(toml_error("a = \"x\"\nb = 1 \u03eb\n").find("t.toml:2:") != std::string::npos);
}
