// arcball.hpp: turning a mouse drag into a rotation (Shoemake 1992, "ARCBALL: a user
// interface for specifying three-dimensional orientation using a mouse", Graphics
// Interface '92, pp. 151-156).
//
// A drag from pixel p0 to pixel p1 maps both onto a unit sphere drawn around the object on
// the screen; the rotation is the quaternion q = (p0 . p1, p0 x p1), which turns by twice
// the arc between the two sphere points about their common normal. Doubling the arc is
// Shoemake's choice: a drag across the whole sphere turns by 360 degrees, and the result
// depends only on where the drag starts and ends, never on the path between.
//
// Coordinates: pixels have their origin at the top left, x right, y down. The sphere points
// are in *view* coordinates: x right, y up, z toward the viewer.
#pragma once

#include <Eigen/Core>

#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// A sphere drawn on the screen: centre and radius in pixels.
struct ArcballSphere {
  Eigen::Vector2d centre_px = Eigen::Vector2d::Zero();
  double radius_px = 1.0;
};

/// The point of the unit sphere under a pixel (view coordinates). A pixel outside the
/// sphere's outline maps to the nearest point of the outline (z = 0), as in Shoemake's paper.
Eigen::Vector3d arcball_point(const ArcballSphere& sphere, const Eigen::Vector2d& pixel);

/// The rotation, in view coordinates, of a drag between two sphere points: the unit
/// quaternion (from . to, from x to). Identity when the points coincide.
Rotation arcball_rotation(const Eigen::Vector3d& from_view, const Eigen::Vector3d& to_view);

/// The same turn written in world coordinates: world_R_view * view_turn * view_R_world.
/// Compose it on the left of a pose (turn * world_R_body) to turn the body about the axis
/// the person sees.
Rotation arcball_world_turn(const Rotation& view_turn, const Eigen::Matrix3d& world_R_view);

/// A drag in progress: remembers where it started, so the turn is always from the start
/// point (no drift from summing small steps).
struct ArcballDrag {
  ArcballSphere sphere;
  Eigen::Vector3d start_view = Eigen::Vector3d::UnitZ();
  Rotation world_R_body_at_start;

  /// Starts a drag at a pixel on a body whose pose is world_R_body.
  static ArcballDrag begin(const ArcballSphere& sphere, const Eigen::Vector2d& pixel,
                           const Rotation& world_R_body);
  /// The pose after dragging to `pixel`, for a camera with the given world_R_view.
  Rotation pose_at(const Eigen::Vector2d& pixel, const Eigen::Matrix3d& world_R_view) const;
};

}  // namespace attiscope
