// chain_overlay.cpp: the frame chain in the scene (see attiscope/render/chain_overlay.hpp).
#include "chain_overlay.hpp"

#include <algorithm>
#include <cmath>

#include <Eigen/Geometry>

namespace attiscope::render {

namespace {

constexpr double kPi = 3.14159265358979323846;
/// Thickness of a chain triad's arrows (times the body triad's), plain and selected.
constexpr double kChainThickness = 0.75;
constexpr double kChainSelectedThickness = 1.25;
/// Where the Scene's chain row is: this far behind the body (away from the iso view's eye)
/// and this high above its centre.
constexpr double kChainBehind = 2.5;
constexpr double kChainHeight = 1.25;
/// The row's spacing: wide enough that neighbouring names do not run together.
constexpr double kSceneChainSpacing = 1.1;
/// A larger triad (scale > 1) gets thicker arrows, up to this factor.
constexpr double kMaxThicknessScale = 2.2;
constexpr double kLinkRodRadius = 0.012;
constexpr double kRingRodRadius = 0.016;
constexpr int kRingSegments = 28;
/// How far below the origin (along world down) a frame's name is anchored.
constexpr double kNameDrop = 0.16;
/// The link rods' grey.
const Eigen::Vector3f kLinkGrey(0.45f, 0.47f, 0.52f);

double length_of(const ChainFrameMark& m) {
  return kChainTriadLength * m.scale * (m.selected ? kChainSelectedScale : 1.0);
}

}  // namespace

Eigen::Vector3d chain_axis_tip(const ChainFrameMark& mark, int axis) {
  return mark.origin + mark.display_R_frame.matrix().col(axis) * length_of(mark);
}

ChainLayoutOptions scene_chain_options(const WorldFrame& world) {
  // Behind the body as the default (iso) view sees it, a little above its centre, running
  // across that view's screen: the row reads as a strip above the body and never sits on it.
  Eigen::Vector3d e1, e2;
  ground_axes(world, &e1, &e2);
  const Eigen::Vector3d up = world.up.normalized();
  const double az = Camera::preset(ViewPreset::Iso).azimuth_rad;
  const Eigen::Vector3d toward_eye = std::cos(az) * e1 + std::sin(az) * e2;
  const Eigen::Vector3d screen_right = -std::sin(az) * e1 + std::cos(az) * e2;
  ChainLayoutOptions o;
  o.anchor = -kChainBehind * toward_eye + kChainHeight * up;
  o.along = screen_right;
  o.across = up;
  o.spacing = kSceneChainSpacing;
  return o;
}

Expected<std::vector<ChainFrameMark>> scene_chain_marks(const FrameChain& chain, const WorldFrame& world,
                                                        const std::string& selected,
                                                        const std::string& display_frame) {
  ChainLayoutOptions o = scene_chain_options(world);
  o.selected = selected;
  o.display_frame = display_frame;
  auto layout = layout_frame_chain(chain, o);
  if (!layout) return layout.error();
  // Centre the row on the anchor (the layout starts it there).
  std::vector<ChainFrameMark>& marks = layout.value().marks;
  double mean = 0.0;
  for (const ChainFrameMark& m : marks) mean += (m.origin - o.anchor).dot(o.along);
  const Eigen::Vector3d shift = -(mean / static_cast<double>(marks.size())) * o.along;
  for (ChainFrameMark& m : marks) {
    m.origin += shift;
    if (m.selected) m.axis_labels = {"x", "y", "z"};
  }
  return layout.value().marks;
}

double chain_view_distance(const SceneState& state, double minimum) {
  // The sphere around the target that holds the body with its triad and every chain point.
  std::vector<Eigen::Vector3d> pts = chain_points(state);
  for (int a = 0; a < 3; ++a) {
    for (double sign : {1.0, -1.0}) pts.push_back(Eigen::Vector3d::Unit(a) * sign * (kBodyTriadLength + 0.2));
  }
  double r = 0.0;
  for (const Eigen::Vector3d& p : pts) r = std::max(r, (p - state.camera.target).norm() + 0.15);
  const double half_v = state.camera.fov_y_rad / 2.0;
  const double half_h =
      std::atan(std::tan(half_v) * static_cast<double>(state.width_px) / std::max(state.height_px, 1));
  return std::max(minimum, r / std::sin(std::min(half_v, half_h)));
}

Camera chain_framing(const SceneState& state, double minimum) {
  SceneState s = state;
  Eigen::Vector3d centre = Eigen::Vector3d::Zero();
  for (const ChainFrameMark& m : state.chain) centre += m.origin;
  if (!state.chain.empty()) centre /= static_cast<double>(state.chain.size());
  s.camera.target = 0.5 * centre;  // between the body and the chain
  s.camera.distance = chain_view_distance(s, minimum);
  return s.camera;
}

std::vector<Eigen::Vector3d> chain_points(const SceneState& state) {
  std::vector<Eigen::Vector3d> pts;
  for (const ChainFrameMark& m : state.chain) {
    pts.push_back(m.origin);
    for (int a = 0; a < 3; ++a) pts.push_back(chain_axis_tip(m, a));
  }
  return pts;
}

namespace detail {

void draw_chain(const SceneState& st, const OverlayPainter& paint, const Eigen::Vector3f axis_colors[3],
                const Eigen::Vector3f& highlight) {
  for (const ChainFrameMark& m : st.chain) {
    if (m.parent.empty()) continue;
    for (const ChainFrameMark& p : st.chain) {
      if (p.name == m.parent && (p.origin - m.origin).norm() > 1e-9) {
        paint.rod(p.origin, m.origin, kLinkRodRadius, kLinkGrey);
      }
    }
  }
  const Eigen::Vector3d up = st.world.up.normalized();
  for (const ChainFrameMark& m : st.chain) {
    const Eigen::Matrix3d r = m.display_R_frame.matrix();
    const double thickness = (m.selected ? kChainSelectedThickness : kChainThickness) *
                             std::clamp(m.scale, 1.0, kMaxThicknessScale);
    for (int k = 0; k < 3; ++k) paint.arrow(m.origin, r.col(k), length_of(m), thickness, axis_colors[k]);
    if (!m.selected) continue;
    Eigen::Vector3d e1 = up.unitOrthogonal(), e2 = up.cross(e1);
    for (int i = 0; i < kRingSegments; ++i) {
      const double a0 = 2.0 * kPi * i / kRingSegments, a1 = 2.0 * kPi * (i + 1) / kRingSegments;
      paint.rod(m.origin + kChainSelectedRingRadius * (std::cos(a0) * e1 + std::sin(a0) * e2),
                m.origin + kChainSelectedRingRadius * (std::cos(a1) * e1 + std::sin(a1) * e2), kRingRodRadius,
                highlight);
    }
  }
}

void chain_labels(const SceneState& st,
                  const std::function<void(const Eigen::Vector3d& base, const Eigen::Vector3d& tip,
                                           const std::string& text, bool selected, int axis)>& place) {
  const Eigen::Vector3d up = st.world.up.normalized();
  for (const ChainFrameMark& m : st.chain) {
    place(m.origin, m.origin - kNameDrop * up, m.name, m.selected, -1);
    for (int a = 0; a < 3; ++a) {
      const std::string& text = m.axis_labels[static_cast<std::size_t>(a)];
      if (!text.empty()) place(m.origin, chain_axis_tip(m, a), text, m.selected, a);
    }
  }
}

}  // namespace detail

}  // namespace attiscope::render
