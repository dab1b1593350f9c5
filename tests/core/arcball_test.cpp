// arcball_test.cpp: Shoemake's arcball (1992, Graphics Interface '92): points on the
// sphere, the doubled-arc rotation, and the turn written in world coordinates.
#include "attiscope/core/arcball.hpp"

#include <gtest/gtest.h>

#include <Eigen/Geometry>
#include <cmath>
#include <random>

#include "support/check.hpp"

namespace attiscope {
namespace {

using test::kSeed;
using test::MatrixNear;
using test::RotationNear;

TEST(ArcballTest, PixelsMapOntoTheSphere) {
  const ArcballSphere s{Eigen::Vector2d(200, 100), 50.0};
  EXPECT_TRUE(MatrixNear(arcball_point(s, Eigen::Vector2d(200, 100)), Eigen::Vector3d(0, 0, 1), 1e-15));
  // Screen y grows downward, view y upward.
  EXPECT_TRUE(MatrixNear(arcball_point(s, Eigen::Vector2d(200, 75)), Eigen::Vector3d(0, 0.5, std::sqrt(0.75)),
                         1e-15));
  // Outside the outline: the nearest outline point.
  EXPECT_TRUE(MatrixNear(arcball_point(s, Eigen::Vector2d(400, 100)), Eigen::Vector3d(1, 0, 0), 1e-15));
}

// The arcball quaternion (a . b, a x b) turns a by twice the arc from a to b, about a x b
// (Shoemake 1992, section "Arcball": the doubled arc). Checked against Eigen's angle-axis.
TEST(ArcballTest, DragTurnsByTwiceTheArc) {
  std::mt19937 rng(kSeed);
  std::uniform_real_distribution<double> u(-0.7, 0.7);
  for (int n = 0; n < 200; ++n) {
    const Eigen::Vector3d a = arcball_point({}, Eigen::Vector2d(u(rng), u(rng)));
    const Eigen::Vector3d b = arcball_point({}, Eigen::Vector2d(u(rng), u(rng)));
    const double arc = std::atan2(a.cross(b).norm(), a.dot(b));
    const Rotation r = arcball_rotation(a, b);
    const Rotation expected(Eigen::Quaterniond(Eigen::AngleAxisd(2.0 * arc, a.cross(b).normalized())));
    EXPECT_TRUE(RotationNear(r, expected, 1e-12)) << "seed " << kSeed << " sample " << n;
  }
  EXPECT_TRUE(
      RotationNear(arcball_rotation(Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitZ()), Rotation(), 0.0));
}

TEST(ArcballTest, WorldTurnIsTheViewTurnSeenFromTheCamera) {
  // A camera whose view x, y, z are world y, z, x.
  Eigen::Matrix3d world_R_view;
  world_R_view << Eigen::Vector3d::UnitY(), Eigen::Vector3d::UnitZ(), Eigen::Vector3d::UnitX();
  // Dragging right across the screen turns about the view's y axis: the world's z axis.
  const Rotation view_turn =
      arcball_rotation(Eigen::Vector3d(0, 0, 1), Eigen::Vector3d(std::sin(0.2), 0, std::cos(0.2)));
  const Rotation world_turn = arcball_world_turn(view_turn, world_R_view);
  const Rotation expected(Eigen::Quaterniond(Eigen::AngleAxisd(0.4, Eigen::Vector3d::UnitZ())));
  EXPECT_TRUE(RotationNear(world_turn, expected, 1e-12));
  // A drag composes on the left of the pose it started from, and back to the start is the start.
  const Rotation start(Eigen::Quaterniond(Eigen::AngleAxisd(0.7, Eigen::Vector3d(1, 2, 3).normalized())));
  const ArcballSphere sphere{Eigen::Vector2d(320, 240), 200.0};
  const ArcballDrag drag = ArcballDrag::begin(sphere, Eigen::Vector2d(300, 250), start);
  EXPECT_TRUE(RotationNear(drag.pose_at(Eigen::Vector2d(300, 250), world_R_view), start, 1e-15));
  const Rotation moved = drag.pose_at(Eigen::Vector2d(380, 200), world_R_view);
  const Rotation turn = moved * start.inverse();
  const Eigen::Vector3d a = world_R_view * arcball_point(sphere, Eigen::Vector2d(300, 250));
  const Eigen::Vector3d b = world_R_view * arcball_point(sphere, Eigen::Vector2d(380, 200));
  // The turn carries the grabbed sphere point along the great circle toward the pointer.
  EXPECT_NEAR(turn.apply(a).dot(a.cross(b)), 0.0, 1e-12);
}

}  // namespace
}  // namespace attiscope
