// chain_layout.cpp: a tidy layout of a frame tree (see chain_layout.hpp). Leaves take
// columns in depth-first order; a frame with children sits in its first child's column, so
// a straight chain stays one row and each extra branch opens one column.
#include "attiscope/core/chain_layout.hpp"

#include <cmath>

namespace attiscope {

namespace {

/// Directions shorter than this cannot orient a layout.
constexpr double kMinDirectionNorm = 1e-9;

std::vector<std::string> children_of(const FrameChain& chain, const std::string& name) {
  std::vector<std::string> out;
  for (const std::string& f : chain.frames()) {
    const auto p = chain.parent_of(f);
    if (p && *p == name) out.push_back(f);
  }
  return out;
}

// Depth-first from `name`; returns the column of `name`. `next_column` is the first free one.
int place(const FrameChain& chain, const std::string& name, const std::string& parent, int depth,
          int* next_column, std::vector<ChainFrameMark>* marks) {
  const std::size_t index = marks->size();
  ChainFrameMark m;
  m.name = name;
  m.parent = parent;
  m.depth = depth;
  marks->push_back(m);
  const std::vector<std::string> kids = children_of(chain, name);
  int column = -1;
  for (const std::string& k : kids) {
    const int c = place(chain, k, name, depth + 1, next_column, marks);
    if (column < 0) column = c;
  }
  if (column < 0) column = (*next_column)++;
  (*marks)[index].branch = column;
  return column;
}

}  // namespace

Expected<ChainLayout> layout_frame_chain(const FrameChain& chain, const ChainLayoutOptions& o) {
  if (chain.frames().empty()) return Error{"the frame chain has no frames"};
  if (!o.selected.empty() && !chain.has_frame(o.selected))
    return Error{"no frame called '" + o.selected + "' to select"};
  if (!o.display_frame.empty() && !chain.has_frame(o.display_frame))
    return Error{"no frame called '" + o.display_frame + "' to draw the chain in"};
  if (!(std::isfinite(o.spacing) && o.spacing > 0.0))
    return Error{"the spacing between frames must be a positive number"};
  if (!o.along.allFinite() || !o.across.allFinite() || !o.anchor.allFinite() ||
      o.along.norm() < kMinDirectionNorm || o.across.norm() < kMinDirectionNorm)
    return Error{"the layout directions must be finite and not zero"};

  ChainLayout out;
  const std::string start = !o.display_frame.empty()
                                ? o.display_frame
                                : (!o.selected.empty() ? o.selected : chain.frames().front());
  const std::string root = chain.path_from_root(start).front();
  out.display_frame = o.display_frame.empty() ? root : o.display_frame;

  int next_column = 0;
  place(chain, root, "", 0, &next_column, &out.marks);

  const Eigen::Vector3d along = o.along.normalized(), across = o.across.normalized();
  for (ChainFrameMark& m : out.marks) {
    auto t = chain.relative(out.display_frame, m.name);
    if (!t) return t.error();  // cannot happen: every mark is in the display frame's tree
    m.display_R_frame = t->rotation;
    m.lever_arm_origin = t->translation;
    m.origin = o.anchor +
               o.spacing * (static_cast<double>(m.depth) * along + static_cast<double>(m.branch) * across);
    m.selected = m.name == o.selected;
  }
  for (const std::string& f : chain.frames()) {
    if (!find_mark(out, f)) out.unconnected.push_back(f);
  }
  if (!o.selected.empty() && !find_mark(out, o.selected)) {
    return Error{"'" + o.selected + "' is not linked to '" + out.display_frame + "'"};
  }
  return out;
}

const ChainFrameMark* find_mark(const ChainLayout& layout, const std::string& name) {
  for (const ChainFrameMark& m : layout.marks) {
    if (m.name == name) return &m;
  }
  return nullptr;
}

}  // namespace attiscope
