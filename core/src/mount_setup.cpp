// mount_setup.cpp: the mount setup file, read and written with toml++.
#include "attiscope/core/mount_setup.hpp"

#include <toml++/toml.h>
#include <algorithm>
#include <cmath>
#include <fstream>
#include <sstream>

#include "attiscope/core/atomic_file.hpp"
#include "attiscope/core/euler.hpp"
#include "attiscope/core/matrix.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/core/representations.hpp"

namespace attiscope {

namespace {

constexpr double kDeg = 180.0 / M_PI;

Error at(const toml::node& node, std::string message) {
  const toml::source_region& s = node.source();
  return Error{std::move(message), static_cast<int>(s.begin.line), static_cast<int>(s.begin.column)};
}

Error at_table(const toml::table& t, std::string message) {
  const toml::source_region& s = t.source();
  return Error{std::move(message), static_cast<int>(s.begin.line), static_cast<int>(s.begin.column)};
}

// A list of `n` numbers.
Expected<std::vector<double>> numbers(const toml::node& node, std::size_t n, const std::string& key) {
  const toml::array* a = node.as_array();
  if (!a || a->size() != n) return at(node, key + " needs a list of " + std::to_string(n) + " numbers");
  std::vector<double> out;
  for (const toml::node& e : *a) {
    const auto v = e.value<double>();
    if (!v || !std::isfinite(*v)) return at(e, key + ": this is not a finite number");
    out.push_back(*v);
  }
  return out;
}

Expected<std::string> string_of(const toml::node& node, const std::string& key) {
  const auto v = node.value<std::string>();
  if (!v) return at(node, key + " needs a text in quotes");
  return *v;
}

const char* const kRotationKeys[] = {"quaternion",     "matrix",     "euler_deg",
                                     "axis_angle_deg", "rotvec_rad", "words"};

bool is_rotation_key(std::string_view k) {
  for (const char* r : kRotationKeys) {
    if (k == r) return true;
  }
  return false;
}

struct ReadRotation {
  Rotation rotation;
  std::string words;
  Eigen::Vector3d trim_deg = Eigen::Vector3d::Zero();
};

// One rotation table (see the header for its keys). `allowed` are the other keys it may hold.
Expected<ReadRotation> read_rotation(const toml::table& t, const std::string& where, const VehicleAxes& names,
                                     const std::vector<std::string>& allowed,
                                     std::vector<std::string>* warnings) {
  const toml::node* found = nullptr;
  std::string found_key;
  for (const auto& [k, v] : t) {
    const std::string key(k.str());
    if (is_rotation_key(key)) {
      if (found) {
        return at(v, where + ": give one rotation only (" + found_key + " and " + key + " are both here)");
      }
      found = &v;
      found_key = key;
    } else if (key != "euler" && key != "kind" && key != "trim_deg" &&
               std::find(allowed.begin(), allowed.end(), key) == allowed.end()) {
      if (warnings) {
        warnings->push_back("line " + std::to_string(v.source().begin.line) + ": unknown key '" + key +
                            "' in " + where + " (ignored)");
      }
    }
  }
  if (!found) {
    return at_table(
        t, where + " needs a rotation: quaternion, matrix, euler_deg, axis_angle_deg, rotvec_rad or words");
  }
  ReadRotation out;
  if (found_key == "quaternion") {
    auto q = numbers(*found, 4, found_key);
    if (!q) return q.error();
    const auto& n = q.value();
    const double norm = std::sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2] + n[3] * n[3]);
    if (norm < 1e-9) return at(*found, "the quaternion is zero");
    out.rotation = Rotation(Eigen::Quaterniond(n[0], n[1], n[2], n[3]));
  } else if (found_key == "matrix") {
    const toml::array* rows = found->as_array();
    if (!rows || rows->size() != 3) return at(*found, "matrix needs three rows of three numbers");
    Eigen::Matrix3d m;
    for (std::size_t i = 0; i < 3; ++i) {
      auto r = numbers(*rows->get(i), 3, "a matrix row");
      if (!r) return r.error();
      for (std::size_t j = 0; j < 3; ++j)
        m(static_cast<Eigen::Index>(i), static_cast<Eigen::Index>(j)) = r.value()[j];
    }
    auto r = from_matrix(m);
    if (!r) return at(*found, r.error().message);
    out.rotation = r.value();
  } else if (found_key == "euler_deg") {
    auto a = numbers(*found, 3, found_key);
    if (!a) return a.error();
    EulerKind kind = EulerKind::Intrinsic;
    std::string sequence = "ZYX";
    if (const toml::node* k = t.get("kind")) {
      auto s = string_of(*k, "kind");
      if (!s) return s.error();
      if (s.value() == "extrinsic") {
        kind = EulerKind::Extrinsic;
      } else if (s.value() != "intrinsic") {
        return at(*k, "kind is \"intrinsic\" or \"extrinsic\"");
      }
    }
    if (const toml::node* e = t.get("euler")) {
      auto s = string_of(*e, "euler");
      if (!s) return s.error();
      sequence = s.value();
    }
    auto c = parse_euler_sequence(sequence, kind);
    if (!c) return t.get("euler") ? at(*t.get("euler"), c.error().message) : c.error();
    out.rotation = from_euler(c.value(), Eigen::Vector3d(a.value()[0], a.value()[1], a.value()[2]) / kDeg);
  } else if (found_key == "axis_angle_deg") {
    auto a = numbers(*found, 4, found_key);
    if (!a) return a.error();
    auto r = from_axis_angle(Eigen::Vector3d(a.value()[0], a.value()[1], a.value()[2]), a.value()[3] / kDeg);
    if (!r) return at(*found, r.error().message);
    out.rotation = r.value();
  } else if (found_key == "rotvec_rad") {
    auto a = numbers(*found, 3, found_key);
    if (!a) return a.error();
    auto r = from_rotation_vector(Eigen::Vector3d(a.value()[0], a.value()[1], a.value()[2]));
    if (!r) return at(*found, r.error().message);
    out.rotation = r.value();
  } else {
    auto s = string_of(*found, found_key);
    if (!s) return s.error();
    auto r = parse_axis_aligned_mount(s.value(), names);
    if (!r) {
      Error e = at(*found, r.error().message);
      return e;
    }
    out.words = s.value();
    out.rotation = r.value();
    if (const toml::node* trim = t.get("trim_deg")) {
      auto a = numbers(*trim, 3, "trim_deg");
      if (!a) return a.error();
      out.trim_deg = Eigen::Vector3d(a.value()[0], a.value()[1], a.value()[2]);
      out.rotation = trimmed_mount(out.rotation, out.trim_deg / kDeg);
    }
  }
  return out;
}

// A mount table: a rotation, read vehicle_R_sensor unless direction says otherwise.
Expected<ReadRotation> read_mount(const toml::table& t, const std::string& where, const VehicleAxes& names,
                                  std::vector<std::string>* warnings) {
  auto r = read_rotation(t, where, names, {"direction", "note"}, warnings);
  if (!r) return r;
  if (const toml::node* d = t.get("direction")) {
    auto s = string_of(*d, "direction");
    if (!s) return s.error();
    if (s.value() == "vehicle_to_sensor") {
      ReadRotation out = r.value();
      out.rotation = out.rotation.inverse();
      return out;
    }
    if (s.value() != "sensor_to_vehicle") {
      return at(*d, "direction is \"sensor_to_vehicle\" (the default) or \"vehicle_to_sensor\"");
    }
  }
  return r;
}

std::string num(double v) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.17g", v);
  return buf;
}

std::string quoted(const std::string& s) {
  std::string out = "\"";
  for (const char ch : s) {
    const auto c = static_cast<unsigned char>(ch);
    if (ch == '"' || ch == '\\') {
      out += '\\';
      out += ch;
    } else if (c < 0x20 || c == 0x7f) {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\u%04x", c);
      out += buf;
    } else {
      out += ch;
    }
  }
  return out + "\"";
}

std::string quaternion_line(const Rotation& r) {
  const Eigen::Quaterniond q = r.quaternion();
  return "quaternion = [" + num(q.w()) + ", " + num(q.x()) + ", " + num(q.y()) + ", " + num(q.z()) + "]\n";
}

std::string vector_line(const std::string& key, const Eigen::Vector3d& v) {
  return key + " = [" + num(v.x()) + ", " + num(v.y()) + ", " + num(v.z()) + "]\n";
}

}  // namespace

Expected<MountSetup> parse_mount_setup(std::string_view text, std::vector<std::string>* warnings) {
  toml::table root;
  try {
    root = toml::parse(text);
  } catch (const toml::parse_error& e) {
    return Error{std::string(e.description()), static_cast<int>(e.source().begin.line),
                 static_cast<int>(e.source().begin.column)};
  }
  MountSetup s;
  // The vehicle's axis names first: the nominal's words depend on them.
  if (const toml::node* v = root.get("vehicle_axes")) {
    auto code = string_of(*v, "vehicle_axes");
    if (!code) return code.error();
    auto axes = parse_vehicle_axes(code.value());
    if (!axes) return at(*v, axes.error().message);
    s.vehicle_axes = axes.value();
  }
  for (const auto& [k, v] : root) {
    const std::string key(k.str());
    if (key == "vehicle_axes") continue;
    if (key == "name") {
      auto n = string_of(v, key);
      if (!n) return n.error();
      s.name = n.value();
    } else if (key == "tolerance_deg") {
      const auto d = v.value<double>();
      if (!d || !std::isfinite(*d) || *d < 0) return at(v, "tolerance_deg needs a number, zero or more");
      s.tolerance_deg = *d;
    } else if (key == "nominal" || key == "measured") {
      const toml::table* t = v.as_table();
      if (!t) return at(v, "[" + key + "] needs to be a table");
      auto r = read_mount(*t, "[" + key + "]", s.vehicle_axes, warnings);
      if (!r) return r.error();
      if (key == "nominal") {
        s.nominal = r.value().rotation;
        s.nominal_words = r.value().words;
        s.trim_deg = r.value().trim_deg;
      } else {
        s.measured = r.value().rotation;
        if (const toml::node* n = t->get("note")) {
          auto note = string_of(*n, "note");
          if (!note) return note.error();
          s.measured_note = note.value();
        }
      }
    } else if (key == "link") {
      const toml::array* links = v.as_array();
      if (!links || !links->is_array_of_tables()) return at(v, "links are written [[link]], one table each");
      for (const toml::node& ln : *links) {
        const toml::table& t = *ln.as_table();
        const toml::node* parent = t.get("parent");
        const toml::node* child = t.get("child");
        if (!parent || !child) return at_table(t, "[[link]] needs parent and child frame names");
        auto p = string_of(*parent, "parent");
        if (!p) return p.error();
        auto c = string_of(*child, "child");
        if (!c) return c.error();
        auto r = read_rotation(t, "[[link]] " + p.value() + " -> " + c.value(), s.vehicle_axes,
                               {"parent", "child", "maps", "lever_arm_m", "entered", "entered_as"}, warnings);
        if (!r) return r.error();
        LinkDirection dir = LinkDirection::ChildToParent;
        if (const toml::node* m = t.get("maps")) {
          auto ms = string_of(*m, "maps");
          if (!ms) return ms.error();
          if (ms.value() == "parent_to_child") {
            dir = LinkDirection::ParentToChild;
          } else if (ms.value() != "child_to_parent") {
            return at(*m, "maps is \"child_to_parent\" (the default) or \"parent_to_child\"");
          }
        }
        std::optional<Eigen::Vector3d> arm;
        if (const toml::node* a = t.get("lever_arm_m")) {
          auto n = numbers(*a, 3, "lever_arm_m");
          if (!n) return n.error();
          arm = Eigen::Vector3d(n.value()[0], n.value()[1], n.value()[2]);
        }
        auto added = s.chain.add_link(p.value(), c.value(), r.value().rotation, dir, arm);
        if (!added) return at_table(t, added.error().message);
      }
    } else if (key == "frames") {
      const toml::array* names = v.as_array();
      if (!names) return at(v, "frames needs a list of frame names");
      for (const toml::node& n : *names) {
        auto f = string_of(n, "frames");
        if (!f) return f.error();
        if (!s.chain.has_frame(f.value())) {
          auto added = s.chain.add_frame(f.value());
          if (!added) return at(n, added.error().message);
        }
      }
    } else if (warnings) {
      warnings->push_back("line " + std::to_string(v.source().begin.line) + ": unknown key '" + key +
                          "' (ignored)");
    }
  }
  return s;
}

Expected<MountSetup> load_mount_setup(const std::string& path, std::vector<std::string>* warnings) {
  std::ifstream in(path, std::ios::binary);
  if (!in) return Error{"cannot read '" + path + "'"};
  std::ostringstream text;
  text << in.rdbuf();
  return parse_mount_setup(text.str(), warnings);
}

std::string mount_setup_toml(const MountSetup& s) {
  std::string out;
  out += "# attiscope mount setup: a nominal and a measured sensor mount and the frames around them.\n";
  out += "# A mount is vehicle_R_sensor: it maps sensor-frame coordinates into vehicle-frame coordinates.\n";
  out += "# A check made from this file supplements and never replaces the test procedure's calibrated\n";
  out += "# alignment measurement; the test plan, local rules and licensed practice govern.\n\n";
  out += "# What this setup is (free text).\n";
  out += "name = " + quoted(s.name) + "\n";
  out +=
      "# Where the vehicle's x, y, z point: three letters from F B R L U D (forward aft right left up "
      "down).\n";
  out += "vehicle_axes = " + quoted(s.vehicle_axes.code()) + "\n";
  out += "# The largest mount error, in degrees, that passes the check.\n";
  out += "tolerance_deg = " + num(s.tolerance_deg) + "\n";
  if (!s.chain.frames().empty()) {
    out += "# Every frame, in the order they were added (links below join them).\n";
    out += "frames = [";
    for (std::size_t i = 0; i < s.chain.frames().size(); ++i)
      out += (i ? ", " : "") + quoted(s.chain.frames()[i]);
    out += "]\n";
  }
  if (s.nominal) {
    out +=
        "\n# The mount on the drawing. words: sensor axes along vehicle axes; trim_deg: small turns about "
        "the\n";
    out +=
        "# vehicle's x, y, z applied after them. Otherwise a quaternion [w, x, y, z] (Hamilton, scalar "
        "first).\n";
    out += "[nominal]\n";
    if (!s.nominal_words.empty()) {
      out += "words = " + quoted(s.nominal_words) + "\n";
      out += vector_line("trim_deg", s.trim_deg);
    } else {
      out += quaternion_line(*s.nominal);
    }
  }
  if (s.measured) {
    out +=
        "\n# The mount as measured (calibration or a vector solve): quaternion [w, x, y, z] of "
        "vehicle_R_sensor.\n";
    out += "[measured]\n";
    out += quaternion_line(*s.measured);
    if (!s.measured_note.empty()) out += "note = " + quoted(s.measured_note) + "\n";
  }
  for (const FrameLink& l : s.chain.links()) {
    out +=
        "\n# A link: quaternion [w, x, y, z] of parent_R_child (maps child coordinates into parent ones);\n";
    out += "# lever_arm_m: the child's origin in parent coordinates, metres.\n";
    out += "[[link]]\n";
    out += "parent = " + quoted(l.parent) + "\n";
    out += "child = " + quoted(l.child) + "\n";
    out += quaternion_line(l.parent_R_child);
    out += "maps = \"child_to_parent\"\n";
    if (l.parent_p_child) out += vector_line("lever_arm_m", *l.parent_p_child);
  }
  return out;
}

Expected<bool> save_mount_setup(const std::string& path, const MountSetup& setup,
                                const BeforeRenameHook& before_rename) {
  return write_file_atomically(path, mount_setup_toml(setup), before_rename);
}

}  // namespace attiscope
