#include "phantom.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

namespace crewdose::habitats {
namespace {

constexpr double kPi = 3.14159265358979323846;

} // namespace

const PhantomOrgan& Phantom::organ(const std::string& id) const {
    for (const auto& o : organs_) {
        if (o.id == id) {
            return o;
        }
    }
    throw std::out_of_range(std::string("phantom: no organ ").append(id));
}

bool Phantom::in_body(Point3 p) const {
    for (const auto& piece : body_) {
        if (piece.base.contains(p)) {
            bool out = false;
            for (const auto& m : piece.minus) {
                out = out || m.contains(p);
            }
            if (!out) {
                return true;
            }
        }
    }
    return false;
}

double Phantom::tissue_g_cm2(Point3 p, Vector3 u) const {
    double length = 0.0;
    for (const auto& piece : body_) {
        length += piece.chord_ahead(p, u);
    }
    double g = soft_tissue_density() * length;
    for (const auto& insert : inserts_) {
        if (insert.envelope) {
            const auto [lo, hi] = insert.envelope->interval_ahead(p, u);
            if (hi <= lo) {
                continue;
            }
        }
        double l = 0.0;
        for (const auto& piece : insert.pieces) {
            l += piece.chord_ahead(p, u);
        }
        g += (insert.density_g_cm3 - soft_tissue_density()) * l;
    }
    return g;
}

Vector3 to_phantom_frame(Vector3 w, Posture posture, double heading_deg) {
    const double h = heading_deg * kPi / 180.0;
    const Vector3 facing{std::sin(h), std::cos(h), 0.0};
    const Vector3 up{0.0, 0.0, 1.0};
    Vector3 x_axis;
    Vector3 y_axis;
    Vector3 z_axis;
    if (posture == Posture::standing) {
        z_axis = up;
        y_axis = -facing; // the back
    } else {
        z_axis = facing; // towards the head
        y_axis = -up;    // the back, on the ground
    }
    x_axis = cross(y_axis, z_axis); // the phantom's left
    return {dot(w, x_axis), dot(w, y_axis), dot(w, z_axis)};
}

} // namespace crewdose::habitats
