// models.cpp: attiscope's own body models, built in code. Every model is built in model
// coordinates with front +x, left +y, top +z (so right is -y), and fits a sphere of radius
// about 1.1 around the origin. frames.hpp's body_R_model places it in the body frame.
#include <Eigen/Geometry>
#include <algorithm>
#include <cctype>
#include <cmath>

#include "attiscope/render/mesh.hpp"
#include "mesh_builder.hpp"

namespace attiscope::render {

using detail::Color;
using detail::MeshBuilder;
using detail::rgb;
using Eigen::Vector3d;

namespace {

const Vector3d kFront = Vector3d::UnitX();
const Vector3d kTop = Vector3d::UnitZ();
const Vector3d kRight = -Vector3d::UnitY();

const std::array<ModelInfo, 6> kModels{{
    {ModelKind::Box, "box",
     "a box whose six faces differ in colour and in their dots (front 1, back 6, "
     "top 2, bottom 5, right 3, left 4)",
     kFront, kTop, kRight},
    {ModelKind::Quadcopter, "quadcopter",
     "an X-frame quadcopter: orange front arms and guards, GPS mast on top", kFront, kTop, kRight},
    {ModelKind::Aircraft, "aircraft",
     "a fixed-wing aircraft: nose front, fin on top, red left and green right tip", kFront, kTop, kRight},
    {ModelKind::Rover, "rover", "a four-wheeled rover: camera mast at the front, antenna at the back", kFront,
     kTop, kRight},
    {ModelKind::Camera, "camera",
     "a camera: lens and dashed optical axis to the front, viewfinder on top, grip right", kFront, kTop,
     kRight},
    {ModelKind::ImuBoard, "imu",
     "an IMU board with printed X and Y arrows and a Z-out mark; connector at the back", kFront, kTop,
     kRight},
}};

// Palette of the models (linear RGB).
const Color kGraphite = rgb(0.36f, 0.38f, 0.43f);
const Color kCharcoal = rgb(0.17f, 0.17f, 0.19f);
const Color kShell = rgb(0.90f, 0.90f, 0.88f);
const Color kLightGrey = rgb(0.74f, 0.76f, 0.79f);
const Color kOrange = rgb(0.96f, 0.50f, 0.12f);
const Color kPort = rgb(0.85f, 0.12f, 0.12f);
const Color kStarboard = rgb(0.10f, 0.65f, 0.25f);
const Color kGlass = rgb(0.18f, 0.32f, 0.55f);
const Color kMustard = rgb(0.90f, 0.70f, 0.20f);
const Color kPcb = rgb(0.10f, 0.42f, 0.27f);
const Color kSilk = rgb(0.97f, 0.97f, 0.95f);
const Color kGold = rgb(0.85f, 0.68f, 0.30f);
const Color kAxisCyan = rgb(0.10f, 0.75f, 0.85f);

constexpr int kRound = 16;  // sides of round parts
constexpr int kSmall = 10;  // sides of small round parts

void build_box(MeshBuilder& b) {
  const Vector3d half(0.78, 0.58, 0.42);
  // +x front, -x back, +y left, -y right, +z top, -z bottom.
  const std::array<Color, 6> faces{rgb(0.95f, 0.55f, 0.22f), rgb(0.36f, 0.41f, 0.50f),
                                   rgb(0.60f, 0.50f, 0.80f), rgb(0.28f, 0.66f, 0.64f),
                                   rgb(0.95f, 0.92f, 0.80f), rgb(0.24f, 0.24f, 0.28f)};
  b.box(Vector3d::Zero(), half, Eigen::Matrix3d::Identity(), faces);
  // Dots like a die, so a face reads right in any light: front 1, back 6, left 4, right 3,
  // top 2, bottom 5. Each face: normal, two in-face directions, half sizes, dot count.
  struct Face {
    Vector3d n, u, v;
    double hu, hv, depth;
    int dots;
    Color col;
  };
  const Color dark = rgb(0.10f, 0.10f, 0.12f), light = rgb(0.96f, 0.96f, 0.96f);
  const Face faces_dots[] = {
      {Vector3d::UnitX(), Vector3d::UnitY(), Vector3d::UnitZ(), half.y(), half.z(), half.x(), 1, dark},
      {-Vector3d::UnitX(), Vector3d::UnitY(), Vector3d::UnitZ(), half.y(), half.z(), half.x(), 6, light},
      {Vector3d::UnitY(), Vector3d::UnitX(), Vector3d::UnitZ(), half.x(), half.z(), half.y(), 4, light},
      {-Vector3d::UnitY(), Vector3d::UnitX(), Vector3d::UnitZ(), half.x(), half.z(), half.y(), 3, dark},
      {Vector3d::UnitZ(), Vector3d::UnitX(), Vector3d::UnitY(), half.x(), half.y(), half.z(), 2, dark},
      {-Vector3d::UnitZ(), Vector3d::UnitX(), Vector3d::UnitY(), half.x(), half.y(), half.z(), 5, light},
  };
  for (const Face& f : faces_dots) {
    const double s = 0.45 * std::min(f.hu, f.hv);
    std::vector<std::pair<double, double>> at;
    switch (f.dots) {
      case 1: at = {{0, 0}}; break;
      case 2: at = {{-1, -1}, {1, 1}}; break;
      case 3: at = {{-1, -1}, {0, 0}, {1, 1}}; break;
      case 4: at = {{-1, -1}, {1, -1}, {-1, 1}, {1, 1}}; break;
      case 5: at = {{-1, -1}, {1, -1}, {0, 0}, {-1, 1}, {1, 1}}; break;
      default: at = {{-1, -1}, {-1, 0}, {-1, 1}, {1, -1}, {1, 0}, {1, 1}}; break;
    }
    const double r = f.dots == 1 ? 0.16 : 0.085;
    for (const auto& [du, dv] : at) {
      const Vector3d c = f.n * (f.depth + 0.004) + f.u * (du * s) + f.v * (dv * s);
      b.disc(c, f.n, r, kRound, f.col);
    }
  }
}

void build_quadcopter(MeshBuilder& b) {
  b.box(Vector3d(0, 0, 0), Vector3d(0.34, 0.22, 0.09), kGraphite);
  b.box(Vector3d(0.02, 0, 0.12), Vector3d(0.24, 0.16, 0.04), kShell);
  // A camera nub at the front, a GPS mast on top.
  b.cylinder(Vector3d(0.34, 0, -0.02), Vector3d(0.44, 0, -0.02), 0.06, kSmall, kCharcoal);
  b.disc(Vector3d(0.441, 0, -0.02), Vector3d::UnitX(), 0.04, kSmall, kGlass);
  b.cylinder(Vector3d(-0.12, 0, 0.16), Vector3d(-0.12, 0, 0.40), 0.018, 6, kLightGrey);
  b.cylinder(Vector3d(-0.12, 0, 0.40), Vector3d(-0.12, 0, 0.44), 0.09, kRound, kShell);
  const double arm = 0.74;
  for (int i = 0; i < 4; ++i) {
    const double sx = (i < 2) ? 1.0 : -1.0, sy = (i % 2 == 0) ? 1.0 : -1.0;
    const bool front = sx > 0;
    const Vector3d tip(sx * arm * 0.7071, sy * arm * 0.7071, 0.0);
    const Color arm_col = front ? kOrange : kGraphite;
    b.cylinder(Vector3d(sx * 0.15, sy * 0.1, 0), tip, 0.04, 8, arm_col, false);
    b.cylinder(tip - Vector3d(0, 0, 0.07), tip + Vector3d(0, 0, 0.09), 0.085, kRound, kCharcoal);
    b.cylinder(tip + Vector3d(0, 0, 0.09), tip + Vector3d(0, 0, 0.11), 0.03, 8, kLightGrey);
    b.torus(tip + Vector3d(0, 0, 0.1), Vector3d::UnitZ(), 0.36, 0.022, 36, 6, front ? kOrange : kLightGrey);
    // Two prop blades (a fixed picture of a spinning prop: crossed at 30 degrees to the arm).
    const Vector3d blade_dir =
        Eigen::AngleAxisd(sy * 0.5, Vector3d::UnitZ()) * Vector3d(sx, sy, 0).normalized();
    b.box(tip + Vector3d(0, 0, 0.115), Vector3d(0.30, 0.028, 0.006),
          Eigen::AngleAxisd(std::atan2(blade_dir.y(), blade_dir.x()), Vector3d::UnitZ()).toRotationMatrix(),
          {kLightGrey, kLightGrey, kLightGrey, kLightGrey, kLightGrey, kLightGrey});
  }
  // Landing legs under the body.
  for (double sy : {1.0, -1.0}) {
    b.cylinder(Vector3d(0.12, sy * 0.16, -0.08), Vector3d(0.12, sy * 0.24, -0.28), 0.02, 6, kCharcoal, false);
    b.cylinder(Vector3d(-0.12, sy * 0.16, -0.08), Vector3d(-0.12, sy * 0.24, -0.28), 0.02, 6, kCharcoal,
               false);
    b.cylinder(Vector3d(0.22, sy * 0.24, -0.28), Vector3d(-0.22, sy * 0.24, -0.28), 0.025, 6, kCharcoal);
  }
}

void build_aircraft(MeshBuilder& b) {
  // Fuselage along x, nose cone at the front, tail cone at the back.
  b.cylinder(Vector3d(-0.72, 0, 0), Vector3d(0.62, 0, 0), 0.12, kRound, kShell, false);
  b.cone(Vector3d(0.62, 0, 0), Vector3d(1.02, 0, -0.02), 0.12, kRound, kShell);
  b.cone(Vector3d(-0.72, 0, 0), Vector3d(-1.08, 0, 0.05), 0.12, kRound, kShell);
  b.box(Vector3d(0.46, 0, 0.11), Vector3d(0.17, 0.075, 0.05), kGlass);
  // Wing: a swept-back trapezoid as a thin slab per side, with navigation tips (red on the
  // left, green on the right: common practice).
  auto wing = [&](double span_sign, const Color& tip_col) {
    const double y0 = 0.0, y1 = span_sign * 1.02;
    const double z0 = 0.01, z1 = 0.045;
    const Vector3d r_le(0.26, y0, 0), r_te(-0.12, y0, 0), t_le(0.10, y1, 0.06), t_te(-0.10, y1, 0.06);
    const Vector3d up(0, 0, z1 - z0);
    const Vector3d lo(0, 0, z0);
    const Color c = kLightGrey;
    const Vector3d a = r_le + lo, bb = t_le + lo, cc = t_te + lo, d = r_te + lo;
    b.flat_quad(a + up, bb + up, cc + up, d + up, c);
    b.flat_quad(d, cc, bb, a, c);
    b.flat_quad(a, bb, bb + up, a + up, c);
    b.flat_quad(cc, d, d + up, cc + up, c);
    b.box(Vector3d(0.0, y1, 0.06 + z0 + 0.012), Vector3d(0.1, 0.035, 0.03), tip_col);
  };
  wing(1.0, kPort);
  wing(-1.0, kStarboard);
  // Tailplane and fin (the fin stands on top).
  b.box(Vector3d(-0.86, 0, 0.04), Vector3d(0.10, 0.40, 0.015), kLightGrey);
  b.flat_quad(Vector3d(-0.70, -0.012, 0.08), Vector3d(-0.98, -0.012, 0.08), Vector3d(-1.04, -0.012, 0.48),
              Vector3d(-0.88, -0.012, 0.48), kOrange);
  b.flat_quad(Vector3d(-0.88, 0.012, 0.48), Vector3d(-1.04, 0.012, 0.48), Vector3d(-0.98, 0.012, 0.08),
              Vector3d(-0.70, 0.012, 0.08), kOrange);
  b.flat_quad(Vector3d(-0.88, -0.012, 0.48), Vector3d(-1.04, -0.012, 0.48), Vector3d(-1.04, 0.012, 0.48),
              Vector3d(-0.88, 0.012, 0.48), kOrange);
  // Propeller at the nose.
  b.box(Vector3d(1.03, 0, -0.02), Vector3d(0.01, 0.26, 0.025), kCharcoal);
}

void build_rover(MeshBuilder& b) {
  b.box(Vector3d(0, 0, 0.02), Vector3d(0.62, 0.36, 0.13), kMustard);
  b.box(Vector3d(-0.06, 0, 0.17), Vector3d(0.40, 0.28, 0.03), kGraphite);
  b.box(Vector3d(0.64, 0, -0.02), Vector3d(0.03, 0.34, 0.06), kOrange);  // front bumper
  for (double sx : {0.42, -0.42}) {
    for (double sy : {1.0, -1.0}) {
      const Vector3d hub(sx, sy * 0.45, -0.14);
      b.cylinder(hub - Vector3d(0, 0.08, 0), hub + Vector3d(0, 0.08, 0), 0.22, 18, kCharcoal);
      b.disc(hub + Vector3d(0, sy * 0.081, 0), Vector3d(0, sy, 0), 0.11, 12, kLightGrey);
    }
  }
  // Camera mast at the front with a head looking forward; a whip antenna at the back.
  b.cylinder(Vector3d(0.44, 0, 0.15), Vector3d(0.44, 0, 0.58), 0.03, 8, kLightGrey);
  b.box(Vector3d(0.46, 0, 0.64), Vector3d(0.07, 0.14, 0.06), kShell);
  b.cylinder(Vector3d(0.53, 0.06, 0.64), Vector3d(0.58, 0.06, 0.64), 0.03, kSmall, kCharcoal);
  b.cylinder(Vector3d(0.53, -0.06, 0.64), Vector3d(0.58, -0.06, 0.64), 0.03, kSmall, kCharcoal);
  b.cylinder(Vector3d(-0.5, 0.22, 0.15), Vector3d(-0.5, 0.22, 0.75), 0.012, 6, kCharcoal);
  b.cylinder(Vector3d(-0.5, 0.22, 0.75), Vector3d(-0.5, 0.22, 0.79), 0.03, 8, kOrange);
}

void build_camera(MeshBuilder& b) {
  // Body centred a little behind the origin so the lens front sits ahead of it.
  b.box(Vector3d(-0.22, 0, 0), Vector3d(0.26, 0.42, 0.28), kGraphite);
  b.box(Vector3d(-0.22, -0.47, -0.04), Vector3d(0.18, 0.06, 0.22), kCharcoal);    // grip on the right
  b.box(Vector3d(-0.24, 0.0, 0.33), Vector3d(0.14, 0.12, 0.06), kGraphite);       // viewfinder hump on top
  b.disc(Vector3d(-0.05, -0.28, 0.281), Vector3d::UnitZ(), 0.05, kSmall, kPort);  // shutter button, top right
  b.cylinder(Vector3d(0.04, 0, 0), Vector3d(0.30, 0, 0), 0.24, 24, kCharcoal);
  b.cylinder(Vector3d(0.30, 0, 0), Vector3d(0.40, 0, 0), 0.21, 24, kLightGrey, false);
  b.annulus(Vector3d(0.40, 0, 0), Vector3d::UnitX(), 0.15, 0.21, 24, kCharcoal);
  b.disc(Vector3d(0.39, 0, 0), Vector3d::UnitX(), 0.15, 24, kGlass);
  // The optical axis: a dashed line ahead of the lens.
  for (int i = 0; i < 5; ++i) {
    const double x0 = 0.46 + 0.14 * i;
    b.cylinder(Vector3d(x0, 0, 0), Vector3d(x0 + 0.08, 0, 0), 0.018, 6, kAxisCyan, false);
  }
  b.cone(Vector3d(1.16, 0, 0), Vector3d(1.26, 0, 0), 0.045, kSmall, kAxisCyan);
}

void build_imu(MeshBuilder& b) {
  const double t = 0.045;  // half thickness of the board
  b.box(Vector3d::Zero(), Vector3d(0.82, 0.58, t), kPcb);
  b.box(Vector3d(-0.02, 0.02, t + 0.04), Vector3d(0.2, 0.2, 0.04), kCharcoal);  // the sensor chip
  b.disc(Vector3d(0.12, 0.14, t + 0.081), Vector3d::UnitZ(), 0.025, 8, kSilk);  // pin-1 dot
  b.box(Vector3d(-0.74, 0, t + 0.07), Vector3d(0.07, 0.26, 0.07), kShell);      // connector at the back
  for (double sx : {0.7, -0.7}) {
    for (double sy : {0.46, -0.46})
      b.annulus(Vector3d(sx, sy, t + 0.002), Vector3d::UnitZ(), 0.035, 0.06, 12, kGold);
  }
  // Printed axis marks on the top face: X arrow to the front, Y arrow to the left, and the
  // circled dot of a Z axis out of the board.
  const Vector3d n = Vector3d::UnitZ();
  const double z = t + 0.003;
  const Vector3d o(-0.42, -0.36, z);
  b.strip(o, o + Vector3d(0.5, 0, 0), 0.035, n, kSilk);
  b.flat_triangle(o + Vector3d(0.64, 0, 0), o + Vector3d(0.49, 0.065, 0), o + Vector3d(0.49, -0.065, 0),
                  kSilk);
  b.strip(o, o + Vector3d(0, 0.5, 0), 0.035, n, kSilk);
  b.flat_triangle(o + Vector3d(0, 0.64, 0), o + Vector3d(-0.065, 0.49, 0), o + Vector3d(0.065, 0.49, 0),
                  kSilk);
  b.annulus(o, n, 0.045, 0.07, 16, kSilk);
  b.disc(o + Vector3d(0, 0, 0.001), n, 0.022, 10, kSilk);
  // Letters drawn as strokes: "X" beside the X arrow, "Y" beside the Y arrow.
  const double h = 0.07, w = 0.05, sw = 0.022;
  const Vector3d xc = o + Vector3d(0.56, -0.14, 0);
  b.strip(xc + Vector3d(-w, -h, 0), xc + Vector3d(w, h, 0), sw, n, kSilk);
  b.strip(xc + Vector3d(-w, h, 0), xc + Vector3d(w, -h, 0), sw, n, kSilk);
  // Letters read upright for someone looking down on the board with its front away from
  // them (front up the page, the board's right to the right): up is +x, right is -y.
  const Vector3d yc = o + Vector3d(0.0, 0.76, 0);
  b.strip(yc + Vector3d(-h, 0, 0), yc, sw, n, kSilk);
  b.strip(yc, yc + Vector3d(h, w, 0), sw, n, kSilk);
  b.strip(yc, yc + Vector3d(h, -w, 0), sw, n, kSilk);
}

}  // namespace

const std::array<ModelInfo, 6>& model_infos() {
  return kModels;
}

const ModelInfo& model_info(ModelKind kind) {
  for (const ModelInfo& m : kModels) {
    if (m.kind == kind) return m;
  }
  return kModels[0];
}

std::optional<ModelKind> parse_model_kind(std::string_view name) {
  std::string n(name);
  std::transform(n.begin(), n.end(), n.begin(), [](unsigned char c) { return std::tolower(c); });
  for (const ModelInfo& m : kModels) {
    if (n == m.name) return m.kind;
  }
  if (n == "imu-board" || n == "board") return ModelKind::ImuBoard;
  return std::nullopt;
}

std::string model_list() {
  std::string out;
  for (const ModelInfo& m : kModels) {
    if (!out.empty()) out += ", ";
    out += m.name;
  }
  return out;
}

Mesh build_model(ModelKind kind) {
  Mesh mesh;
  MeshBuilder b(&mesh);
  switch (kind) {
    case ModelKind::Box: build_box(b); break;
    case ModelKind::Quadcopter: build_quadcopter(b); break;
    case ModelKind::Aircraft: build_aircraft(b); break;
    case ModelKind::Rover: build_rover(b); break;
    case ModelKind::Camera: build_camera(b); break;
    case ModelKind::ImuBoard: build_imu(b); break;
  }
  return mesh;
}

}  // namespace attiscope::render
