// frame_chain.cpp: composing named frames.
#include "attiscope/core/frame_chain.hpp"

#include <algorithm>
#include <cmath>

namespace attiscope {

FrameTransform FrameTransform::operator*(const FrameTransform& rhs) const {
  FrameTransform out;
  out.rotation = rotation * rhs.rotation;
  out.translation = rotation.apply(rhs.translation) + translation;
  return out;
}

FrameTransform FrameTransform::inverse() const {
  FrameTransform out;
  out.rotation = rotation.inverse();
  out.translation = -out.rotation.apply(translation);
  return out;
}

bool FrameChain::has_frame(const std::string& name) const {
  return std::find(frames_.begin(), frames_.end(), name) != frames_.end();
}

const FrameLink* FrameChain::link_to(const std::string& child) const {
  for (const FrameLink& l : links_) {
    if (l.child == child) return &l;
  }
  return nullptr;
}

std::optional<std::string> FrameChain::parent_of(const std::string& name) const {
  const FrameLink* l = link_to(name);
  if (!l) return std::nullopt;
  return l->parent;
}

std::vector<std::string> FrameChain::path_from_root(const std::string& name) const {
  std::vector<std::string> path{name};
  // Loops are refused on entry, so this ends within frames_.size() steps.
  for (auto p = parent_of(name); p && path.size() <= frames_.size(); p = parent_of(*p)) path.push_back(*p);
  std::reverse(path.begin(), path.end());
  return path;
}

Expected<bool> FrameChain::add_frame(const std::string& name) {
  if (name.empty()) return Error{"a frame needs a name"};
  if (has_frame(name)) return Error{"there is already a frame called '" + name + "'"};
  frames_.push_back(name);
  return true;
}

Expected<bool> FrameChain::add_link(const FrameLink& link) {
  if (link.parent.empty() || link.child.empty()) return Error{"a link needs a parent and a child frame"};
  if (link.parent == link.child) return Error{"a frame cannot be linked to itself ('" + link.child + "')"};
  if (link_to(link.child)) {
    return Error{"'" + link.child + "' already has a parent ('" + *parent_of(link.child) +
                 "'); a frame has one parent"};
  }
  if (link.parent_p_child && !link.parent_p_child->allFinite()) return Error{"the lever arm is not finite"};
  // A loop: the child is already an ancestor of the parent.
  if (has_frame(link.child) && has_frame(link.parent)) {
    const std::vector<std::string> above = path_from_root(link.parent);
    if (std::find(above.begin(), above.end(), link.child) != above.end()) {
      return Error{"linking '" + link.child + "' under '" + link.parent + "' would close a loop"};
    }
  }
  if (!has_frame(link.parent)) frames_.push_back(link.parent);
  if (!has_frame(link.child)) frames_.push_back(link.child);
  links_.push_back(link);
  return true;
}

Expected<bool> FrameChain::add_link(const std::string& parent, const std::string& child,
                                    const Rotation& rotation, LinkDirection direction,
                                    const std::optional<Eigen::Vector3d>& translation) {
  FrameLink link;
  link.parent = parent;
  link.child = child;
  link.entered_direction = direction;
  if (direction == LinkDirection::ChildToParent) {
    link.parent_R_child = rotation;
    link.parent_p_child = translation;
  } else {
    // Entered as child_T_parent: invert it.
    FrameTransform child_T_parent{rotation, translation.value_or(Eigen::Vector3d::Zero())};
    const FrameTransform parent_T_child = child_T_parent.inverse();
    link.parent_R_child = parent_T_child.rotation;
    if (translation) link.parent_p_child = parent_T_child.translation;
  }
  if (translation && !translation->allFinite()) return Error{"the lever arm is not finite"};
  return add_link(link);
}

Expected<bool> FrameChain::set_link_rotation(const std::string& child, const Rotation& parent_R_child) {
  for (FrameLink& l : links_) {
    if (l.child == child) {
      l.parent_R_child = parent_R_child;
      l.entered_text.clear();
      l.entered_as.clear();
      l.entered_direction = LinkDirection::ChildToParent;
      return true;
    }
  }
  return Error{"no link leads to '" + child + "'"};
}

void FrameChain::remove_frame(const std::string& name) {
  frames_.erase(std::remove(frames_.begin(), frames_.end(), name), frames_.end());
  links_.erase(std::remove_if(links_.begin(), links_.end(),
                              [&](const FrameLink& l) { return l.child == name || l.parent == name; }),
               links_.end());
}

std::pair<FrameTransform, std::string> FrameChain::from_root(const std::string& name) const {
  FrameTransform root_T_frame;
  std::string at = name;
  std::size_t steps = 0;
  while (const FrameLink* l = link_to(at)) {
    FrameTransform parent_T_child{l->parent_R_child, l->parent_p_child.value_or(Eigen::Vector3d::Zero())};
    root_T_frame = parent_T_child * root_T_frame;
    at = l->parent;
    if (++steps > frames_.size()) break;  // cannot happen: loops are refused on entry
  }
  return {root_T_frame, at};
}

Expected<FrameTransform> FrameChain::relative(const std::string& a, const std::string& b) const {
  if (!has_frame(a)) return Error{"no frame called '" + a + "'"};
  if (!has_frame(b)) return Error{"no frame called '" + b + "'"};
  const auto [root_T_a, root_a] = from_root(a);
  const auto [root_T_b, root_b] = from_root(b);
  if (root_a != root_b) {
    return Error{"'" + a + "' and '" + b + "' are not linked (their chains start at '" + root_a + "' and '" +
                 root_b + "')"};
  }
  return root_T_a.inverse() * root_T_b;
}

}  // namespace attiscope
