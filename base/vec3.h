// A point or direction in 3D space (metres for positions). Plain aggregate, shared by geometry/
// and solver/.
#pragma once

#include <cmath>

namespace yeegap {

struct Vec3 {
  double x = 0, y = 0, z = 0;

  double& operator[](int a) { return a == 0 ? x : (a == 1 ? y : z); }
  double operator[](int a) const { return a == 0 ? x : (a == 1 ? y : z); }
  friend Vec3 operator+(Vec3 a, Vec3 b) { return {a.x + b.x, a.y + b.y, a.z + b.z}; }
  friend Vec3 operator-(Vec3 a, Vec3 b) { return {a.x - b.x, a.y - b.y, a.z - b.z}; }
  friend Vec3 operator*(double s, Vec3 a) { return {s * a.x, s * a.y, s * a.z}; }
  friend Vec3 operator*(Vec3 a, double s) { return s * a; }
  friend bool operator==(Vec3 a, Vec3 b) { return a.x == b.x && a.y == b.y && a.z == b.z; }
};

inline double dot(Vec3 a, Vec3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; }
inline Vec3 cross(Vec3 a, Vec3 b) { return {a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x}; }
inline double norm(Vec3 a) { return std::sqrt(dot(a, a)); }

}  // namespace yeegap
