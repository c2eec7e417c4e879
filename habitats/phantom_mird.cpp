// The adult phantom's anatomy: its solids, inserts and organs after the MIRD adult phantom
// (phantom.hpp gives the sources), built from the quadric kernel (phantom_quadric.hpp).
#include "phantom.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace crewdose::habitats {
namespace {

constexpr double kPi = 3.14159265358979323846;

} // namespace

namespace {

// ---- Building blocks (cm, phantom frame) ----

PhantomSolid& cut(PhantomSolid& s, Vector3 normal, double offset) {
    s.cuts.push_back({normal, offset});
    return s;
}
PhantomSolid& z_at_least(PhantomSolid& s, double z) {
    return cut(s, {0, 0, -1}, -z);
}
PhantomSolid& z_at_most(PhantomSolid& s, double z) {
    return cut(s, {0, 0, 1}, z);
}
PhantomSolid& x_at_least(PhantomSolid& s, double x) {
    return cut(s, {-1, 0, 0}, -x);
}
PhantomSolid& x_at_most(PhantomSolid& s, double x) {
    return cut(s, {1, 0, 0}, x);
}
PhantomSolid& y_at_least(PhantomSolid& s, double y) {
    return cut(s, {0, -1, 0}, -y);
}
PhantomSolid& y_at_most(PhantomSolid& s, double y) {
    return cut(s, {0, 1, 0}, y);
}

PhantomSolid ellipsoid(Point3 c, Vector3 semi) {
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::ellipsoid;
    s.center = c;
    s.semi = semi;
    const double m = std::max({semi.x, semi.y, semi.z});
    s.bound_lo = {c.x - m, c.y - m, c.z - m};
    s.bound_hi = {c.x + m, c.y + m, c.z + m};
    return s;
}

PhantomSolid aligned_ellipsoid(Point3 c, Vector3 semi) {
    PhantomSolid s = ellipsoid(c, semi);
    s.bound_lo = {c.x - semi.x, c.y - semi.y, c.z - semi.z};
    s.bound_hi = {c.x + semi.x, c.y + semi.y, c.z + semi.z};
    return s;
}

// Vertical elliptic cylinder, axis through (cx, cy), z0 <= z <= z1.
PhantomSolid cylinder_z(double cx, double cy, double a, double b, double z0, double z1) {
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::elliptic_cylinder;
    s.center = {cx, cy, 0.5 * (z0 + z1)};
    s.semi = {a, b, 0.5 * (z1 - z0)};
    z_at_least(s, z0);
    z_at_most(s, z1);
    s.bound_lo = {cx - a, cy - b, z0};
    s.bound_hi = {cx + a, cy + b, z1};
    return s;
}

// Horizontal elliptic cylinder along x through (y = cy, z = cz): semi-axis b along y, c along
// z, x0 <= x <= x1.
PhantomSolid cylinder_x(double cy, double cz, double b, double c, double x0, double x1) {
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::elliptic_cylinder;
    s.center = {0.5 * (x0 + x1), cy, cz};
    s.ex = {0, 1, 0};
    s.ey = {0, 0, 1};
    s.ez = {1, 0, 0};
    s.semi = {b, c, 0.5 * (x1 - x0)};
    x_at_least(s, x0);
    x_at_most(s, x1);
    s.bound_lo = {x0, cy - b, cz - c};
    s.bound_hi = {x1, cy + b, cz + c};
    return s;
}

// Vertical circular cone frustum, axis through (cx, cy): radius r1 at z1 narrowing linearly to
// r0 at z0 < z1.
PhantomSolid cone_z(double cx, double cy, double z0, double r0, double z1, double r1) {
    if (!(r0 > 0.0 && r1 >= r0 && z1 > z0)) {
        // interval_ahead() takes the hull of the quadric's pieces: right only while the cuts
        // keep the cone's apex out, as a frustum with r0 > 0 does.
        throw std::logic_error("phantom: a cone frustum needs 0 < r0 <= r1 and z0 < z1");
    }
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::elliptic_cone;
    s.center = {cx, cy, z1};
    s.semi = {r1, r1, 0.0};
    s.k = (1.0 - r0 / r1) / (z1 - z0); // r(z) = r1 (1 + k (z - z1))
    z_at_least(s, z0);
    z_at_most(s, z1);
    s.bound_lo = {cx - r1, cy - r1, z0};
    s.bound_hi = {cx + r1, cy + r1, z1};
    return s;
}

// Tube of radius r about the circle of radius R in the plane y = c.y, centred on c.
PhantomSolid torus_xz(Point3 c, double R, double r) {
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::torus;
    s.center = c;
    s.semi = {r, r, R};
    s.bound_lo = {c.x - R - r, c.y - r, c.z - R - r};
    s.bound_hi = {c.x + R + r, c.y + r, c.z + R + r};
    return s;
}

PhantomSolid polytope() {
    PhantomSolid s;
    s.kind = PhantomSolid::Kind::polytope;
    s.semi = {1, 1, 1};
    return s;
}

PhantomRegion region(std::vector<PhantomSolid> parts, std::vector<PhantomSolid> minus = {}) {
    return {std::move(parts), std::move(minus)};
}

} // namespace

Phantom::Phantom(std::size_t points_per_region) {
    if (points_per_region == 0) {
        throw std::invalid_argument("phantom: at least one point per organ region");
    }
    // ---- Outer body (G4MIRDTrunk, G4MIRDHead, G4MIRD{Left,Right}Leg, G4MIRD*Breast,
    // G4MIRDMaleGenitalia) ----
    const PhantomSolid trunk = cylinder_z(0, 0, 20, 10, 0, 70);
    PhantomSolid head_cap = aligned_ellipsoid({0, 0, 85.5}, {7, 10, 8.5});
    z_at_least(head_cap, 85.5);
    const PhantomSolid leg_left = cone_z(10, 0, -80, 2, 0, 10);
    const PhantomSolid leg_right = cone_z(-10, 0, -80, 2, 0, 10);
    PhantomSolid genitalia = polytope(); // the trapezoid as its bounding box
    x_at_least(genitalia, -10);
    x_at_most(genitalia, 10);
    y_at_least(genitalia, -10);
    y_at_most(genitalia, 0);
    z_at_least(genitalia, -4.8);
    z_at_most(genitalia, 0);
    genitalia.bound_lo = {-10, -10, -4.8};
    genitalia.bound_hi = {10, 0, 0};
    // The breasts are turned 16 degrees about z so that their short axis follows the trunk's
    // surface normal at (+-10, -8.66): the evident intent of the Geant4 rotation.
    auto breast = [](double side) {
        PhantomSolid b = ellipsoid({side * 10, -9.1, 52}, {4.95, 4.15, 4.35});
        const double t = side * 16.0 * kPi / 180.0;
        b.ex = {std::cos(t), std::sin(t), 0};
        b.ey = {-std::sin(t), std::cos(t), 0};
        return b;
    };
    const PhantomSolid breast_left = breast(1.0);
    const PhantomSolid breast_right = breast(-1.0);
    body_ = {{trunk, {}},
             {cylinder_z(0, 0, 7, 10, 70, 85.5), {}},
             {head_cap, {}},
             {leg_left, {}},
             {leg_right, {}},
             {breast_left, {trunk}},
             {breast_right, {trunk}},
             {genitalia, {leg_left, leg_right}}};

    // ---- Tissues of another density (G4HumanPhantomMaterial: MIRD lung 0.2958, skeleton
    // 1.4862 g/cm3) ----
    PhantomSolid lung_left = aligned_ellipsoid({8.5, 0, 43.5}, {5, 7.5, 24});
    z_at_least(lung_left, 43.5);
    PhantomSolid notch_left = aligned_ellipsoid({2.5, 0, 43.5}, {5, 7.5, 24});
    y_at_most(notch_left, 0);
    z_at_least(notch_left, 43.5);
    PhantomSolid lung_right = aligned_ellipsoid({-8.5, 0, 43.5}, {5, 7.5, 24});
    z_at_least(lung_right, 43.5);
    PhantomSolid notch_right = aligned_ellipsoid({-2.5, 0, 43.5}, {5, 7.5, 24});
    y_at_most(notch_right, 0);
    z_at_least(notch_right, 43.5);
    const PhantomSolid skull_outer = aligned_ellipsoid({0, 0, 85.5}, {6.8, 9.8, 8.3});
    const PhantomSolid brain = aligned_ellipsoid({0, 0, 86.5}, {6, 9, 6.5});
    PhantomSolid spine_upper = cylinder_z(0, 5.5, 2, 2.5, 70, 78.5);
    // G4MIRDUpperSpine's bevel: a box turned Rx(-25 deg) about (0, 3, 79.75) takes the anterior
    // top; on the spine it acts as this one plane (without it the spine overlaps the skull).
    cut(spine_upper, {0, -0.4226, 0.9063}, 68.510);
    const PhantomSolid spine_lower = cylinder_z(0, 5.5, 2, 2.5, 22, 70);
    inserts_ = {
        {"lungs", {{lung_left, {notch_left}}, {lung_right, {notch_right}}}, 0.2958, std::nullopt},
        {"skull", {{skull_outer, {brain}}}, 1.4862, std::nullopt},
        {"spine", {{spine_upper, {}}, {spine_lower, {}}}, 1.4862, std::nullopt}};

    // ---- Organs ----
    auto add = [&](std::string id, std::string note,
                   std::vector<std::pair<PhantomRegion, double>> regions) {
        PhantomOrgan o;
        o.id = std::move(id);
        o.note = std::move(note);
        o.regions = std::move(regions);
        double total = 0.0;
        for (const auto& [r, share] : o.regions) {
            total += share;
        }
        for (const auto& [r, share] : o.regions) {
            o.region_begin.push_back(o.points.size());
            for (const auto& p : sample_region(r, points_per_region, o.id)) {
                o.points.push_back(p);
                o.weights.push_back(share / total / static_cast<double>(points_per_region));
            }
        }
        o.region_begin.push_back(o.points.size());
        organs_.push_back(std::move(o));
    };
    add("brain", "G4MIRDBrain", {{region({brain}), 1.0}});
    PhantomSolid thyroid = cylinder_z(0, -3.91, 1.85, 1.85, 70, 74.2);
    y_at_most(thyroid, -3.91);
    // Its two bevels (slabs turned +-50 degrees about x), each a plane on the thyroid.
    cut(thyroid, {0, -0.643, 0.766}, 59.100);
    cut(thyroid, {0, -0.643, -0.766}, -50.438);
    add("thyroid", "G4MIRDThyroid",
        {{region({thyroid}, {cylinder_z(0, -3.91, 0.83, 0.83, 69, 75)}), 1.0}});
    add("thymus", "G4MIRDThymus", {{region({aligned_ellipsoid({2, -6, 60.5}, {3, 0.5, 4})}), 1.0}});
    {
        // G4MIRDHeart: a lower half-ellipsoid and an upper hemisphere about (0, -3, 50.32),
        // the long axis turned 25 degrees about y.
        const double c = std::cos(25.0 * kPi / 180.0);
        const double s = std::sin(25.0 * kPi / 180.0);
        const Point3 centre{0, -3, 50.32};
        PhantomSolid lower = ellipsoid(centre, {4, 4, 7});
        lower.ex = {c, 0, s};
        lower.ez = {-s, 0, c};
        const double along = dot(lower.ez, centre - Point3{});
        cut(lower, lower.ez, along);
        PhantomSolid upper = ellipsoid(centre, {3.99, 3.99, 3.99});
        upper.ex = lower.ex;
        upper.ez = lower.ez;
        cut(upper, -lower.ez, -along);
        add("heart", "G4MIRDHeart (a simplified heart)", {{region({lower, upper}), 1.0}});
    }
    add("lung", "G4MIRD{Left,Right}Lung",
        {{region({lung_left, lung_right}, {notch_left, notch_right}), 1.0}});
    add("breast",
        "G4MIRD{Left,Right}Breast (minus the trunk itself, not Geant4's cylinder 0.4 cm off it)",
        {{region({breast_left, breast_right}, {trunk}), 1.0}});
    add("stomach", "G4MIRDStomach (wall and contents)",
        {{region({aligned_ellipsoid({8, -4, 35}, {4, 3, 8})}), 1.0}});
    PhantomSolid liver = cylinder_z(0, 0, 14.19, 7.84, 27.79, 42.21);
    cut(liver, {0.641, 0.655, -0.401}, -17.61);
    add("liver", "G4MIRDLiver (Geant4 keeps the ORNL 15-year-old / adult-female liver here)",
        {{region({liver}), 1.0}});
    add("spleen", "G4MIRDSpleen", {{region({aligned_ellipsoid({11, 3, 37}, {3.5, 2, 6})}), 1.0}});
    PhantomSolid pancreas = aligned_ellipsoid({0, 0, 37}, {15, 1, 3});
    x_at_least(pancreas, 0);
    PhantomSolid pancreas_cut = polytope();
    x_at_least(pancreas_cut, 3);
    z_at_most(pancreas_cut, 37);
    add("pancreas", "G4MIRDPancreas", {{region({pancreas}, {pancreas_cut}), 1.0}});
    PhantomSolid kidney_left = aligned_ellipsoid({6, 6, 32.5}, {4.5, 1.5, 5.5});
    x_at_least(kidney_left, 3);
    PhantomSolid kidney_right = aligned_ellipsoid({-6, 6, 32.5}, {4.5, 1.5, 5.5});
    x_at_most(kidney_right, -3);
    add("kidneys", "G4MIRD{Left,Right}Kidney", {{region({kidney_left, kidney_right}), 1.0}});
    PhantomSolid adrenal_left = aligned_ellipsoid({4.5, 6.5, 38}, {1.5, 0.5, 5});
    z_at_least(adrenal_left, 38);
    PhantomSolid adrenal_right = aligned_ellipsoid({-4.5, 6.5, 38}, {1.5, 0.5, 5});
    z_at_least(adrenal_right, 38);
    add("adrenals", "G4MIRD{Left,Right}Adrenal", {{region({adrenal_left, adrenal_right}), 1.0}});
    const PhantomSolid colon_ascending = cylinder_z(-8, -2.36, 2.5, 2.5, 14.45, 24.0);
    const PhantomSolid colon_transverse = cylinder_x(-2.36, 25.5, 2.5, 1.5, -10.5, 10.5);
    const PhantomSolid colon_descending = cylinder_z(8.72, -2.36, 1.88, 2.13, 8.72, 24.0);
    PhantomSolid sigmoid_upper = torus_xz({3, -2.36, 8.72}, 5.72, 1.88);
    x_at_least(sigmoid_upper, 3);
    z_at_most(sigmoid_upper, 8.72);
    PhantomSolid sigmoid_lower = torus_xz({3, -2.36, 0}, 3.0, 1.88);
    x_at_most(sigmoid_lower, 3);
    z_at_least(sigmoid_lower, 0);
    // Inside both circles of radius 11 about (0, -2.66) and (0, -3.46): the first binds below
    // y = -3.06, the second above.
    PhantomSolid intestine_front = cylinder_z(0, -2.66, 11, 11, 17, 27);
    y_at_least(intestine_front, -4.86);
    y_at_most(intestine_front, -3.06);
    PhantomSolid intestine_back = cylinder_z(0, -3.46, 11, 11, 17, 27);
    y_at_least(intestine_back, -3.06);
    y_at_most(intestine_back, 2.20);
    add("small-intestine", "G4MIRDSmallIntestine",
        {{region({intestine_front, intestine_back},
                 {colon_ascending, colon_transverse, colon_descending}),
          1.0}});
    add("colon", "G4MIRDUpperLargeIntestine and G4MIRDLowerLargeIntestine",
        {{region(
              {colon_ascending, colon_transverse, colon_descending, sigmoid_upper, sigmoid_lower}),
          1.0}});
    add("bladder", "G4MIRDUrinaryBladder (the wall)",
        {{region({aligned_ellipsoid({0, -4.5, 8}, {4.958, 3.458, 3.458})},
                 {aligned_ellipsoid({0, -4.5, 8}, {4.706, 3.206, 3.206})}),
          1.0}});
    const PhantomRegion ovaries = region({aligned_ellipsoid({6, 0.5, 15}, {1, 0.5, 2}),
                                          aligned_ellipsoid({-6, 0.5, 15}, {1, 0.5, 2})});
    const PhantomRegion testes = region({aligned_ellipsoid({1.4, -8, -2.4}, {1.3, 1.5, 2.3}),
                                         aligned_ellipsoid({-1.4, -8, -2.4}, {1.3, 1.5, 2.3})});
    // ICRP 103 averages the male and female organ doses: the gonads of the hermaphrodite
    // phantom are half testes, half ovaries.
    add("gonads", "G4MIRD testes and ovaries, half each", {{testes, 0.5}, {ovaries, 0.5}});
    PhantomSolid uterus = aligned_ellipsoid({0, 2, 14}, {2.5, 5, 1.5});
    y_at_most(uterus, 4.5);
    add("uterus", "G4MIRDUterus", {{region({uterus}), 1.0}});

    // Active marrow over the bones. Shares by skeletal site for the adult after Cristy (1981,
    // Phys. Med. Biol. 26, 389), FROM MEMORY and unverified: cranium 7.6 + mandible 0.8,
    // cervical spine 3.9, thoracic + lumbar 28.4, ribs 16.1 + sternum 3.1, os coxae 17.5 +
    // sacrum 9.9, scapulae 2.8, humeri (upper half) 2.3, femora (upper half) 6.7; the clavicles'
    // 0.8 % is left out (the shares are renormalised).
    std::vector<PhantomSolid> ribs;
    for (const double zc :
         {36.0, 38.8, 41.5, 44.3, 47.1, 49.9, 52.7, 55.5, 58.3, 61.1, 63.9, 66.7}) {
        ribs.push_back(cylinder_z(0, 0, 17, 9.8, zc - 0.7, zc + 0.7));
    }
    PhantomSolid pelvis_upper = cylinder_z(0, -3, 12, 12, 14, 22);
    y_at_least(pelvis_upper, -3);
    PhantomSolid pelvis_lower = cylinder_z(0, -3, 12, 12, 0, 14);
    y_at_least(pelvis_lower, -3);
    y_at_most(pelvis_lower, 5);
    PhantomSolid scapula_left = cylinder_z(0, 0, 19, 9.8, 50.9, 67.3);
    cut(scapula_left, {0.25, -1, 0}, 0); // y >= 0.25 x
    cut(scapula_left, {-0.80, 1, 0}, 0); // y <= 0.80 x
    PhantomSolid scapula_right = cylinder_z(0, 0, 19, 9.8, 50.9, 67.3);
    cut(scapula_right, {-0.25, -1, 0}, 0); // y >= -0.25 x
    cut(scapula_right, {0.80, 1, 0}, 0);   // y <= -0.80 x
    const std::vector<std::pair<PhantomRegion, double>> marrow{
        {region({skull_outer}, {brain}), 8.4},
        {region({spine_upper}), 3.9},
        {region({spine_lower}), 28.4},
        {region(ribs, {cylinder_z(0, 0, 16.5, 9.3, 35, 68)}), 19.2},
        {region({pelvis_upper, pelvis_lower}, {cylinder_z(0, -3.8, 11.3, 11.3, -1, 23)}), 27.4},
        {region({scapula_left, scapula_right}, {cylinder_z(0, 0, 17, 9.8, 50, 68)}), 2.8},
        {region(
             {cylinder_z(18.4, 0, 1.4, 2.7, 34.5, 69), cylinder_z(-18.4, 0, 1.4, 2.7, 34.5, 69)}),
         2.3},
        {region({[] {
                     PhantomSolid s = cone_z(10, 0, -79.8, 1.0, 0, 3.5);
                     z_at_least(s, -39.9);
                     return s;
                 }(),
                 [] {
                     PhantomSolid s = cone_z(-10, 0, -79.8, 1.0, 0, 3.5);
                     z_at_least(s, -39.9);
                     return s;
                 }()}),
         6.7}};
    add("red-marrow", "active marrow in the MIRD bones (Cristy 1981 shares, from memory)", marrow);

    // The rest of the skeleton shields at the skeleton's density too: ribs, pelvis, scapulae,
    // arm and leg bones (the clavicles, tori of 14 cm3 each, count as soft tissue).
    PhantomInsert rib_cage{"ribs", {}, 1.4862, cylinder_z(0, 0, 17, 9.8, 35.3, 67.4)};
    for (const auto& rib : ribs) {
        const double z0 = rib.bound_lo.z;
        const double z1 = rib.bound_hi.z;
        rib_cage.pieces.push_back({rib, {cylinder_z(0, 0, 16.5, 9.3, z0, z1)}});
    }
    inserts_.push_back(std::move(rib_cage));
    PhantomInsert bones{"bones", {}, 1.4862, std::nullopt};
    const PhantomSolid pelvis_inner = cylinder_z(0, -3.8, 11.3, 11.3, -1, 23);
    bones.pieces.push_back({pelvis_upper, {pelvis_inner}});
    bones.pieces.push_back({pelvis_lower, {pelvis_inner}});
    const PhantomSolid scapula_inner = cylinder_z(0, 0, 17, 9.8, 50, 68);
    bones.pieces.push_back({scapula_left, {scapula_inner}});
    bones.pieces.push_back({scapula_right, {scapula_inner}});
    bones.pieces.push_back({cylinder_z(18.4, 0, 1.4, 2.7, 0, 69), {}});
    bones.pieces.push_back({cylinder_z(-18.4, 0, 1.4, 2.7, 0, 69), {}});
    bones.pieces.push_back({cone_z(10, 0, -79.8, 1.0, 0, 3.5), {}});
    bones.pieces.push_back({cone_z(-10, 0, -79.8, 1.0, 0, 3.5), {}});
    inserts_.push_back(std::move(bones));

    // ---- Skin: the outer body's surface ----
    skin_.id = "skin";
    skin_.note = "the outer body's surface, uniform by area (dose 0.07 mm below it)";
    skin_.points = surface_points(body_, points_per_region);
    skin_.weights.assign(skin_.points.size(), 1.0 / static_cast<double>(skin_.points.size()));
    skin_.region_begin = {0, skin_.points.size()};
}

} // namespace crewdose::habitats
