// The stylised phantom: its geometry, the organ depth weights, and the numerical choices of the
// phantom body model (depth grid, points per direction, directions, SPE energy grid, GCR grid
// and march step), each against a finer or exact reference; the convergence studies that take
// long are in phantom_convergence_test.cpp (label slow).
#include "fixture.hpp"
#include "phantom_helpers.hpp"
#include "planner/analyses/shelter.hpp"
#include "planner/report/check_html.hpp"
#include "planner/report/check_report.hpp"
#include "planner/report/shelter_report.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include <algorithm>
#include <cmath>
#include <set>
#include <sstream>

using namespace crewdose;
using habitats::Phantom;
using habitats::Point3;
using habitats::Vector3;
using namespace crewdose::phantom_test;

TEST_CASE("phantom: tissue paths through the body by hand", "[phantom]") {
    // By construction from the MIRD dimensions (Geant4 G4MIRD*.cc): trunk semi-axes 20 x 10 cm,
    // 0 <= z <= 70; spine an elliptic cylinder 2 x 2.5 cm about (0, 5.5); arm bones 1.4 x 2.7 cm
    // about (+-18.4, 0); ribs rings between 16.5 x 9.3 and 17 x 9.8 cm; legs cones of radius
    // 10 (1 + 0.01 z) about (+-10, 0); head cap 7 x 10 x 8.5 cm above z = 85.5; skull outer
    // ellipsoid 6.8 x 9.8 x 8.3 about z = 85.5, brain 6 x 9 x 6.5 about z = 86.5.
    const Phantom& ph = planner::shared_phantom();
    const Point3 mid{0, 0, 35};
    // Sideways at z = 35: 20 cm of trunk, 2.8 cm of it the left arm bone (x = 18.4 +- 1.4); at
    // z = 36 also the first rib (x from 16.5 to 17).
    CHECK(ph.tissue_g_cm2(mid, {1, 0, 0}) ==
          Approx(20.0 * kSoft + 2.8 * (kBone - kSoft)).epsilon(1e-12));
    CHECK(ph.tissue_g_cm2({0, 0, 36}, {1, 0, 0}) ==
          Approx(20.0 * kSoft + 3.3 * (kBone - kSoft)).epsilon(1e-12));
    CHECK(ph.tissue_g_cm2(mid, {0, -1, 0}) == Approx(10.0 * kSoft).epsilon(1e-12));
    // Backwards through 5 cm of spine (y from 3 to 8).
    CHECK(ph.tissue_g_cm2(mid, {0, 1, 0}) ==
          Approx(10.0 * kSoft + 5.0 * (kBone - kSoft)).epsilon(1e-12));
    // Straight down from (5, -1, 35): 35 cm of trunk, then the left leg down to where its
    // radius is sqrt(26) cm: 1 + 0.01 z = sqrt(26) / 10.
    const double z_exit = (std::sqrt(26.0) / 10.0 - 1.0) / 0.01;
    CHECK(ph.tissue_g_cm2({5, -1, 35}, {0, 0, -1}) ==
          Approx((35.0 - z_exit) * kSoft).epsilon(1e-12));
    // Up from the centre of the brain: 7.5 cm to the top of the head, 0.8 cm of it skull.
    CHECK(ph.tissue_g_cm2({0, 0, 86.5}, {0, 0, 1}) ==
          Approx(7.5 * kSoft + 0.8 * (kBone - kSoft)).epsilon(1e-12));
    CHECK(ph.in_body({0, 0, 93.9}));
    CHECK_FALSE(ph.in_body({0, 0, 94.1}));
    CHECK_FALSE(ph.in_body({0, -10.5, 35})); // in front of the trunk, outside the breasts
    // Every organ point lies in the body, and so does every skin point (1e-6 cm inside).
    for (const auto& o : ph.organs()) {
        for (const auto& p : o.points) {
            INFO(o.id);
            REQUIRE(ph.in_body(p));
        }
    }
    for (const auto& p : ph.skin().points) {
        REQUIRE(ph.in_body(p));
    }
}

TEST_CASE("phantom: skin points are uniform on the surface by area", "[phantom]") {
    // By construction (Crofton): isotropic uniform random lines meet a surface of area S on
    // average S / (2 pi R^2) times, R the radius of the sphere they are drawn in. A sphere of
    // radius 3 cm: area 4 pi 9 within 0.5 %, every point on it to 1e-6 cm, and the points
    // uniform: the mean of z is 0 and of z^2 is r^2 / 3 = 3 (within 1 %).
    habitats::PhantomSolid ball;
    ball.kind = habitats::PhantomSolid::Kind::ellipsoid;
    ball.center = {0, 0, 0};
    ball.semi = {3, 3, 3};
    ball.bound_lo = {-3, -3, -3};
    ball.bound_hi = {3, 3, 3};
    const std::vector<habitats::PhantomPiece> one{{ball, {}}};
    double lines_per_crossing = 0.0;
    double R = 0.0;
    const auto points = habitats::surface_points(one, 20000, &lines_per_crossing, &R);
    REQUIRE(points.size() == 20000);
    CHECK(2.0 * 3.14159265358979 * R * R / lines_per_crossing ==
          Approx(4.0 * 3.14159265358979 * 9.0).epsilon(5e-3));
    double mean_z = 0.0;
    double mean_z2 = 0.0;
    for (const auto& p : points) {
        CHECK(std::sqrt(p.x * p.x + p.y * p.y + p.z * p.z) == Approx(3.0).margin(2e-6));
        mean_z += p.z / 20000.0;
        mean_z2 += p.z * p.z / 20000.0;
    }
    CHECK(mean_z == Approx(0.0).margin(0.01));
    CHECK(mean_z2 == Approx(3.0).epsilon(0.01));
    // Two touching boxes are one surface: the face they share is not skin. Unit cubes side by
    // side: area 10 (not 12).
    habitats::PhantomSolid a;
    a.kind = habitats::PhantomSolid::Kind::polytope;
    a.cuts = {{{1, 0, 0}, 1},  {{-1, 0, 0}, 0}, {{0, 1, 0}, 1},
              {{0, -1, 0}, 0}, {{0, 0, 1}, 1},  {{0, 0, -1}, 0}};
    a.bound_lo = {0, 0, 0};
    a.bound_hi = {1, 1, 1};
    habitats::PhantomSolid b = a;
    b.cuts[0].offset = 2;
    b.cuts[1].offset = -1;
    b.bound_lo = {1, 0, 0};
    b.bound_hi = {2, 1, 1};
    const std::vector<habitats::PhantomPiece> two{{a, {}}, {b, {}}};
    (void)habitats::surface_points(two, 20000, &lines_per_crossing, &R);
    CHECK(2.0 * 3.14159265358979 * R * R / lines_per_crossing == Approx(10.0).epsilon(0.01));
    // The phantom's skin: by hand from the MIRD dimensions, trunk side 6782 cm2 (an ellipse of
    // 20 x 10 cm, Ramanujan's perimeter, 70 cm high), trunk top less the neck 408, neck side
    // 834, head cap 451 (half an ellipsoid 7 x 10 x 8.5, Thomsen's formula), leg cones 6062
    // (radius 2 to 10 over 80 cm), about 500 more for the breasts, the genitalia box and the
    // trunk base the legs leave bare: about 15,040 cm2. Gate 5 % (the last part is rough).
    (void)habitats::surface_points(planner::shared_phantom().body_pieces(), 20000,
                                   &lines_per_crossing, &R);
    CHECK(2.0 * 3.14159265358979 * R * R / lines_per_crossing == Approx(15040.0).epsilon(0.05));
}

TEST_CASE("phantom: organ masses match the MIRD adult phantom's", "[phantom]") {
    // Reference: organ masses of the MIRD Pamphlet 5 adult phantom (Snyder et al. 1969/1978),
    // FROM MEMORY (not checked against the pamphlet here): spleen 174 g, kidneys 284 g,
    // pancreas 60.3 g, uterus 65.4 g, ovaries 8.27 g, testes 37.1 g, adrenals 15.5 g, bladder
    // wall 45.1 g, brain 1470 g, lungs 999 g (lungs at 0.2958 g/cm3, the rest at the MIRD soft
    // tissue's 0.9869). Gate 3 %: what the transcription must reproduce.
    const Phantom& ph = planner::shared_phantom();
    const std::vector<std::tuple<std::string, double, double, double>> cases{
        {"spleen", 174.0, kSoft, 0.1},   {"kidneys", 284.0, kSoft, 0.1},
        {"pancreas", 60.3, kSoft, 0.05}, {"uterus", 65.4, kSoft, 0.05},
        {"adrenals", 15.5, kSoft, 0.03}, {"bladder", 45.1, kSoft, 0.03},
        {"brain", 1470.0, kSoft, 0.2},   {"lung", 999.0, 0.2958, 0.2}};
    for (const auto& [id, mass_g, density, h] : cases) {
        INFO(id);
        CHECK(volume_cm3(ph.organ(id), h) * density == Approx(mass_g).epsilon(0.03));
    }
    // The gonads are half testes, half ovaries: each region on its own.
    const auto& gonads = ph.organ("gonads");
    REQUIRE(gonads.regions.size() == 2);
    habitats::PhantomOrgan testes;
    testes.regions = {gonads.regions[0]};
    habitats::PhantomOrgan ovaries;
    ovaries.regions = {gonads.regions[1]};
    CHECK(volume_cm3(testes, 0.03) * kSoft == Approx(37.1).epsilon(0.03));
    CHECK(volume_cm3(ovaries, 0.02) * kSoft == Approx(8.27).epsilon(0.03));
}

TEST_CASE("phantom: the person's frame follows posture and heading", "[phantom]") {
    // By construction: the phantom's x is its left, y its back, z towards the head.
    using habitats::Posture;
    using habitats::to_phantom_frame;
    auto same = [](Vector3 a, Vector3 b) {
        return std::abs(a.x - b.x) < 1e-12 && std::abs(a.y - b.y) < 1e-12 &&
               std::abs(a.z - b.z) < 1e-12;
    };
    // Standing, facing north: north is the front (-y), east the right (-x), up is +z.
    CHECK(same(to_phantom_frame({0, 1, 0}, Posture::standing, 0.0), {0, -1, 0}));
    CHECK(same(to_phantom_frame({1, 0, 0}, Posture::standing, 0.0), {-1, 0, 0}));
    CHECK(same(to_phantom_frame({0, 0, 1}, Posture::standing, 0.0), {0, 0, 1}));
    // Facing east: east is the front.
    CHECK(same(to_phantom_frame({1, 0, 0}, Posture::standing, 90.0), {0, -1, 0}));
    // Lying on the back, head north: north is +z, up the front (-y), east the left (+x).
    CHECK(same(to_phantom_frame({0, 1, 0}, Posture::lying, 0.0), {0, 0, 1}));
    CHECK(same(to_phantom_frame({0, 0, 1}, Posture::lying, 0.0), {0, -1, 0}));
    CHECK(same(to_phantom_frame({1, 0, 0}, Posture::lying, 0.0), {1, 0, 0}));
}

TEST_CASE("phantom: depth weights of every organ and direction sum to one", "[phantom]") {
    // By construction: each organ's weights are its points' shares split between two nodes;
    // the effective dose's are the ICRP 103 weights (which sum to 1) times its tissues'.
    const auto dirs = habitats::fibonacci_directions(64);
    const auto b = planner::phantom_body_depths(planner::shared_phantom(), habitats::Posture::lying,
                                                45.0, dirs, planner::phantom_depth_grid());
    REQUIRE(b.organs ==
            std::vector<std::string>{"skin", "lens", "bfo", "heart", "brain", "effective"});
    for (std::size_t k = 0; k < dirs.size(); ++k) {
        for (std::size_t o = 0; o < b.organs.size(); ++o) {
            double sum = 0.0;
            for (const double w : b.of(k, o)) {
                REQUIRE(w >= 0.0);
                sum += w;
            }
            INFO(b.organs[o] << " direction " << k);
            CHECK(sum == Approx(1.0).epsilon(1e-12));
        }
    }
    // A tissue the phantom lacks takes its named proxy; every weighted tissue is covered.
    for (const auto& w : exposure::icrp103_tissue_weights()) {
        const std::string organ = planner::phantom_organ_for(w.tissue);
        if (!organ.empty() && organ != "skin") {
            CHECK_NOTHROW(planner::shared_phantom().organ(organ));
        }
    }
    CHECK(planner::phantom_organ_for("oesophagus") == "thymus");
    CHECK_THROWS_AS(planner::phantom_body_depths(planner::shared_phantom(),
                                                 habitats::Posture::standing, 0.0, dirs,
                                                 std::vector<double>{1.0, 2.0}),
                    std::invalid_argument); // no skin or lens node
}

TEST_CASE("phantom: the depth grid against every point's own depth", "[phantom]") {
    // Reference: a grid holding every depth that occurs (each point's weight then sits on its
    // own depth), the exact evaluation of the same points and directions. The default grid's
    // linear interpolation between nodes overestimates (the dose falls convexly with depth).
    // Largest difference seen: +1.2 % (BFO behind the suit, demo Band event). Gate 2.5 %.
    const auto dirs = habitats::fibonacci_directions(24);
    const Phantom& ph = planner::shared_phantom();
    const std::size_t m = 8; // points per region per direction
    std::set<double> all{0.007, 0.3};
    for (std::size_t k = 0; k < dirs.size(); ++k) {
        const Vector3 u = habitats::to_phantom_frame(dirs[k], habitats::Posture::standing, 30.0);
        for (const auto& o : ph.organs()) {
            for (std::size_t r = 0; r + 1 < o.region_begin.size(); ++r) {
                const std::size_t first = o.region_begin[r];
                const std::size_t count = o.region_begin[r + 1] - first;
                for (std::size_t j = 0; j < m; ++j) {
                    all.insert(ph.tissue_g_cm2(o.points[first + (k * m + j) % count], u));
                }
            }
        }
    }
    const std::vector<double> exact_grid(all.begin(), all.end());
    for (const auto& where : {suited(), shelled("aluminium", 10.0)}) {
        const auto grid =
            phantom_responses(where, dirs.size(), 32, m, planner::phantom_depth_grid());
        const auto exact = phantom_responses(where, dirs.size(), 32, m, exact_grid);
        for (std::size_t o = 0; o < grid.size(); ++o) {
            for (const auto* s : {&kBand, &kHard}) {
                const double a = dose_equivalent(grid[o], *s);
                const double b = dose_equivalent(exact[o], *s);
                INFO(grid[o].organ);
                CHECK(a >= b * (1.0 - 1e-3)); // the grid is not below the exact value
                CHECK(a == Approx(b).epsilon(0.025));
            }
        }
    }
}

TEST_CASE("phantom: organs behind the body get less than the quick model's fixed depths",
          "[phantom]") {
    // Common practice: the quick model's 5 cm BFO depth in every direction is a conservative
    // screening value; the body shields the marrow, heart and brain more on average. In a suit
    // on the ground (demo Band event), the phantom's BFO, heart and brain doses are below the
    // quick model's BFO; the lens is the same depth in both. The skin: a point on the surface
    // of a convex body sees the sky through 0.07 mm only in the directions that point outwards
    // (the others cross the body), so for a soft event about half the quick model's skin dose
    // (less where the body is concave, between the legs; more through the body for hard
    // protons). Gate 0.40-0.55 (measured when written: 0.469).
    const auto where = suited();
    const auto dirs = habitats::fibonacci_directions(planner::kDefaultPhantomDirections);
    exposure::TableLibrary tables;
    const auto quick = planner::quick_model_responses(tables, builtin, where, dirs);
    const auto phantom = phantom_responses(
        where, dirs.size(), 64, planner::kPhantomPointsPerDirection, planner::phantom_depth_grid());
    const double quick_bfo = dose_equivalent(quick[2], kBand);
    REQUIRE(quick[2].organ == "bfo");
    for (const auto& o : phantom) {
        if (o.organ == "bfo" || o.organ == "heart" || o.organ == "brain") {
            INFO(o.organ);
            CHECK(dose_equivalent(o, kBand) < quick_bfo);
        }
        if (o.organ == "lens") {
            // (the phantom's responses take the fast path: within 0.05 %, response_test)
            CHECK(dose_equivalent(o, kBand) ==
                  Approx(dose_equivalent(quick[1], kBand)).epsilon(5e-4));
        }
        if (o.organ == "skin") {
            REQUIRE(quick[0].organ == "skin");
            const double ratio = dose_equivalent(o, kBand) / dose_equivalent(quick[0], kBand);
            INFO("skin, phantom / quick: " << ratio);
            CHECK(ratio > 0.40);
            CHECK(ratio < 0.55);
        }
    }
}

namespace {

// A two-location plan (invented): one phantom, one quick location.
const std::string kMixed = read_fixture("phantom-mixed.toml");

} // namespace

TEST_CASE("phantom: heart, brain and effective dose in the ledger", "[phantom][ledger]") {
    // By construction: crew a stays 20 days at the phantom location: its career effective dose
    // is the prior 11 mSv plus 20 days of the location's GCR effective-dose rate (dose
    // equivalent of the "effective" organ). Crew b spends half its time at a quick location:
    // heart, brain and effective dose are not evaluated for it, and say where.
    const planner::Study study(planner::parse_scenario(kMixed, "mixed.toml"));
    CHECK(study.has_organ("cabin", "effective"));
    CHECK_FALSE(study.has_organ("other", "heart"));
    const double phi = study.scenario().mission.gcr_phi_MV;
    const double rate_mSv =
        1e3 * study.gcr_daily_dose("cabin", "effective", phi).for_limits().dose_equivalent_Sv;
    REQUIRE(rate_mSv > 0.0);
    const planner::LedgerResult ledger = planner::build_ledger(study);
    const auto& a = ledger.crew.at(0);
    const auto& b = ledger.crew.at(1);
    CHECK(a.not_evaluated.empty());
    const auto effective = std::find_if(a.organs.begin(), a.organs.end(),
                                        [](const auto& o) { return o.organ == "effective"; });
    REQUIRE(effective != a.organs.end());
    CHECK(effective->career_mGyEq == Approx(11.0 + 20.0 * rate_mSv).epsilon(1e-9));
    bool effective_checked = false;
    bool heart_checked = false;
    for (const auto& c : a.checks) {
        effective_checked = effective_checked || c.limit.organ == "effective";
        heart_checked = heart_checked || c.limit.organ == "heart";
    }
    CHECK(effective_checked);
    CHECK(heart_checked);
    // Heart and brain are not evaluated for b; the career effective dose is bounded at the
    // quick location instead of dropped.
    REQUIRE(b.not_evaluated.size() == 2);
    CHECK(b.not_evaluated.at("heart") == std::vector<std::string>{"other"});
    CHECK(b.estimated.at("effective") == std::vector<std::string>{"other"});
    bool b_career = false;
    for (const auto& c : b.checks) {
        CHECK(c.limit.organ != "brain");
        b_career = b_career || (c.limit.organ == "effective" && c.limit.window == "career");
    }
    CHECK(b_career);
}

TEST_CASE("phantom: in an isotropic field the posture and heading do not matter", "[phantom]") {
    // By construction: in deep space behind a uniform shell every direction sees the same
    // shielding, so turning the body changes its organ doses only by the direction sampling
    // (128 directions: seen within 0.6 %; gate 1.5 %). On the ground, lying on the back puts
    // most of the body between the open sky and the marrow of the spine, ribs and pelvis (seen:
    // 19 % less BFO dose than standing; checked: more than 5 % less).
    const auto dirs = habitats::fibonacci_directions(128);
    exposure::TableLibrary tables(planner::body_model("phantom").spe_grid());
    auto doses = [&](const planner::LocationGeometry& where, habitats::Posture posture,
                     double heading) {
        const auto body = planner::phantom_body_depths(planner::shared_phantom(), posture, heading,
                                                       dirs, planner::phantom_depth_grid());
        std::vector<double> out;
        for (const auto& r : planner::body_responses(tables, builtin, where, dirs, body)) {
            out.push_back(dose_equivalent(r, kBand));
        }
        return out;
    };
    planner::LocationGeometry space;
    space.shell = {{"aluminium", 5.0}};
    const auto standing = doses(space, habitats::Posture::standing, 0.0);
    for (const auto& turned : {doses(space, habitats::Posture::standing, 90.0),
                               doses(space, habitats::Posture::lying, 37.0)}) {
        for (std::size_t o = 0; o < standing.size(); ++o) {
            INFO("organ " << o);
            CHECK(turned[o] == Approx(standing[o]).epsilon(0.015));
        }
    }
    planner::LocationGeometry ground = space;
    ground.surroundings.ground = true;
    const auto up = doses(ground, habitats::Posture::standing, 0.0);
    const auto down = doses(ground, habitats::Posture::lying, 0.0);
    CHECK(down[2] < 0.95 * up[2]); // BFO: most active marrow lies in the back, now below
}

TEST_CASE("phantom: the check CSV says which doses are bounded and which are not evaluated",
          "[phantom][ledger]") {
    // By construction (tests/fixtures/scenarios/phantom-mixed.toml): crew b spends time at the
    // quick location "other": its career effective dose is an upper bound there, its heart and
    // brain are not evaluated; crew a stays at the phantom location only. The CSV opened alone
    // must say so, never show a bound as a computed dose or leave a limit out silently.
    const planner::Study study(planner::parse_scenario(kMixed, "mixed.toml"));
    const planner::LedgerResult ledger = planner::build_ledger(study);
    const std::string csv =
        planner::format_check_report(study, ledger, planner::OutputFormat::csv, false, 0.9);
    CHECK(csv.rfind("crew,organ,window,dose,limit,margin,unit,exceeded,status,binding,basis,"
                    "evaluated\n",
                    0) == 0);
    std::size_t a_rows = 0;
    std::size_t a_computed = 0;
    bool b_bound = false;
    std::set<std::string> b_missing;
    std::istringstream lines(csv);
    for (std::string line; std::getline(lines, line);) {
        if (line.rfind("a,", 0) == 0) {
            ++a_rows;
            a_computed += line.size() > 9 && line.substr(line.size() - 9) == ",computed" ? 1U : 0U;
        }
        if (line.rfind("b,effective,career,", 0) == 0) {
            // Text cells holding a space are quoted (document_writer.hpp).
            b_bound = line.find(",\"upper bound at other\"") != std::string::npos;
        }
        for (const char* organ : {"heart", "brain"}) {
            if (line == "b," + std::string(organ) +
                            ",,,,,mGy-Eq,,\"not evaluated\",no,,\"not evaluated at other\"") {
                b_missing.insert(organ);
            }
        }
    }
    CHECK(a_rows > 0);
    CHECK(a_computed == a_rows);
    CHECK(b_bound);
    CHECK(b_missing == std::set<std::string>{"heart", "brain"});
}

TEST_CASE("phantom: the JSON headline and the HTML verdict say what is bounded and not evaluated",
          "[phantom][ledger]") {
    // Found in a new-user trial: the text verdict says that b's effective dose is an upper bound
    // and that b's heart and brain are not evaluated, the JSON headline and the HTML verdict did
    // not. By construction (tests/fixtures/scenarios/phantom-mixed.toml): b spends time at the
    // quick location "other", a never does.
    const planner::Study study(planner::parse_scenario(kMixed, "mixed.toml"));
    const planner::LedgerResult ledger = planner::build_ledger(study);
    const auto json = nlohmann::json::parse(
        planner::format_check_report(study, ledger, planner::OutputFormat::json, false, 0.9));
    const auto& headline = json.at("headline");
    REQUIRE(headline.size() == 2);
    CHECK(headline[0].at("crew") == "a");
    CHECK(headline[0].at("not_evaluated") == nlohmann::json::array());
    CHECK(headline[0].at("bounded") == nlohmann::json::array());
    CHECK(headline[1].at("crew") == "b");
    CHECK(headline[1].at("not_evaluated") == nlohmann::json({"brain", "heart"}));
    CHECK(headline[1].at("bounded") == nlohmann::json({"effective"}));
    // The HTML verdict section itself (the page also holds the whole text report below it).
    const std::string page = planner::format_check_html(study, ledger, 0.9, {});
    const auto from = page.find("<h2>Verdict</h2>");
    REQUIRE(from != std::string::npos);
    const std::string verdict = page.substr(from, page.find("<h2>", from + 1) - from);
    INFO(verdict);
    CHECK(verdict.find("not evaluated for b: brain, heart") != std::string::npos);
    CHECK(verdict.find("effective dose of b: an upper bound where the quick body model stands "
                       "(other") != std::string::npos);
    CHECK(verdict.find("for a:") == std::string::npos);
}

TEST_CASE("phantom: a shelter names the organs it cannot target and why, never drops them",
          "[phantom][shelter]") {
    // By construction: the shelter (cabin) is a phantom location, but crew b also stays at the
    // quick location "other", so b's heart and brain are not evaluated: they cannot be targets,
    // and the report says so with the crew member and the location.
    const std::string text = kMixed + "\n[[event]]\nid = \"spe\"\nflare_seen = "
                                      "2032-01-05T00:00:00Z\nspectrum = "
                                      "\"exp-energy:J0=1e8,E0_MeV=30\"\n";
    const planner::Study study(planner::parse_scenario(text, "mixed.toml"));
    planner::ShelterRequest request;
    request.event_id = "spe";
    request.location_id = "cabin";
    const planner::ShelterReport rep = planner::size_shelter(study, request);
    CHECK(rep.target_mGyEq.count("bfo") == 1);
    CHECK(rep.target_mGyEq.count("heart") == 0);
    CHECK(rep.not_targets.at("heart") == "b at other");
    CHECK(rep.not_targets.at("brain") == "b at other");
    const std::string report =
        planner::format_shelter_report(study, rep, planner::OutputFormat::text);
    CHECK(report.find("heart: not a target: the crew's 30-day heart dose is not evaluated for b "
                      "at other") != std::string::npos);
}
