// convention_file.cpp: reading (toml++) and writing (our own commented writer) of house
// convention files.
#include "attiscope/core/convention_file.hpp"

#include <toml++/toml.h>
#include <cstdio>
#include <map>
#include <optional>
#include <set>
#include <sstream>

namespace attiscope {

namespace {

Error error_at(const toml::node& n, const std::string& field, const std::string& message) {
  const auto& b = n.source().begin;
  return Error{message, static_cast<int>(b.line), static_cast<int>(b.column), field};
}

// The keys each table knows; anything else is a warning.
std::map<std::string, std::set<std::string>> known_keys() {
  return {
      {"", {"name", "description", "precision", "world", "body", "euler", "quaternion", "matrix"}},
      {"world", {"frame", "axes", "names"}},
      {"body", {"frame", "axes", "names", "front_name", "right_name"}},
      {"euler", {"sequence", "kind", "names", "print_order", "unit", "ranges"}},
      {"quaternion", {"layout", "algebra", "direction"}},
      {"matrix", {"direction", "storage"}},
  };
}

/// Reads values out of one table, turning type and word errors into Errors with places.
class Reader {
 public:
  Reader(const toml::table& t, std::string prefix) : table_(t), prefix_(std::move(prefix)) {}

  std::string field(const std::string& key) const { return prefix_.empty() ? key : prefix_ + "." + key; }
  const toml::node* node(const std::string& key) const { return table_.get(key); }

  Expected<std::optional<std::string>> string(const std::string& key) const {
    const toml::node* n = node(key);
    if (!n) return std::optional<std::string>{};
    if (!n->is_string()) return error_at(*n, field(key), "expected a text in quotes");
    return std::optional<std::string>{n->value<std::string>().value_or("")};
  }

  Expected<std::optional<std::array<std::string, 3>>> strings3(const std::string& key) const {
    const toml::node* n = node(key);
    if (!n) return std::optional<std::array<std::string, 3>>{};
    const toml::array* a = n->as_array();
    if (!a || a->size() != 3)
      return error_at(*n, field(key), "expected a list of three texts, like [\"a\", \"b\", \"c\"]");
    std::array<std::string, 3> out;
    for (std::size_t i = 0; i < 3; ++i) {
      const toml::node& e = *a->get(i);
      if (!e.is_string()) return error_at(e, field(key), "expected a text in quotes");
      out[i] = e.value<std::string>().value_or("");
    }
    return std::optional<std::array<std::string, 3>>{out};
  }

  template <class T>
  Expected<std::optional<T>> word(const std::string& key,
                                  const std::vector<std::pair<std::string, T>>& words) const {
    auto s = string(key);
    if (!s) return s.error();
    if (!s.value()) return std::optional<T>{};
    std::string list;
    for (const auto& [w, v] : words) {
      if (w == *s.value()) return std::optional<T>{v};
      list += (list.empty() ? "" : ", ") + ("\"" + w + "\"");
    }
    return error_at(*node(key), field(key), "'" + *s.value() + "' is not allowed here: use one of " + list);
  }

 private:
  const toml::table& table_;
  std::string prefix_;
};

void collect_unknown(const toml::table& t, const std::string& prefix, std::vector<Error>* warnings) {
  const auto all = known_keys();
  const auto& known = all.at(prefix);
  for (auto&& [k, v] : t) {
    const std::string key(k.str());
    const std::string full = prefix.empty() ? key : prefix + "." + key;
    if (!known.count(key)) {
      const auto& b = k.source().begin;
      warnings->push_back(Error{"unknown key '" + full + "' is ignored", static_cast<int>(b.line),
                                static_cast<int>(b.column), full});
      continue;
    }
    if (prefix.empty() && all.count(key) && v.is_table()) {
      collect_unknown(*v.as_table(), key, warnings);
    }
  }
}

Expected<bool> read_frame(const toml::table* t, const std::string& prefix, FrameRole role, FrameAxes* frame) {
  if (!t) return true;
  Reader r(*t, prefix);
  auto preset = r.string("frame");
  if (!preset) return preset.error();
  std::optional<FrameAxes> from_preset;
  if (preset.value() && *preset.value() != "custom") {
    auto p = frame_preset(*preset.value(), role);
    if (!p) return error_at(*r.node("frame"), r.field("frame"), p.error().message);
    from_preset = p.value();
    *frame = p.value();
  }
  auto axes = r.strings3("axes");
  if (!axes) return axes.error();
  if (axes.value()) {
    for (std::size_t i = 0; i < 3; ++i) {
      if (auto v = direction_vector((*axes.value())[i], role); !v) {
        return error_at(*r.node("axes")->as_array()->get(i), r.field("axes"), v.error().message);
      }
    }
    if (from_preset && from_preset->directions != *axes.value()) {
      return error_at(*r.node("axes"), r.field("axes"),
                      "these axes disagree with frame = \"" + *preset.value() +
                          "\"; write frame = \"custom\" to use your own axes");
    }
    // A custom frame's axes are called x, y, z unless the file names them.
    if (!from_preset && frame->directions != *axes.value()) frame->names = {"x", "y", "z"};
    frame->directions = *axes.value();
  } else if (preset.value() && *preset.value() == "custom") {
    return error_at(*r.node("frame"), r.field("frame"), "a custom frame needs axes = [three directions]");
  }
  if (auto m = reference_R_frame(*frame, role); !m) {
    const toml::node* where = r.node("axes") ? r.node("axes") : r.node("frame");
    if (where) return error_at(*where, r.field("axes"), m.error().message);
    return Error{m.error().message, 0, 0, r.field("axes")};
  }
  auto names = r.strings3("names");
  if (!names) return names.error();
  if (names.value()) frame->names = *names.value();
  return true;
}

Expected<bool> read_euler(const toml::table* t, HouseEuler* e) {
  if (!t) return true;
  Reader r(*t, "euler");
  auto kind =
      r.word<EulerKind>("kind", {{"intrinsic", EulerKind::Intrinsic}, {"extrinsic", EulerKind::Extrinsic}});
  if (!kind) return kind.error();
  if (kind.value()) e->convention.kind = *kind.value();
  auto seq = r.string("sequence");
  if (!seq) return seq.error();
  if (seq.value()) {
    auto c = parse_euler_sequence(*seq.value(), e->convention.kind);
    if (!c) return error_at(*r.node("sequence"), r.field("sequence"), c.error().message);
    e->convention = c.value();
  }
  auto names = r.strings3("names");
  if (!names) return names.error();
  if (names.value()) e->names = *names.value();
  for (std::size_t i = 0; i < 3; ++i) {
    for (std::size_t k = i + 1; k < 3; ++k) {
      if (e->names[i] == e->names[k] || e->names[i].empty()) {
        const toml::node* n = r.node("names");
        const std::string msg = e->names[i].empty() ? "an angle name is empty"
                                                    : "the angle name '" + e->names[i] + "' is used twice";
        return n ? error_at(*n, r.field("names"), msg) : Error{msg, 0, 0, r.field("names")};
      }
    }
  }
  auto order = r.strings3("print_order");
  if (!order) return order.error();
  if (order.value()) {
    std::array<bool, 3> used{false, false, false};
    for (std::size_t k = 0; k < 3; ++k) {
      int found = -1;
      for (std::size_t i = 0; i < 3; ++i) {
        if (e->names[i] == (*order.value())[k]) found = static_cast<int>(i);
      }
      const toml::node& item = *r.node("print_order")->as_array()->get(k);
      if (found < 0) {
        return error_at(item, r.field("print_order"),
                        "'" + (*order.value())[k] + "' is not one of the angle names (" + e->names[0] + ", " +
                            e->names[1] + ", " + e->names[2] + ")");
      }
      if (used[static_cast<std::size_t>(found)]) {
        return error_at(item, r.field("print_order"), "'" + (*order.value())[k] + "' is printed twice");
      }
      used[static_cast<std::size_t>(found)] = true;
      e->print_order[k] = found;
    }
  }
  auto unit = r.word<AngleUnit>("unit", {{"degrees", AngleUnit::Degrees}, {"radians", AngleUnit::Radians}});
  if (!unit) return unit.error();
  if (unit.value()) e->unit = *unit.value();
  auto ranges = r.strings3("ranges");
  if (!ranges) return ranges.error();
  if (ranges.value()) {
    for (std::size_t i = 0; i < 3; ++i) {
      const std::string& text = (*ranges.value())[i];
      const toml::node& item = *r.node("ranges")->as_array()->get(i);
      const std::string standard = range_text(AngleRange::Standard, static_cast<int>(i), e->convention);
      if (text == standard) {
        e->ranges[i] = AngleRange::Standard;
      } else if (text == "[0, 360)" && i != 1) {
        e->ranges[i] = AngleRange::ZeroTo360;
      } else {
        return error_at(item, r.field("ranges"),
                        "'" + text + "' is not a range for the " +
                            (i == 0   ? "first"
                             : i == 1 ? "middle"
                                      : "third") +
                            " angle of " + e->convention.sequence() + ": use \"" + standard + "\"" +
                            (i != 1 ? " or \"[0, 360)\"" : ""));
      }
    }
  }
  return true;
}

std::string quoted(const std::string& s) {
  std::string out = "\"";
  for (const char ch : s) {
    const auto u = static_cast<unsigned char>(ch);
    if (ch == '"') {
      out += "\\\"";
    } else if (ch == '\\') {
      out += "\\\\";
    } else if (ch == '\n') {
      out += "\\n";
    } else if (ch == '\t') {
      out += "\\t";
    } else if (u < 0x20 || u == 0x7f) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\u%04x", u);
      out += buf;
    } else {
      out += ch;
    }
  }
  return out + "\"";
}

std::string list3(const std::array<std::string, 3>& a) {
  return "[" + quoted(a[0]) + ", " + quoted(a[1]) + ", " + quoted(a[2]) + "]";
}

std::string direction_name(Direction d) {
  return d == Direction::BodyToWorld ? "body_to_world" : "world_to_body";
}

}  // namespace

Expected<LoadedConvention> parse_convention(std::string_view text, const std::string& source_name) {
  LoadedConvention out;
  toml::table doc;
#if TOML_EXCEPTIONS
  try {
    doc = toml::parse(text, source_name);
  } catch (const toml::parse_error& e) {
    return Error{"not a valid TOML file: " + std::string(e.description()),
                 static_cast<int>(e.source().begin.line), static_cast<int>(e.source().begin.column)};
  }
#else
  toml::parse_result parsed = toml::parse(text, source_name);
  if (!parsed) {
    const toml::parse_error& e = parsed.error();
    return Error{"not a valid TOML file: " + std::string(e.description()),
                 static_cast<int>(e.source().begin.line), static_cast<int>(e.source().begin.column)};
  }
  doc = std::move(parsed).table();
#endif
  collect_unknown(doc, "", &out.warnings);
  HouseConvention& c = out.convention;
  Reader top(doc, "");
  for (const char* section : {"world", "body", "euler", "quaternion", "matrix"}) {
    const toml::node* n = doc.get(section);
    if (n && !n->is_table()) return error_at(*n, section, std::string("expected a table [") + section + "]");
  }
  auto name = top.string("name");
  if (!name) return name.error();
  if (name.value()) c.name = *name.value();
  auto description = top.string("description");
  if (!description) return description.error();
  if (description.value()) c.description = *description.value();
  if (const toml::node* p = doc.get("precision")) {
    const auto v = p->value<std::int64_t>();
    if (!p->is_integer() || !v || *v < 1 || *v > 17) {
      return error_at(*p, "precision", "precision must be a whole number from 1 to 17");
    }
    c.precision = static_cast<int>(*v);
  }
  if (auto r = read_frame(doc["world"].as_table(), "world", FrameRole::World, &c.world); !r) return r.error();
  if (auto r = read_frame(doc["body"].as_table(), "body", FrameRole::Body, &c.body); !r) return r.error();
  if (const toml::table* b = doc["body"].as_table()) {
    Reader r(*b, "body");
    auto front = r.string("front_name");
    if (!front) return front.error();
    if (front.value()) c.front_name = *front.value();
    auto right = r.string("right_name");
    if (!right) return right.error();
    if (right.value()) c.right_name = *right.value();
  }
  if (auto r = read_euler(doc["euler"].as_table(), &c.euler); !r) return r.error();
  if (const toml::table* q = doc["quaternion"].as_table()) {
    Reader r(*q, "quaternion");
    auto layout =
        r.word<QuatLayout>("layout", {{"wxyz", QuatLayout::ScalarFirst}, {"xyzw", QuatLayout::ScalarLast}});
    if (!layout) return layout.error();
    if (layout.value()) c.quaternion.layout = *layout.value();
    auto algebra =
        r.word<QuatAlgebra>("algebra", {{"hamilton", QuatAlgebra::Hamilton}, {"jpl", QuatAlgebra::Jpl}});
    if (!algebra) return algebra.error();
    if (algebra.value()) c.quaternion.algebra = *algebra.value();
    auto dir = r.word<Direction>(
        "direction", {{"body_to_world", Direction::BodyToWorld}, {"world_to_body", Direction::WorldToBody}});
    if (!dir) return dir.error();
    if (dir.value()) c.quaternion.direction = *dir.value();
  }
  if (const toml::table* m = doc["matrix"].as_table()) {
    Reader r(*m, "matrix");
    auto dir = r.word<Direction>(
        "direction", {{"body_to_world", Direction::BodyToWorld}, {"world_to_body", Direction::WorldToBody}});
    if (!dir) return dir.error();
    if (dir.value()) c.matrix.direction = *dir.value();
    auto storage = r.word<MatrixStorage>(
        "storage", {{"rows", MatrixStorage::Rows}, {"columns", MatrixStorage::Columns}});
    if (!storage) return storage.error();
    if (storage.value()) c.matrix.storage = *storage.value();
  }
  // Every field was checked with its place above; this catches the rest (none expected).
  if (auto v = validate_convention(c); !v) return v.error();
  return out;
}

Expected<LoadedConvention> load_convention(const std::string& path) {
  auto text = read_whole_file(path);
  if (!text) return text.error();
  return parse_convention(text.value(), path);
}

std::string convention_to_toml(const HouseConvention& c) {
  const HouseEuler& e = c.euler;
  std::array<std::string, 3> printed;
  std::array<std::string, 3> ranges;
  for (std::size_t k = 0; k < 3; ++k) {
    printed[k] = e.names[static_cast<std::size_t>(e.print_order[k])];
    ranges[k] = range_text(e.ranges[k], static_cast<int>(k), e.convention);
  }
  const auto sentences = positive_direction_sentences(c);
  std::ostringstream s;
  s << "# attiscope house convention. Every key may be left out: it then takes the tool's default.\n"
       "# A pose is world_R_body: it maps body coordinates into world coordinates (v_world = R v_body).\n\n";
  s << "# The name of this convention, shown in the window and on the command line.\n";
  s << "name = " << quoted(c.name) << "\n";
  s << "# One or two sentences on where this convention is used.\n";
  s << "description = " << quoted(c.description) << "\n";
  s << "# Significant digits shown on screen and in tables (1 to 17).\n";
  s << "precision = " << c.precision << "\n\n";
  s << "[world]\n";
  s << "# The world frame: \"ENU\" (east, north, up), \"NED\" (north, east, down) or \"custom\".\n";
  s << "frame = "
    << quoted(frame_preset_name(c.world, FrameRole::World) == "custom"
                  ? std::string("custom")
                  : frame_preset_name(c.world, FrameRole::World))
    << "\n";
  s << "# Where the world's x, y, z axes point: east, west, north, south, up or down (right-handed).\n";
  s << "axes = " << list3(c.world.directions) << "\n";
  s << "# What the team calls the world's x, y, z axes.\n";
  s << "names = " << list3(c.world.names) << "\n\n";
  s << "[body]\n";
  s << "# The body frame: \"FLU\" (forward, left, up), \"FRD\" (forward, right, down), \"RDF\" (camera: "
       "right, "
       "down, forward) or \"custom\".\n";
  s << "frame = " << quoted(frame_preset_name(c.body, FrameRole::Body)) << "\n";
  s << "# Where the body's x, y, z axes point: forward, back, left, right, up or down (right-handed).\n";
  s << "axes = " << list3(c.body.directions) << "\n";
  s << "# What the team calls the body's x, y, z axes.\n";
  s << "names = " << list3(c.body.names) << "\n";
  s << "# The word for the body's front point in sentences (\"nose\", \"lens\", \"bow\").\n";
  s << "front_name = " << quoted(c.front_name) << "\n";
  s << "# The word for the body's right side in sentences (\"right wing\", \"right side\").\n";
  s << "right_name = " << quoted(c.right_name) << "\n\n";
  s << "[euler]\n";
  s << "# The axis sequence in the order the turns are applied: XYZ ... ZYZ (or numerals: 321 = ZYX).\n";
  s << "sequence = " << quoted(e.convention.sequence()) << "\n";
  s << "# \"intrinsic\": each turn about the body's current axis, R = R_i(a) R_j(b) R_k(c); \"extrinsic\": "
       "about "
       "the fixed world axes, R = R_k(c) R_j(b) R_i(a).\n";
  s << "kind = " << quoted(e.convention.kind_name()) << "\n";
  s << "# The team's names of the three angles, in the order they are applied.\n";
  s << "names = " << list3(e.names) << "\n";
  s << "# The order the three numbers are printed in (may differ from the order they are applied).\n";
  s << "print_order = " << list3(printed) << "\n";
  s << "# \"degrees\" or \"radians\".\n";
  s << "unit = " << quoted(angle_unit_name(e.unit)) << "\n";
  s << "# Range of each angle in application order; the first and third may be \"[0, 360)\".\n";
  s << "ranges = " << list3(ranges) << "\n";
  s << "# Derived by the tool from the frames (not read back):\n";
  for (const std::string& line : sentences) s << "#   " << line << "\n";
  s << "\n[quaternion]\n";
  s << "# Storage order of the four numbers: \"wxyz\" (scalar first) or \"xyzw\" (scalar last).\n";
  s << "layout = " << quoted(c.quaternion.layout == QuatLayout::ScalarFirst ? "wxyz" : "xyzw") << "\n";
  s << "# Multiplication rule: \"hamilton\" (i j = k) or \"jpl\" (i j = -k).\n";
  s << "algebra = " << quoted(c.quaternion.algebra == QuatAlgebra::Hamilton ? "hamilton" : "jpl") << "\n";
  s << "# \"body_to_world\" (maps body coordinates into the world) or \"world_to_body\" (the inverse).\n";
  s << "direction = " << quoted(direction_name(c.quaternion.direction)) << "\n\n";
  s << "[matrix]\n";
  s << "# \"body_to_world\" (columns are the body axes in the world) or \"world_to_body\" (the DCM from "
       "world to "
       "body).\n";
  s << "direction = " << quoted(direction_name(c.matrix.direction)) << "\n";
  s << "# How nine numbers are listed: \"rows\" (row-major) or \"columns\" (column-major).\n";
  s << "storage = " << quoted(c.matrix.storage == MatrixStorage::Rows ? "rows" : "columns") << "\n";
  return s.str();
}

Expected<bool> save_convention(const std::string& path, const HouseConvention& c,
                               const BeforeRenameHook& before_rename) {
  if (auto v = validate_convention(c); !v) return v.error();
  return write_file_atomically(path, convention_to_toml(c), before_rename);
}

}  // namespace attiscope
