#pragma once
// Geometry value types. Points and vectors are distinct types so that point + point does not
// compile; lengths are in metres in scenario geometry, the unit is the caller's.
#include <cmath>

namespace crewdose::habitats {

/// A displacement or direction in 3-D.
struct Vector3 {
    double x = 0.0;
    double y = 0.0;
    double z = 0.0;

    friend constexpr Vector3 operator+(Vector3 a, Vector3 b) {
        return {a.x + b.x, a.y + b.y, a.z + b.z};
    }
    friend constexpr Vector3 operator-(Vector3 a, Vector3 b) {
        return {a.x - b.x, a.y - b.y, a.z - b.z};
    }
    friend constexpr Vector3 operator*(double s, Vector3 v) { return {s * v.x, s * v.y, s * v.z}; }
    friend constexpr Vector3 operator-(Vector3 v) { return {-v.x, -v.y, -v.z}; }
};

/// A position in 3-D.
struct Point3 {
    double x = 0.0;
    double y = 0.0;
    double z = 0.0;

    friend constexpr Point3 operator+(Point3 p, Vector3 v) {
        return {p.x + v.x, p.y + v.y, p.z + v.z};
    }
    friend constexpr Vector3 operator-(Point3 a, Point3 b) {
        return {a.x - b.x, a.y - b.y, a.z - b.z};
    }
};

[[nodiscard]] constexpr double dot(Vector3 a, Vector3 b) {
    return a.x * b.x + a.y * b.y + a.z * b.z;
}
[[nodiscard]] constexpr Vector3 cross(Vector3 a, Vector3 b) {
    return {a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x};
}
[[nodiscard]] inline double length(Vector3 v) {
    return std::sqrt(dot(v, v));
}
/// v / |v|; the caller guarantees |v| > 0.
[[nodiscard]] inline Vector3 normalized(Vector3 v) {
    return (1.0 / length(v)) * v;
}

/// A ray: origin and unit direction, with ray(t) = origin + t direction.
struct Ray {
    Point3 origin;
    Vector3 direction;
    [[nodiscard]] constexpr Point3 operator()(double t) const { return origin + t * direction; }
};

} // namespace crewdose::habitats
