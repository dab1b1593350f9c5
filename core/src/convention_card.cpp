// convention_card.cpp: the Markdown convention card.
#include "attiscope/core/convention_card.hpp"

#include <sstream>

namespace attiscope {

namespace {

void frame_table(std::ostringstream& s, const FrameAxes& f, FrameRole role) {
  s << "| axis | name | points |\n| --- | --- | --- |\n";
  const char* letters = "xyz";
  for (std::size_t k = 0; k < 3; ++k) {
    s << "| " << letters[k] << " | " << f.names[k] << " | " << f.directions[k] << " |\n";
  }
  s << "\n"
    << (role == FrameRole::World ? "World" : "Body") << " frame: " << frame_preset_name(f, role) << ".\n\n";
}

}  // namespace

std::string convention_card_markdown(const HouseConvention& c) {
  const HouseEuler& e = c.euler;
  const EulerConvention& ec = e.convention;
  std::ostringstream s;
  s << "# " << c.name << "\n\n" << c.description << "\n\n";
  s << "A pose is world_R_body: it maps body coordinates into world coordinates, v_world = R v_body.\n\n";
  s << "## World axes\n\n";
  frame_table(s, c.world, FrameRole::World);
  s << "## Body axes\n\n";
  frame_table(s, c.body, FrameRole::Body);
  s << "## Euler angles\n\n";
  const std::string i(1, axis_letter(ec.axes[0])), j(1, axis_letter(ec.axes[1])),
      k(1, axis_letter(ec.axes[2]));
  s << "Sequence " << ec.name() << ": ";
  if (ec.kind == EulerKind::Intrinsic) {
    s << "R = R_" << i << "(" << e.names[0] << ") R_" << j << "(" << e.names[1] << ") R_" << k << "("
      << e.names[2] << "), each turn about the body's current axis.\n\n";
  } else {
    s << "R = R_" << k << "(" << e.names[2] << ") R_" << j << "(" << e.names[1] << ") R_" << i << "("
      << e.names[0] << "), each turn about a fixed world axis.\n\n";
  }
  s << "| applied | name | turns about | range |\n| --- | --- | --- | --- |\n";
  for (std::size_t n = 0; n < 3; ++n) {
    const std::size_t axis = static_cast<std::size_t>(ec.axes[n]);
    const std::string about = ec.kind == EulerKind::Intrinsic
                                  ? "body " + c.body.directions[axis] + " (" + c.body.names[axis] + ")"
                                  : "world " + c.world.directions[axis] + " (" + c.world.names[axis] + ")";
    s << "| " << n + 1 << " | " << e.names[n] << " | " << about << " | "
      << range_text(e.ranges[n], static_cast<int>(n), ec) << " |\n";
  }
  s << "\nPrinted as: " << e.names[static_cast<std::size_t>(e.print_order[0])] << ", "
    << e.names[static_cast<std::size_t>(e.print_order[1])] << ", "
    << e.names[static_cast<std::size_t>(e.print_order[2])] << ", in " << angle_unit_name(e.unit) << ".\n\n";
  for (const std::string& line : positive_direction_sentences(c)) s << "- " << line << "\n";
  const auto labels = house_quaternion_labels(c);
  s << "\n## Quaternion\n\n(" << labels[0] << ", " << labels[1] << ", " << labels[2] << ", " << labels[3]
    << "), "
    << (c.quaternion.algebra == QuatAlgebra::Hamilton ? "Hamilton algebra (i j = k)"
                                                      : "JPL algebra (i j = -k)")
    << ", " << (c.quaternion.direction == Direction::BodyToWorld ? "body to world" : "world to body")
    << ".\n\n";
  s << "## Matrix\n\n"
    << (c.matrix.direction == Direction::BodyToWorld
            ? "world_R_body (its columns are the body axes in the world)"
            : "body_R_world (the direction cosine matrix from world to body)")
    << ", nine numbers listed "
    << (c.matrix.storage == MatrixStorage::Rows ? "row by row: m11 m12 m13 m21 ..."
                                                : "column by column: m11 m21 m31 m12 ...")
    << "\n\nShown to " << c.precision << " significant digits.\n";
  return s.str();
}

}  // namespace attiscope
