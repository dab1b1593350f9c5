// frames.cpp: named world and body frames, and placing a model in a body frame.
#include "attiscope/render/frames.hpp"

#include <algorithm>
#include <cctype>
#include <string>

namespace attiscope::render {

namespace {
std::string upper(std::string_view s) {
  std::string out(s);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return std::toupper(c); });
  return out;
}
}  // namespace

WorldFrame WorldFrame::enu() {
  return {"ENU", Eigen::Vector3d::UnitZ(), {"E", "N", "U"}};
}
WorldFrame WorldFrame::ned() {
  return {"NED", -Eigen::Vector3d::UnitZ(), {"N", "E", "D"}};
}
WorldFrame WorldFrame::xyz() {
  return {"XYZ", Eigen::Vector3d::UnitZ(), {"X", "Y", "Z"}};
}

BodyFrame BodyFrame::flu() {
  return {
      "FLU", Eigen::Vector3d::UnitX(), Eigen::Vector3d::UnitZ(), -Eigen::Vector3d::UnitY(), {"x", "y", "z"}};
}
BodyFrame BodyFrame::frd() {
  return {
      "FRD", Eigen::Vector3d::UnitX(), -Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitY(), {"x", "y", "z"}};
}
BodyFrame BodyFrame::rdf() {
  return {
      "RDF", Eigen::Vector3d::UnitZ(), -Eigen::Vector3d::UnitY(), Eigen::Vector3d::UnitX(), {"x", "y", "z"}};
}

std::optional<WorldFrame> parse_world_frame(std::string_view name) {
  const std::string n = upper(name);
  if (n == "ENU") return WorldFrame::enu();
  if (n == "NED") return WorldFrame::ned();
  if (n == "XYZ") return WorldFrame::xyz();
  return std::nullopt;
}

std::optional<BodyFrame> parse_body_frame(std::string_view name) {
  const std::string n = upper(name);
  if (n == "FLU") return BodyFrame::flu();
  if (n == "FRD") return BodyFrame::frd();
  if (n == "RDF" || n == "CAMERA") return BodyFrame::rdf();
  return std::nullopt;
}

Eigen::Matrix3d body_R_model(const BodyFrame& body, const Eigen::Vector3d& model_front,
                             const Eigen::Vector3d& model_top, const Eigen::Vector3d& model_right) {
  // Columns (front, top, right) in each frame; both bases are orthonormal with the same
  // handedness (top = right x front), so B M^T is a proper rotation taking each model
  // direction onto the body's.
  Eigen::Matrix3d b;
  b << body.front, body.top, body.right;
  Eigen::Matrix3d m;
  m << model_front, model_top, model_right;
  return b * m.transpose();
}

}  // namespace attiscope::render
