// mount_picture.cpp: the vehicle frame as the world, the sensor as the body.
#include "attiscope/render/mount_picture.hpp"

#include "attiscope/render/image.hpp"

namespace attiscope::render {

WorldFrame vehicle_world_frame(const VehicleAxes& names) {
  WorldFrame w;
  w.name = "vehicle " + names.code();
  const auto [axis, sign] = names.axis_of(BodyDirection::Up);
  w.up = Eigen::Vector3d::Zero();
  w.up(axis) = sign;
  for (int i = 0; i < 3; ++i)
    w.axis_labels[static_cast<std::size_t>(i)] =
        std::string(1, static_cast<char>('x' + i)) + " " + names.direction_word(i);
  return w;
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
  s.width_px = kMountPictureWidth;
  s.height_px = kMountPictureHeight;
  return s;
}

Expected<bool> write_mount_picture(SceneRenderer& renderer, const std::string& png_path,
                                   const Rotation& nominal_vehicle_R_sensor,
                                   const Rotation& measured_vehicle_R_sensor, const VehicleAxes& names) {
  const Image image =
      renderer.render_image(mount_scene(nominal_vehicle_R_sensor, measured_vehicle_R_sensor, names));
  return write_png(png_path, image);
}

}  // namespace attiscope::render
