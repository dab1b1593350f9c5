// pose_text.cpp: text -> pose for compare and the mount check.
#include "attiscope/core/pose_text.hpp"

namespace attiscope {

Expected<PoseText> read_pose_text(std::string_view text, const PoseTextOptions& o) {
  PoseText out;
  out.options = o.reading;
  if (o.as) {
    out.kind = *o.as;
  } else {
    auto numbers = scan_numbers(text);
    if (!numbers) return numbers.error();
    const std::size_t n = numbers.value().size();
    if (n == 3) {
      out.kind = ReadingKind::Euler;
    } else if (n == 4) {
      out.kind = ReadingKind::QuatWxyz;
    } else if (n == 9) {
      out.kind = ReadingKind::MatrixRows;
    } else {
      return Error{
          "got " + std::to_string(n) +
              " numbers; a pose is 3 (Euler angles), 4 (quaternion) or 9 (matrix) numbers, or say which "
              "reading (--as)",
          1, 1};
    }
    out.warnings.push_back("no reading given: " + std::to_string(n) + " numbers were read as " +
                           reading_kind_name(out.kind));
  }
  auto r = read_explicit(text, out.kind, out.options);
  if (!r) return r.error();
  out.rotation = r.value().rotation;
  out.reading = reading_kind_name(out.kind);
  if (out.kind == ReadingKind::Euler) out.reading += " " + out.options.euler.name();
  for (const std::string& w : r.value().warnings) out.warnings.push_back(w);
  return out;
}

}  // namespace attiscope
