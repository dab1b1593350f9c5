// mount_picture.cpp: the mount check sheet's picture (see mount_picture.hpp): the vehicle
// frame as the world, the vehicle model below, the sensor above its mount point, four views
// named by the vehicle, text drawn on the CPU with the label font.
#include "attiscope/render/mount_picture.hpp"

#include <algorithm>
#include <cmath>

#include <Eigen/Geometry>

#include "attiscope/core/mount.hpp"
#include "attiscope/render/chain_overlay.hpp"
#include "attiscope/render/image.hpp"
#include "font.hpp"
#include "image_text.hpp"

namespace attiscope::render {

namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kDeg = kPi / 180.0;
/// Elevation of the side views and of the "ahead, right and above" view, degrees.
constexpr double kSideElevationDeg = 10.0;
constexpr double kObliqueElevationDeg = 28.0;
/// Alpha of the nominal mount's faded axes.
constexpr float kNominalAxesAlpha = 0.4f;
/// The vehicle triad's length as a multiple of the vehicle's half-size.
constexpr double kVehicleTriadReach = 1.3;
/// The chain's triads on the sheet: their size (times the default) and spacing.
constexpr double kSheetChainScale = 2.4;
constexpr double kSheetChainSpacing = 2.2;
/// Extra room around what a view frames, as a factor on the camera distance.
constexpr double kFramingMargin = 1.08;
/// Text sizes (pixels) and the page's inks.
constexpr float kTitlePx = 27.0f, kTextPx = 18.0f, kCaptionPx = 21.0f, kFontBakePx = 36.0f;
constexpr std::uint8_t kInk[3] = {30, 34, 44};
constexpr std::uint8_t kCautionInk[3] = {150, 70, 0};
constexpr std::uint8_t kRule[3] = {180, 184, 192};
constexpr int kMargin = 16;

Eigen::Vector3d up_of(const VehicleAxes& names) {
  return vehicle_direction(names, BodyDirection::Up);
}

/// The vehicle model's world_R_model (scaled to kMountVehicleHalfSize), placed so its front,
/// top and right land on the vehicle's forward, up and right.
Eigen::Matrix3d vehicle_R_model(const VehicleAxes& names, ModelKind kind) {
  BodyFrame b;
  b.front = vehicle_direction(names, BodyDirection::Forward);
  b.top = vehicle_direction(names, BodyDirection::Up);
  b.right = vehicle_direction(names, BodyDirection::Right);
  const ModelInfo& info = model_info(kind);
  return kMountVehicleHalfSize * body_R_model(b, info.front, info.top, info.right);
}

/// The frame chain's layout in a view: a row on the screen's left of the vehicle as that
/// view's eye sees it, at the vehicle's height, running toward the vehicle (the root leftmost),
/// branches stacked upward.
Expected<std::vector<ChainFrameMark>> sheet_chain(const VehicleAxes& names, const MountPictureOptions& o,
                                                  const MountView& view,
                                                  const Eigen::Vector3d& vehicle_centre) {
  const Eigen::Vector3d up = up_of(names);
  Eigen::Vector3d eye = vehicle_direction(names, view.from[0]) + vehicle_direction(names, view.from[1]);
  eye -= eye.dot(up) * up;
  if (eye.norm() < 1e-9) eye = vehicle_direction(names, BodyDirection::Aft);  // a top view: behind
  eye.normalize();
  ChainLayoutOptions lo;
  lo.display_frame = o.chain_display_frame;
  lo.selected = o.chain_selected;
  lo.along = up.cross(eye);  // screen right for an eye along `eye`
  lo.across = up;
  lo.spacing = kSheetChainSpacing;
  auto layout = layout_frame_chain(*o.chain, lo);
  if (!layout) return layout.error();
  std::vector<ChainFrameMark>& marks = layout.value().marks;
  double reach = 0.0;
  for (const ChainFrameMark& m : marks) reach = std::max(reach, m.origin.dot(lo.along));
  const Eigen::Vector3d shift = vehicle_centre - lo.along * (kMountVehicleHalfSize + 1.2 + reach) - up * 0.4;
  for (ChainFrameMark& m : marks) {
    m.origin += shift;
    m.scale = kSheetChainScale;
    if (m.selected) m.axis_labels = {"x", "y", "z"};
  }
  return marks;
}

/// Frames the points: the camera's target at their box's centre, far enough back that the
/// sphere around them fits the view's height and width.
void frame_points(const std::vector<Eigen::Vector3d>& pts, int w, int h, Camera* c) {
  Eigen::AlignedBox3d box;
  for (const Eigen::Vector3d& p : pts) box.extend(p);
  c->target = box.center();
  double r = 0.0;
  for (const Eigen::Vector3d& p : pts) r = std::max(r, (p - c->target).norm());
  const double half_v = c->fov_y_rad / 2.0;
  const double half_h = std::atan(std::tan(half_v) * static_cast<double>(w) / std::max(h, 1));
  c->distance = kFramingMargin * r / std::sin(std::min(half_v, half_h));
  c->far_plane = c->distance + 4.0 * r + 10.0;
}

std::uint8_t* px_at(Image* img, int x, int y) {
  return &img->rgba[(static_cast<std::size_t>(y) * static_cast<std::size_t>(img->width) +
                     static_cast<std::size_t>(x)) *
                    4];
}

void fill_rect(Image* img, int x0, int y0, int x1, int y1, const std::uint8_t rgb[3]) {
  for (int y = std::max(0, y0); y < std::min(img->height, y1); ++y) {
    for (int x = std::max(0, x0); x < std::min(img->width, x1); ++x) {
      std::uint8_t* p = px_at(img, x, y);
      p[0] = rgb[0];
      p[1] = rgb[1];
      p[2] = rgb[2];
      p[3] = 255;
    }
  }
}

}  // namespace

std::vector<MountView> mount_views() {
  using D = BodyDirection;
  return {{"from behind", {D::Aft, D::Aft}, kSideElevationDeg},
          {"from the left", {D::Left, D::Left}, kSideElevationDeg},
          {"from above", {D::Up, D::Up}, 90.0},
          {"from ahead, right and above", {D::Forward, D::Right}, kObliqueElevationDeg}};
}

Eigen::Vector3d vehicle_direction(const VehicleAxes& names, BodyDirection d) {
  const auto [axis, sign] = names.axis_of(d);
  return Eigen::Vector3d::Unit(axis) * sign;
}

WorldFrame vehicle_world_frame(const VehicleAxes& names) {
  WorldFrame w;
  w.name = "vehicle " + names.code();
  w.up = up_of(names);
  for (int i = 0; i < 3; ++i)
    w.axis_labels[static_cast<std::size_t>(i)] =
        std::string(1, static_cast<char>('x' + i)) + " " + names.direction_word(i);
  return w;
}

Camera mount_view_camera(const VehicleAxes& names, const MountView& view, const Eigen::Vector3d& target,
                         double distance) {
  const WorldFrame world = vehicle_world_frame(names);
  Eigen::Vector3d e1, e2;  // the ground's forward (world +x on the ground) and left, as camera.cpp has them
  ground_axes(world, &e1, &e2);
  const Eigen::Vector3d up = world.up.normalized();
  Camera c;
  c.target = target;
  c.distance = distance;
  const Eigen::Vector3d eye_dir =
      vehicle_direction(names, view.from[0]) + vehicle_direction(names, view.from[1]);
  const Eigen::Vector3d ground = eye_dir - eye_dir.dot(up) * up;
  if (ground.norm() < 1e-9) {
    // Straight above (or below): the screen's right is the vehicle's forward x up (camera.cpp's
    // right = -sin(az) e1 + cos(az) e2), so the vehicle's forward runs up the screen.
    const Eigen::Vector3d fwd = vehicle_direction(names, BodyDirection::Forward);
    const Eigen::Vector3d right = eye_dir.dot(up) > 0 ? fwd.cross(up) : up.cross(fwd);
    c.azimuth_rad = std::atan2(-right.dot(e1), right.dot(e2));
    c.elevation_rad = (eye_dir.dot(up) > 0 ? 90.0 : -90.0) * kDeg;
  } else {
    const Eigen::Vector3d g = ground.normalized();
    c.azimuth_rad = std::atan2(g.dot(e2), g.dot(e1));
    c.elevation_rad = view.elevation_deg * kDeg;
  }
  return c;
}

SceneState mount_scene(const Rotation& nominal_vehicle_R_sensor, const Rotation& measured_vehicle_R_sensor,
                       const VehicleAxes& names) {
  SceneState s;
  s.world = vehicle_world_frame(names);
  s.body = BodyFrame::flu();
  s.body.name = "sensor";
  s.body.axis_labels = {"sx", "sy", "sz"};
  s.model.kind = ModelKind::ImuBoard;
  s.world_R_body = measured_vehicle_R_sensor;
  s.ghost_world_R_body = nominal_vehicle_R_sensor;
  s.camera = Camera::preset(ViewPreset::Iso);
  s.width_px = kMountViewWidth;
  s.height_px = kMountViewHeight;
  return s;
}

Eigen::Vector3d mount_vehicle_centre(const VehicleAxes& names, ModelKind vehicle_model) {
  // The vehicle's top: the highest point of its model once placed.
  const Mesh mesh = build_model(vehicle_model);
  const Eigen::Matrix3d r = vehicle_R_model(names, vehicle_model);
  const Eigen::Vector3d up = up_of(names);
  double top = 0.0;
  for (const Vertex& v : mesh.vertices) {
    top = std::max(top,
                   up.dot(r * Eigen::Vector3f(v.position[0], v.position[1], v.position[2]).cast<double>()));
  }
  return -up * (kMountSensorLift + top);
}

Expected<SceneState> mount_sheet_scene(const Rotation& nominal_vehicle_R_sensor,
                                       const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                       const MountPictureOptions& options, const MountView& view,
                                       bool with_chain) {
  SceneState s = mount_scene(nominal_vehicle_R_sensor, measured_vehicle_R_sensor, names);
  s.body.axis_labels = options.sensor_axis_names;
  s.show_grid = false;
  s.show_world_triad = false;
  s.faded_triads.push_back({nominal_vehicle_R_sensor, kNominalAxesAlpha});
  const Eigen::Vector3d centre = mount_vehicle_centre(names, options.vehicle_model);
  s.props.push_back({options.vehicle_model, vehicle_R_model(names, options.vehicle_model), centre});

  // The vehicle's own triad, over its model, labelled with its direction words.
  ChainFrameMark vehicle;
  vehicle.name = "";
  vehicle.origin = centre;
  vehicle.scale = kVehicleTriadReach * kMountVehicleHalfSize / kChainTriadLength;
  vehicle.axis_labels = s.world.axis_labels;
  s.chain.push_back(vehicle);
  if (with_chain && options.chain) {
    auto marks = sheet_chain(names, options, view, centre);
    if (!marks) return marks.error();
    s.chain.insert(s.chain.end(), marks->begin(), marks->end());
  }

  // Frame everything drawn: the sensor with its triad, the vehicle's box and triad, the chain.
  std::vector<Eigen::Vector3d> pts = chain_points(s);
  for (int a = 0; a < 3; ++a) {
    pts.push_back(body_axis_tip(s, a));
    pts.push_back(-body_axis_tip(s, a) * 0.6);
  }
  const Eigen::Matrix3d vr = s.props.front().world_R_model;
  for (int c = 0; c < 8; ++c) {
    pts.push_back(centre +
                  vr * Eigen::AlignedBox3d(Eigen::Vector3d::Constant(-1), Eigen::Vector3d::Constant(1))
                           .corner(static_cast<Eigen::AlignedBox3d::CornerType>(c)));
  }
  s.camera = mount_view_camera(names, view, Eigen::Vector3d::Zero(), 1.0);
  frame_points(pts, s.width_px, s.height_px, &s.camera);
  return s;
}

Expected<Image> render_mount_picture(SceneRenderer& renderer, const Rotation& nominal_vehicle_R_sensor,
                                     const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                     const MountPictureOptions& options) {
  std::string problem;
  const detail::BakedFont font = detail::bake_label_font(kFontBakePx, &problem);
  if (font.coverage.empty()) return Error("no font for the check sheet's text: " + problem);
  Image page;
  page.width = kMountPictureWidth;
  page.height = kMountPictureHeight;
  page.rgba.assign(static_cast<std::size_t>(page.width) * static_cast<std::size_t>(page.height) * 4, 255);

  // Title and legend.
  float y = kMargin + kTitlePx;
  detail::draw_image_text(&page, font,
                          "Mount check, vehicle axes " + names.code() + ": sensor on the vehicle, four views",
                          kMargin, y, kTitlePx, kInk);
  y += kTextPx * 1.45f;
  detail::draw_image_text(
      &page, font,
      "Solid sensor and bright arrows: measured mount. Translucent sensor and faded arrows: "
      "nominal mount (the drawing).",
      kMargin, y, kTextPx, kInk);
  y += kTextPx * 1.3f;
  detail::draw_image_text(
      &page, font,
      "The sensor is drawn enlarged above the vehicle (not to scale); the vehicle's arrows "
      "are its own axes.",
      kMargin, y, kTextPx, kInk);

  // The four views.
  const std::vector<MountView> views = mount_views();
  for (std::size_t i = 0; i < views.size(); ++i) {
    const int vx = static_cast<int>(i % 2) * kMountViewWidth;
    const int vy = kMountViewsTop + static_cast<int>(i / 2) * kMountViewHeight;
    auto scene = mount_sheet_scene(nominal_vehicle_R_sensor, measured_vehicle_R_sensor, names, options,
                                   views[i], i == 3);
    if (!scene) return scene.error();
    const Image view = renderer.render_image(scene.value());
    for (int row = 0; row < view.height && vy + row < page.height; ++row) {
      std::copy(view.pixel(0, row), view.pixel(0, row) + static_cast<std::ptrdiff_t>(view.width) * 4,
                px_at(&page, vx, vy + row));
    }
    detail::draw_image_text(&page, font, views[i].name, static_cast<float>(vx + kMargin),
                            static_cast<float>(vy + kMargin) + kCaptionPx, kCaptionPx, kInk);
  }
  // Rules between the views.
  const int views_bottom = kMountViewsTop + 2 * kMountViewHeight;
  fill_rect(&page, 0, kMountViewsTop - 1, page.width, kMountViewsTop + 1, kRule);
  fill_rect(&page, 0, kMountViewsTop + kMountViewHeight - 1, page.width,
            kMountViewsTop + kMountViewHeight + 1, kRule);
  fill_rect(&page, 0, views_bottom - 1, page.width, views_bottom + 1, kRule);
  fill_rect(&page, kMountViewWidth - 1, kMountViewsTop, kMountViewWidth + 1, views_bottom, kRule);

  // The result lines and the caution.
  y = static_cast<float>(views_bottom) + kTextPx * 1.5f;
  for (const std::string& note : options.notes) {
    for (const std::string& line :
         detail::wrap_to_width(font, note, kTextPx, static_cast<float>(page.width - 2 * kMargin))) {
      detail::draw_image_text(&page, font, line, kMargin, y, kTextPx, kInk);
      y += kTextPx * 1.3f;
    }
  }
  for (const std::string& line :
       detail::wrap_to_width(font, kMountCaution, kTextPx, static_cast<float>(page.width - 2 * kMargin))) {
    detail::draw_image_text(&page, font, line, kMargin, y, kTextPx, kCautionInk);
    y += kTextPx * 1.3f;
  }
  return page;
}

Expected<bool> write_mount_picture(SceneRenderer& renderer, const std::string& png_path,
                                   const Rotation& nominal_vehicle_R_sensor,
                                   const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names,
                                   const MountPictureOptions& options) {
  auto image =
      render_mount_picture(renderer, nominal_vehicle_R_sensor, measured_vehicle_R_sensor, names, options);
  if (!image) return image.error();
  return write_png(png_path, image.value());
}

}  // namespace attiscope::render
