// mesh.hpp: triangle meshes on the CPU: the body models of attiscope (generated in code),
// a user's OBJ or STL file, and the ray test behind "is this pixel on the body".
//
// Our models are built in their own model coordinates, and each states where its front,
// top and right point there, so frames.hpp's body_R_model places it in any body frame
// (FLU, FRD, camera right-down-forward). A user's file is taken to be written in body
// coordinates already. Every model is centred and scaled to fit a sphere of radius about 1.
#pragma once

#include <Eigen/Core>
#include <array>
#include <cstdint>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "attiscope/core/expected.hpp"

namespace attiscope::render {

/// One vertex: position, normal, colour (linear RGB 0..1, alpha for decals).
struct Vertex {
  std::array<float, 3> position;
  std::array<float, 3> normal;
  std::array<float, 4> color;
};

struct Mesh {
  std::vector<Vertex> vertices;
  std::vector<std::uint32_t> indices;  ///< triangles, counter-clockwise seen from outside

  std::size_t triangle_count() const { return indices.size() / 3; }
};

enum class ModelKind { Box, Quadcopter, Aircraft, Rover, Camera, ImuBoard };

/// What a model is and how it is oriented in its own coordinates.
struct ModelInfo {
  ModelKind kind;
  const char* name;                   ///< command-line name: "box", "quadcopter", ...
  const char* summary;                ///< one sentence for help texts
  Eigen::Vector3d front, top, right;  ///< model coordinates
};

/// The six models, in a fixed order.
const std::array<ModelInfo, 6>& model_infos();
const ModelInfo& model_info(ModelKind kind);
/// "box" ... (case-insensitive). nullopt otherwise.
std::optional<ModelKind> parse_model_kind(std::string_view name);
/// "box, quadcopter, aircraft, rover, camera, imu".
std::string model_list();

/// Builds one of our models in its model coordinates (a few thousand triangles at most).
Mesh build_model(ModelKind kind);

/// Moves and scales a mesh so its bounding box is centred on the origin and its largest
/// half-extent is `half_size`. A mesh with no extent is left as it is.
void normalise_mesh(Mesh* mesh, double half_size = 1.0);

/// Reads an OBJ file (triangulated on load) or an STL file (ASCII or binary), chosen by the
/// extension (.obj, .stl; case-insensitive). Vertex colours become a neutral body colour;
/// normals are per face. The result is normalised (normalise_mesh). Errors say what is
/// wrong and, for text files, on which line.
Expected<Mesh> load_mesh_file(const std::string& path);
/// The same for text or bytes already in memory; `kind` is "obj" or "stl".
Expected<Mesh> load_mesh_data(std::string_view data, std::string_view kind);

/// Nearest hit of a ray (mesh coordinates) with the mesh's triangles, as the ray parameter
/// t (Moller & Trumbore 1997, "Fast, minimum storage ray-triangle intersection").
std::optional<double> ray_mesh_hit(const Mesh& mesh, const Eigen::Vector3d& origin,
                                   const Eigen::Vector3d& direction);

}  // namespace attiscope::render
