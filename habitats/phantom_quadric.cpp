#include "phantom_quadric.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace crewdose::habitats {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();

struct Interval {
    double lo;
    double hi;
};

// The ray parameters at which p + t u satisfies the quadric inequality A t^2 + B t + C <= 0:
// up to two intervals.
int quadric_intervals(double A, double B, double C, Interval out[2]) {
    constexpr double tiny = 1e-14;
    if (std::abs(A) < tiny) {
        if (std::abs(B) < tiny) {
            if (C <= 0.0) {
                out[0] = {-kInf, kInf};
                return 1;
            }
            return 0;
        }
        const double t = -C / B;
        out[0] = B > 0.0 ? Interval{-kInf, t} : Interval{t, kInf};
        return 1;
    }
    const double disc = B * B - 4.0 * A * C;
    if (disc < 0.0) {
        if (A < 0.0) { // always negative
            out[0] = {-kInf, kInf};
            return 1;
        }
        return 0;
    }
    const double s = std::sqrt(disc);
    // Numerically stable roots.
    const double q = -0.5 * (B + (B >= 0.0 ? s : -s));
    double t1 = q / A;
    double t2 = q != 0.0 ? C / q : t1;
    if (t1 > t2) {
        std::swap(t1, t2);
    }
    if (A > 0.0) {
        out[0] = {t1, t2};
        return 1;
    }
    out[0] = {-kInf, t1};
    out[1] = {t2, kInf};
    return 2;
}

Vector3 local(const PhantomSolid& s, Vector3 v) {
    return {dot(v, s.ex), dot(v, s.ey), dot(v, s.ez)};
}

} // namespace

bool PhantomSolid::contains(Point3 p) const {
    for (const auto& c : cuts) {
        if (dot(c.normal, p - Point3{}) > c.offset) {
            return false;
        }
    }
    const Vector3 q = local(*this, p - center);
    const double x = q.x / semi.x;
    const double y = q.y / semi.y;
    switch (kind) {
    case Kind::ellipsoid:
        return x * x + y * y + (q.z / semi.z) * (q.z / semi.z) <= 1.0;
    case Kind::elliptic_cylinder:
        return x * x + y * y <= 1.0;
    case Kind::elliptic_cone: {
        const double f = 1.0 + k * q.z;
        return f > 0.0 && x * x + y * y <= f * f;
    }
    case Kind::polytope:
        return true;
    case Kind::torus: {
        const double rho = std::sqrt(q.x * q.x + q.z * q.z) - semi.z;
        return rho * rho + q.y * q.y <= semi.x * semi.x;
    }
    }
    return false;
}

std::pair<double, double> PhantomSolid::interval_ahead(Point3 p, Vector3 u) const {
    // The planes bound t to one interval.
    double lo = 0.0;
    double hi = kInf;
    for (const auto& c : cuts) {
        const double dn = dot(c.normal, u);
        const double room = c.offset - dot(c.normal, p - Point3{});
        if (std::abs(dn) < 1e-15) {
            if (room < 0.0) {
                return {0.0, 0.0};
            }
            continue;
        }
        const double t = room / dn;
        if (dn > 0.0) {
            hi = std::min(hi, t);
        } else {
            lo = std::max(lo, t);
        }
    }
    if (lo >= hi || kind == Kind::polytope) {
        return {lo, hi};
    }
    if (kind == Kind::torus) {
        throw std::logic_error("phantom: a torus has no single chord");
    }
    const Vector3 q = local(*this, p - center);
    const Vector3 v = local(*this, u);
    const double ia = 1.0 / (semi.x * semi.x);
    const double ib = 1.0 / (semi.y * semi.y);
    double A = v.x * v.x * ia + v.y * v.y * ib;
    double B = 2.0 * (q.x * v.x * ia + q.y * v.y * ib);
    double C = q.x * q.x * ia + q.y * q.y * ib - 1.0;
    if (kind == Kind::ellipsoid) {
        const double ic = 1.0 / (semi.z * semi.z);
        A += v.z * v.z * ic;
        B += 2.0 * q.z * v.z * ic;
        C += q.z * q.z * ic;
    } else if (kind == Kind::elliptic_cone) {
        // ... <= (1 + k qz)^2; the cut made by the constructor keeps 1 + k qz > 0.
        const double f = 1.0 + k * q.z;
        A -= k * k * v.z * v.z;
        B -= 2.0 * k * f * v.z;
        C += 1.0 - f * f;
    }
    Interval iv[2];
    const int n = quadric_intervals(A, B, C, iv);
    double a_min = kInf;
    double b_max = -kInf;
    for (int i = 0; i < n; ++i) {
        const double a = std::max(lo, iv[i].lo);
        const double b = std::min(hi, iv[i].hi);
        if (b > a) { // within one nappe at most one piece is left
            a_min = std::min(a_min, a);
            b_max = std::max(b_max, b);
        }
    }
    if (b_max <= a_min) {
        return {0.0, 0.0};
    }
    return {a_min, b_max};
}

namespace {

// Whether the ray p + t u, t >= 0, meets the box [lo, hi] (the slab test; a ray along a face
// counts as meeting it).
bool meets_box(Point3 p, Vector3 u, Point3 lo, Point3 hi) {
    double t0 = 0.0;
    double t1 = kInf;
    const double pc[3] = {p.x, p.y, p.z};
    const double uc[3] = {u.x, u.y, u.z};
    const double lc[3] = {lo.x, lo.y, lo.z};
    const double hc[3] = {hi.x, hi.y, hi.z};
    for (int a = 0; a < 3; ++a) {
        if (uc[a] == 0.0) {
            if (pc[a] < lc[a] || pc[a] > hc[a]) {
                return false;
            }
            continue;
        }
        const double inv = 1.0 / uc[a];
        double ta = (lc[a] - pc[a]) * inv;
        double tb = (hc[a] - pc[a]) * inv;
        if (ta > tb) {
            std::swap(ta, tb);
        }
        t0 = std::max(t0, ta);
        t1 = std::min(t1, tb);
        if (t0 > t1) {
            return false;
        }
    }
    return true;
}

} // namespace

double PhantomPiece::chord_ahead(Point3 p, Vector3 u) const {
    // Most rays miss most pieces: first the base's bounding box (a solid without a box,
    // lo = hi, is always traced). The box holds the solid, so a ray that misses it misses the
    // solid: the result is the same without the test.
    const Vector3 diagonal = base.bound_hi - base.bound_lo;
    if (dot(diagonal, diagonal) > 0.0 && !meets_box(p, u, base.bound_lo, base.bound_hi)) {
        return 0.0;
    }
    const auto [lo, hi] = base.interval_ahead(p, u);
    if (hi <= lo) {
        return 0.0;
    }
    double length = hi - lo;
    for (const auto& m : minus) {
        const auto [mlo, mhi] = m.interval_ahead(p, u);
        const double a = std::max(lo, mlo);
        const double b = std::min(hi, mhi);
        if (b > a) {
            length -= b - a;
        }
    }
    return std::max(length, 0.0);
}

std::pair<Point3, Point3> PhantomRegion::bounds() const {
    Point3 lo = parts.front().bound_lo;
    Point3 hi = parts.front().bound_hi;
    for (const auto& p : parts) {
        lo = {std::min(lo.x, p.bound_lo.x), std::min(lo.y, p.bound_lo.y),
              std::min(lo.z, p.bound_lo.z)};
        hi = {std::max(hi.x, p.bound_hi.x), std::max(hi.y, p.bound_hi.y),
              std::max(hi.z, p.bound_hi.z)};
    }
    return {lo, hi};
}

bool PhantomRegion::contains(Point3 p) const {
    bool in = false;
    for (const auto& s : parts) {
        if (s.contains(p)) {
            in = true;
            break;
        }
    }
    if (!in) {
        return false;
    }
    for (const auto& s : minus) {
        if (s.contains(p)) {
            return false;
        }
    }
    return true;
}

} // namespace crewdose::habitats
