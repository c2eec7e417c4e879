#include "phantom_sampling.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace crewdose::habitats {
namespace {

constexpr double kPi = 3.14159265358979323846;

// The parts of [lo, hi] outside each of `holes` (appended to `out`).
void subtract(double lo, double hi, const std::vector<std::pair<double, double>>& holes,
              std::vector<std::pair<double, double>>& out) {
    std::vector<std::pair<double, double>> pieces{{lo, hi}};
    for (const auto& [a, b] : holes) {
        if (!(b > a)) {
            continue;
        }
        std::vector<std::pair<double, double>> next;
        for (const auto& [p, q] : pieces) {
            if (b <= p || a >= q) {
                next.emplace_back(p, q);
                continue;
            }
            if (a > p) {
                next.emplace_back(p, a);
            }
            if (b < q) {
                next.emplace_back(b, q);
            }
        }
        pieces.swap(next);
    }
    out.insert(out.end(), pieces.begin(), pieces.end());
}

} // namespace

double halton(std::size_t i, std::size_t base) {
    double f = 1.0;
    double r = 0.0;
    while (i > 0) {
        f /= static_cast<double>(base);
        r += f * static_cast<double>(i % base);
        i /= base;
    }
    return r;
}

std::vector<Point3> sample_region(const PhantomRegion& r, std::size_t n, const std::string& id) {
    const auto [lo, hi] = r.bounds();
    std::vector<Point3> out;
    constexpr std::size_t kMaxTries = 4'000'000;
    for (std::size_t i = 1; out.size() < n; ++i) {
        if (i > kMaxTries) {
            throw std::logic_error(std::string("phantom: cannot place points in ").append(id));
        }
        const Point3 p{lo.x + (hi.x - lo.x) * halton(i, 2), lo.y + (hi.y - lo.y) * halton(i, 3),
                       lo.z + (hi.z - lo.z) * halton(i, 5)};
        if (r.contains(p)) {
            out.push_back(p);
        }
    }
    return out;
}

std::vector<Point3> surface_points(std::span<const PhantomPiece> pieces, std::size_t n,
                                   double* lines_per_crossing, double* bounding_radius) {
    if (pieces.empty() || n == 0) {
        throw std::invalid_argument("surface_points: need pieces and at least one point");
    }
    Point3 lo = pieces.front().base.bound_lo;
    Point3 hi = pieces.front().base.bound_hi;
    for (const auto& p : pieces) {
        lo = {std::min(lo.x, p.base.bound_lo.x), std::min(lo.y, p.base.bound_lo.y),
              std::min(lo.z, p.base.bound_lo.z)};
        hi = {std::max(hi.x, p.base.bound_hi.x), std::max(hi.y, p.base.bound_hi.y),
              std::max(hi.z, p.base.bound_hi.z)};
    }
    const Point3 c = lo + 0.5 * (hi - lo);
    const double R = 0.5 * length(hi - lo);
    constexpr double kTouch = 1e-7; // cm: intervals closer than this are one
    constexpr double kInside = 1e-6;
    std::vector<Point3> out;
    std::size_t lines = 0;
    std::size_t crossings = 0;
    std::vector<std::pair<double, double>> spans;
    std::vector<std::pair<double, double>> holes;
    constexpr std::size_t kMaxLines = 10'000'000;
    for (std::size_t i = 1; out.size() < n; ++i) {
        if (i > kMaxLines) {
            throw std::logic_error("surface_points: the lines miss the pieces");
        }
        // An isotropic uniform random line: a direction, and a point uniform on the disk of
        // radius R through the centre at right angles to it.
        const double mu = 1.0 - 2.0 * halton(i, 2);
        const double phi = 2.0 * kPi * halton(i, 3);
        const double s = std::sqrt(std::max(0.0, 1.0 - mu * mu));
        const Vector3 v{s * std::cos(phi), s * std::sin(phi), mu};
        const Vector3 e1 = std::abs(v.z) < 0.9 ? normalized(cross(v, Vector3{0, 0, 1}))
                                               : normalized(cross(v, Vector3{1, 0, 0}));
        const Vector3 e2 = cross(v, e1);
        const double r = R * std::sqrt(halton(i, 5));
        const double psi = 2.0 * kPi * halton(i, 7);
        const Point3 start = c + r * std::cos(psi) * e1 + r * std::sin(psi) * e2 + (-(R + 1.0)) * v;
        ++lines;
        spans.clear();
        for (const auto& piece : pieces) {
            const auto [a, b] = piece.base.interval_ahead(start, v);
            if (!(b > a)) {
                continue;
            }
            holes.clear();
            for (const auto& m : piece.minus) {
                holes.push_back(m.interval_ahead(start, v));
            }
            subtract(a, b, holes, spans);
        }
        std::sort(spans.begin(), spans.end());
        std::size_t k = 0;
        while (k < spans.size()) {
            double a = spans[k].first;
            double b = spans[k].second;
            ++k;
            while (k < spans.size() && spans[k].first <= b + kTouch) {
                b = std::max(b, spans[k].second);
                ++k;
            }
            if (!(b - a > 2.0 * kInside)) {
                continue; // a graze
            }
            crossings += 2;
            for (const double t : {a + kInside, b - kInside}) {
                if (out.size() < n) {
                    out.push_back(start + t * v);
                }
            }
        }
    }
    if (lines_per_crossing) {
        *lines_per_crossing = static_cast<double>(lines) / static_cast<double>(crossings);
    }
    if (bounding_radius) {
        *bounding_radius = R;
    }
    return out;
}

} // namespace crewdose::habitats
