// frame_chain.hpp: named frames linked by rotations (and optional lever arms), such as
// world -> vehicle -> mount plate -> sensor; any frame reported relative to any other.
//
// A link joins a parent and a child. It is stored as parent_R_child (maps child-frame
// coordinates into parent-frame coordinates) and parent_p_child (the child's origin in
// parent coordinates, metres: the lever arm). A person may enter it either way round; the
// link is turned into this form once, on entry. The frames form a forest: every frame has at
// most one parent and no loops.
#pragma once

#include <Eigen/Core>
#include <optional>
#include <string>
#include <vector>

#include "attiscope/core/expected.hpp"
#include "attiscope/core/rotation.hpp"

namespace attiscope {

/// A rigid transform a_T_b: v_a = a_R_b v_b + a_p_b.
struct FrameTransform {
  Rotation rotation;                                      ///< a_R_b
  Eigen::Vector3d translation = Eigen::Vector3d::Zero();  ///< a_p_b, b's origin in a coordinates

  /// a_T_b * b_T_c = a_T_c.
  FrameTransform operator*(const FrameTransform& rhs) const;
  /// b_T_a.
  FrameTransform inverse() const;
  Eigen::Vector3d apply(const Eigen::Vector3d& point_b) const {
    return rotation.apply(point_b) + translation;
  }
};

/// Which way round a link was entered.
enum class LinkDirection {
  ChildToParent,  ///< the value given is parent_R_child (maps child coordinates into parent ones)
  ParentToChild,  ///< the value given is child_R_parent
};

struct FrameLink {
  std::string parent;
  std::string child;
  Rotation parent_R_child;
  std::optional<Eigen::Vector3d> parent_p_child;  ///< lever arm, metres, parent coordinates
  /// How it was entered, kept for the file and the panel: the text and its reading.
  std::string entered_text;
  std::string entered_as;
  LinkDirection entered_direction = LinkDirection::ChildToParent;
};

class FrameChain {
 public:
  /// Adds a frame with no link yet (a root). Error for an empty name or a duplicate.
  Expected<bool> add_frame(const std::string& name);

  /// Links child to parent, adding frames that do not exist yet. `rotation` is read as the
  /// direction says; a translation, when given, is written in the parent frame when the
  /// direction is ChildToParent (parent_p_child) and in the child frame otherwise
  /// (child_p_parent). Errors: empty or equal names, a child that already has a parent, a
  /// link that would close a loop, a non-finite translation.
  Expected<bool> add_link(const std::string& parent, const std::string& child, const Rotation& rotation,
                          LinkDirection direction = LinkDirection::ChildToParent,
                          const std::optional<Eigen::Vector3d>& translation = std::nullopt);

  /// Adds a link already in stored form (as add_link with ChildToParent), keeping its
  /// entered text.
  Expected<bool> add_link(const FrameLink& link);

  /// Replaces the rotation of the link whose child is `child` (parent_R_child).
  Expected<bool> set_link_rotation(const std::string& child, const Rotation& parent_R_child);

  /// Removes a frame and the link to its parent; its children become roots.
  void remove_frame(const std::string& name);

  /// a_T_b: maps b-frame coordinates into a-frame coordinates. Error when a frame is unknown
  /// or the two are in unconnected trees.
  Expected<FrameTransform> relative(const std::string& a, const std::string& b) const;

  /// The frames in the order they were added.
  const std::vector<std::string>& frames() const { return frames_; }
  const std::vector<FrameLink>& links() const { return links_; }
  bool has_frame(const std::string& name) const;
  /// The parent of a frame, or nullopt for a root (or an unknown frame).
  std::optional<std::string> parent_of(const std::string& name) const;
  /// The chain of frames from the root down to `name` (root first).
  std::vector<std::string> path_from_root(const std::string& name) const;

 private:
  const FrameLink* link_to(const std::string& child) const;
  // root_T_frame, and the root's name.
  std::pair<FrameTransform, std::string> from_root(const std::string& name) const;

  std::vector<std::string> frames_;
  std::vector<FrameLink> links_;
};

}  // namespace attiscope
