// smooth_tiles.cpp: tiles the smoothing pass shades (see smooth_tiles.hpp).
#include "smooth_tiles.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "attiscope/render/frames.hpp"

namespace attiscope::render::detail {

namespace {

constexpr double kPi = 3.14159265358979323846;
/// Chords a ring's circle is followed by (the tube radius is widened by their sagitta).
constexpr int kRingChords = 64;

class TileMask {
 public:
  TileMask(const Camera& camera, const WorldFrame& world, int w, int h)
      : camera_(camera),
        world_(world),
        w_(w),
        h_(h),
        cols_((w + kSmoothTilePx - 1) / kSmoothTilePx),
        rows_((h + kSmoothTilePx - 1) / kSmoothTilePx),
        tiles_(static_cast<std::size_t>(cols_) * rows_, 0),
        focal_px_(h / (2.0 * std::tan(camera.fov_y_rad / 2.0))),
        eye_(camera_pose(camera, world).eye) {}

  bool everything() const { return everything_; }

  /// Marks the tiles of a tile rectangle.
  void box(const PixelBox& b) { mark(b.x + 0.5, b.y + 0.5, b.x + b.width - 0.5, b.y + b.height - 0.5); }

  void blob(const Footprint& f, const Eigen::AlignedBox3d& box) {
    double x0 = 1e30, y0 = 1e30, x1 = -1e30, y1 = -1e30;
    for (int c = 0; c < 8; ++c) {
      Eigen::Vector2d p;
      if (!project(f.offset + f.linear * box.corner(static_cast<Eigen::AlignedBox3d::CornerType>(c)), &p))
        return;
      x0 = std::min(x0, p.x());
      y0 = std::min(y0, p.y());
      x1 = std::max(x1, p.x());
      y1 = std::max(y1, p.y());
    }
    mark(x0 - kFootprintPadPx, y0 - kFootprintPadPx, x1 + kFootprintPadPx, y1 + kFootprintPadPx);
  }

  /// A capsule from a to b of the given radius (world units).
  void stick(const Eigen::Vector3d& a, const Eigen::Vector3d& b, double radius) {
    Eigen::Vector2d pa, pb;
    if (!project(a, &pa) || !project(b, &pb)) return;
    const double r = std::max(screen_radius(a, radius), screen_radius(b, radius));
    const double length = (pb - pa).norm();
    // Squares along the segment, half a tile apart, each widened by half the step so
    // their union covers the capsule.
    const int n = std::max(1, static_cast<int>(std::ceil(length / (0.5 * kSmoothTilePx))));
    const double reach = r + 0.5 * length / n;
    for (int i = 0; i <= n; ++i) {
      const Eigen::Vector2d c = pa + (pb - pa) * (static_cast<double>(i) / n);
      mark(c.x() - reach, c.y() - reach, c.x() + reach, c.y() + reach);
    }
  }

  std::vector<PixelBox> boxes() const {
    if (everything_) return {PixelBox{0, 0, w_, h_}};
    struct Run {
      int c0, c1, r0, r1;  // tiles [c0, c1) x [r0, r1)
    };
    std::vector<Run> done, open;
    for (int r = 0; r < rows_; ++r) {
      std::vector<Run> next;
      for (int c = 0; c < cols_;) {
        if (!tiles_[static_cast<std::size_t>(r) * cols_ + c]) {
          ++c;
          continue;
        }
        const int c0 = c;
        while (c < cols_ && tiles_[static_cast<std::size_t>(r) * cols_ + c]) ++c;
        auto same =
            std::find_if(open.begin(), open.end(), [&](const Run& o) { return o.c0 == c0 && o.c1 == c; });
        if (same != open.end()) {
          next.push_back({c0, c, same->r0, r + 1});
          open.erase(same);
        } else {
          next.push_back({c0, c, r, r + 1});
        }
      }
      done.insert(done.end(), open.begin(), open.end());
      open = std::move(next);
    }
    done.insert(done.end(), open.begin(), open.end());
    std::vector<PixelBox> out;
    for (const Run& run : done) {
      const int x0 = run.c0 * kSmoothTilePx, y0 = run.r0 * kSmoothTilePx;
      const int x1 = std::min(run.c1 * kSmoothTilePx, w_), y1 = std::min(run.r1 * kSmoothTilePx, h_);
      out.push_back({x0, y0, x1 - x0, y1 - y0});
    }
    return out;
  }

 private:
  bool project(const Eigen::Vector3d& p, Eigen::Vector2d* pixel) {
    const Projected q = project_to_pixel(camera_, world_, w_, h_, p);
    if (!q.in_front) {
      everything_ = true;
      return false;
    }
    *pixel = q.pixel;
    return true;
  }

  /// Pixels a sphere of `radius` around p may reach from p's own pixel, padded.
  double screen_radius(const Eigen::Vector3d& p, double radius) const {
    return kFootprintPadPx + radius * focal_px_ / std::max((p - eye_).norm() - radius, 1e-3);
  }

  void mark(double x0, double y0, double x1, double y1) {
    if (x1 < 0.0 || y1 < 0.0 || x0 >= w_ || y0 >= h_) return;
    const int c0 = std::max(0, static_cast<int>(std::floor(x0 / kSmoothTilePx)));
    const int r0 = std::max(0, static_cast<int>(std::floor(y0 / kSmoothTilePx)));
    const int c1 = std::min(cols_ - 1, static_cast<int>(std::floor(x1 / kSmoothTilePx)));
    const int r1 = std::min(rows_ - 1, static_cast<int>(std::floor(y1 / kSmoothTilePx)));
    for (int r = r0; r <= r1; ++r)
      for (int c = c0; c <= c1; ++c) tiles_[static_cast<std::size_t>(r) * cols_ + c] = 1;
  }

  const Camera& camera_;
  const WorldFrame& world_;
  int w_, h_, cols_, rows_;
  std::vector<std::uint8_t> tiles_;
  double focal_px_;
  Eigen::Vector3d eye_;
  bool everything_ = false;
};

}  // namespace

std::vector<PixelBox> merge_tiles(const std::vector<PixelBox>& boxes, int w, int h) {
  if (boxes.empty() || w <= 0 || h <= 0) return {};
  const Camera camera;  // no projection here: only the grid of tiles is used
  const WorldFrame world = WorldFrame::enu();
  TileMask mask(camera, world, w, h);
  for (const PixelBox& b : boxes) mask.box(b);
  return mask.boxes();
}

std::optional<PixelBox> bounds_of(const std::vector<PixelBox>& boxes) {
  if (boxes.empty()) return std::nullopt;
  int x0 = boxes[0].x, y0 = boxes[0].y, x1 = x0 + boxes[0].width, y1 = y0 + boxes[0].height;
  for (const PixelBox& b : boxes) {
    x0 = std::min(x0, b.x);
    y0 = std::min(y0, b.y);
    x1 = std::max(x1, b.x + b.width);
    y1 = std::max(y1, b.y + b.height);
  }
  return PixelBox{x0, y0, x1 - x0, y1 - y0};
}

std::vector<PixelBox> footprint_tiles(const Camera& camera, const WorldFrame& world, int w, int h,
                                      const std::vector<Footprint>& footprints) {
  if (footprints.empty() || w <= 0 || h <= 0) return {};
  TileMask mask(camera, world, w, h);
  for (const Footprint& f : footprints) {
    if (f.box.isEmpty()) continue;
    const Eigen::Vector3d lo = f.box.min(), hi = f.box.max();
    // Widest reach across, in world units, of a local extent along the given columns.
    const double sx = f.linear.col(0).norm(), sy = f.linear.col(1).norm(), sz = f.linear.col(2).norm();
    switch (f.shape) {
      case Footprint::Shape::Blob:
        if (f.parts && !f.parts->empty()) {
          for (const Eigen::AlignedBox3d& part : *f.parts) mask.blob(f, part);
        } else {
          mask.blob(f, f.box);
        }
        break;
      case Footprint::Shape::Stick: {
        const Eigen::Vector3d mid = f.box.center();
        const double hx = 0.5 * (hi.x() - lo.x()) * sx, hy = 0.5 * (hi.y() - lo.y()) * sy;
        mask.stick(f.offset + f.linear * Eigen::Vector3d(mid.x(), mid.y(), lo.z()),
                   f.offset + f.linear * Eigen::Vector3d(mid.x(), mid.y(), hi.z()), std::hypot(hx, hy));
        break;
      }
      case Footprint::Shape::Ring: {
        // The tube around the circle, and the pivots where the ring meets its own axis
        // (local x): studs as thick as the mesh is across its plane, out to its x bounds.
        const double R = f.ring_radius, scale = std::max({sx, sy, sz});
        const double tube = (f.tube_radius + R * (1.0 - std::cos(kPi / kRingChords))) * scale;
        Eigen::Vector3d prev = f.offset + f.linear * Eigen::Vector3d(R, 0, 0);
        for (int k = 1; k <= kRingChords; ++k) {
          const double t = 2.0 * kPi * k / kRingChords;
          const Eigen::Vector3d p =
              f.offset + f.linear * Eigen::Vector3d(R * std::cos(t), R * std::sin(t), 0);
          mask.stick(prev, p, tube);
          prev = p;
        }
        const double stud = std::max(hi.z(), -lo.z()) * scale;
        mask.stick(f.offset + f.linear * Eigen::Vector3d(hi.x(), 0, 0),
                   f.offset + f.linear * Eigen::Vector3d(2.0 * R - hi.x(), 0, 0), stud);
        mask.stick(f.offset + f.linear * Eigen::Vector3d(lo.x(), 0, 0),
                   f.offset + f.linear * Eigen::Vector3d(-2.0 * R - lo.x(), 0, 0), stud);
        break;
      }
    }
    if (mask.everything()) break;
  }
  return mask.boxes();
}

}  // namespace attiscope::render::detail
