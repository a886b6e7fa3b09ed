// A closed triangle mesh (stl_mesh.h) as a signed distance: nearest facet through a bounding-volume
// hierarchy, sign from the angle-weighted pseudonormal (Baerentzen & Aanaes, IEEE Trans. Vis. Comput.
// Graph. 11, 243 (2005)). Exact near the surface, a lower bound with exact sign beyond (docs/scene.md,
// bodies). Trap: that switch is not 1-Lipschitz, so never march along rays in steps of |d| far out.
#pragma once

#include <array>
#include <vector>

#include "geometry/shape.h"
#include "geometry/stl_mesh.h"

namespace yeegap::geometry {

class MeshShape final : public Shape {
 public:
  /// `mesh` must be closed and consistently oriented outwards (as read_stl returns it).
  explicit MeshShape(const TriangleMesh& mesh);
  double signed_distance(const Vec3& p) const override;
  /// The exact signed distance everywhere (the full search; slow deep inside round bodies).
  double exact_signed_distance(const Vec3& p) const;
  /// Points farther than this from the surface may get a lower bound (m).
  double exact_band() const { return band_; }
  Aabb bounds() const override { return bounds_; }
  std::size_t facet_count() const { return tri_.size(); }
  /// Generalised winding number (A. Jacobson, L. Kavan, O. Sorkine-Hornung, ACM Trans. Graph. 32,
  /// 33 (2013)): the facets' solid angles seen from p over 4 pi, 1 inside and 0 outside a closed
  /// mesh. O(facets) per call: an independent inside test for checks, not for voxelising.
  double winding_number(const Vec3& p) const;

 private:
  struct Tri {
    Vec3 a, b, c;
    int id;                        // index into normals_
  };
  struct Normals {                 // kept apart from Tri: only the nearest facet's are read
    Vec3 face;                     // unit normal (zero for a facet of zero area)
    std::array<Vec3, 3> edge;      // pseudonormals of edges ab, bc, ca
    std::array<Vec3, 3> vertex;    // pseudonormals of corners a, b, c
  };
  struct Node {
    double lo[3], hi[3];           // box (plain arrays: this is the query's inner loop)
    int left = -1, right = -1;     // children, or -1 for a leaf
    int first = 0, count = 0;      // leaf: range in tri_
  };
  int build(int first, int count);
  std::vector<Tri> tri_;
  std::vector<Normals> normals_;
  // Coarse grid of exact values over bounds_: node (i, j, k) at coarse_lo_ + step (i, j, k).
  Vec3 coarse_lo_;
  double coarse_step_ = 0, band_ = 0;  // band_: one coarse-cell diagonal
  std::array<int, 3> coarse_n_{};      // cells per axis
  std::vector<double> coarse_d_;
  std::vector<Node> nodes_;
  Aabb bounds_;
};

/// read_stl + MeshShape: the shape of the solid in an STL file (see read_stl for `unit`, `where`).
ShapePtr load_mesh_shape(const std::string& path, double unit, const Where& where);

}  // namespace yeegap::geometry
