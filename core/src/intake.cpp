// intake.cpp: the structure of a pasted text: labelled fields (with the section and brace
// prefixes they sit under), header rows, name hints ("q:", "Quaterniond(", "rpy"), loose
// numbers, ignored fields; then the readings the labels decide, or the shape readings of the
// loose numbers (intake_shapes.cpp); several lines of one pose each are a track.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <map>

#include "attiscope/core/convention.hpp"
#include "attiscope/core/representations.hpp"
#include "intake_internal.hpp"

namespace attiscope {

namespace {

using namespace intake_detail;

std::string lower(std::string_view s) {
  std::string out(s);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

// What a label names.
enum class Role {
  Unknown,
  Ignored,  // time, id, sequence number, frame name
  W,
  X,
  Y,
  Z,
  Q0,
  Q1,
  Q2,
  Q3,
  Q4,
  Roll,
  Pitch,
  Yaw,
  Rx,
  Ry,
  Rz,
  Axis,
  Angle,
  Tx,
  Ty,
  Tz,
  Translation,  // a name for three translation numbers ("position", "t")
  HintOnly,     // a name for a group of numbers: see hint_of
};

struct Field {
  const TextToken* key = nullptr;
  std::string path;    // section prefixes and key, lower case, '.'-joined
  std::string prefix;  // the path without its last component
  std::string name;    // the last component with its own prefix ("q_", "quat_") removed
  std::vector<NumberToken> values;
};

bool any_of(const std::string& s, std::initializer_list<const char*> names) {
  for (const char* n : names) {
    if (s == n) return true;
  }
  return false;
}

bool translation_prefix(const std::string& prefix) {
  std::string last = prefix;
  const auto dot = last.rfind('.');
  if (dot != std::string::npos) last = last.substr(dot + 1);
  return any_of(last, {"position", "translation", "pos", "t", "trans", "p", "location", "origin", "offset"});
}

// The role of a name without its prefixes.
Role role_of(const std::string& n) {
  if (any_of(n, {"w", "qw", "s", "scalar", "real", "qs"})) return Role::W;
  if (any_of(n, {"x", "qx", "i", "qi"})) return Role::X;
  if (any_of(n, {"y", "qy", "j", "qj"})) return Role::Y;
  if (any_of(n, {"z", "qz", "k", "qk"})) return Role::Z;
  if (any_of(n, {"q0", "q[0]"})) return Role::Q0;
  if (any_of(n, {"q1", "q[1]"})) return Role::Q1;
  if (any_of(n, {"q2", "q[2]"})) return Role::Q2;
  if (any_of(n, {"q3", "q[3]"})) return Role::Q3;
  if (any_of(n, {"q4"})) return Role::Q4;
  if (any_of(n, {"roll", "bank", "phi"})) return Role::Roll;
  if (any_of(n, {"pitch", "elevation", "theta", "attitude"})) return Role::Pitch;
  if (any_of(n, {"yaw", "heading", "psi", "azimuth"})) return Role::Yaw;
  if (any_of(n, {"rx", "rotx", "rot_x"})) return Role::Rx;
  if (any_of(n, {"ry", "roty", "rot_y"})) return Role::Ry;
  if (any_of(n, {"rz", "rotz", "rot_z"})) return Role::Rz;
  if (any_of(n, {"axis", "u", "n"})) return Role::Axis;
  if (any_of(n, {"angle", "theta_deg", "angle_deg", "angle_rad"})) return Role::Angle;
  if (any_of(n, {"tx", "ty", "tz"})) return n == "tx" ? Role::Tx : n == "ty" ? Role::Ty : Role::Tz;
  if (any_of(n, {"position", "translation", "pos", "t", "trans", "location", "origin", "offset"})) {
    return Role::Translation;
  }
  if (any_of(n, {"time",     "t_s",    "stamp", "timestamp", "secs",     "nsecs", "sec",
                 "nanosec",  "seq",    "id",    "frame",     "frame_id", "index", "idx",
                 "n_sample", "sample", "utc",   "date",      "ts",       "header"})) {
    return Role::Ignored;
  }
  return Role::Unknown;
}

Hint hint_of(const std::string& n) {
  const std::string s = lower(n);
  auto has = [&](const char* part) { return s.find(part) != std::string::npos; };
  if (any_of(s, {"rpy"})) return Hint::EulerRpy;
  if (any_of(s, {"ypr", "hpr"})) return Hint::EulerYpr;
  if (has("euler") || any_of(s, {"angles", "attitude_deg"})) return Hint::Euler;
  if (has("rotvec") || has("rvec") || has("rotation_vector") || has("rotationvector"))
    return Hint::RotationVector;
  if (has("axisangle") || has("axis_angle") || has("angleaxis") || has("angle_axis")) return Hint::AxisAngle;
  if (has("quat") || any_of(s, {"q", "orientation", "attitude", "rotation", "rot"})) return Hint::Quaternion;
  if (has("matrix") || has("mat3") || has("dcm") || any_of(s, {"r", "rotation_matrix", "c"}))
    return Hint::Matrix;
  if (has("transform") || has("pose") || has("mat4") || any_of(s, {"t_world_body", "tf", "m"}))
    return Hint::Transform;
  return Hint::None;
}

// The last path component with a prefix like "q_", "quat_" or "_" removed when the rest
// is a known name ("q_w" -> "w", "_x" -> "x", "orientation_w" -> "w").
std::string bare_name(const std::string& last) {
  if (role_of(last) != Role::Unknown) return last;
  const auto us = last.rfind('_');
  if (us != std::string::npos && us + 1 < last.size()) {
    const std::string tail = last.substr(us + 1);
    if (role_of(tail) != Role::Unknown) return tail;
  }
  return last;
}

// A group of numbers collected after a key or at top level.
struct Collected {
  std::vector<NumberToken> numbers;
  Layout layout;
};

class Structure {
 public:
  Structure(const std::vector<TextToken>& tokens) : t_(tokens) {}

  std::vector<Field> fields;
  std::vector<NumberToken> loose;  // numbers not under any key
  Layout loose_layout;
  std::vector<std::string> ignored;
  Hint loose_hint = Hint::None;

  void run() {
    std::size_t i = 0;
    int loose_last_line = 0;
    std::map<std::pair<int, std::size_t>, int> group_counts;  // per (line, group) counts for layout
    while (i < t_.size()) {
      const TextToken& tok = t_[i];
      if (tok.kind == TokenKind::Newline) {
        line_start_ = true;
        ++i;
        continue;
      }
      if (line_start_) {
        line_start_ = false;
        const int indent = tok.number.column;
        while (!sections_.empty() && sections_.back().indent >= 0 && sections_.back().indent >= indent) {
          sections_.pop_back();
        }
      }
      if (tok.kind == TokenKind::Open) {
        ++depth_;
        ++i;
        continue;
      }
      if (tok.kind == TokenKind::Close) {
        --depth_;
        while (!sections_.empty() && sections_.back().brace_depth > depth_) sections_.pop_back();
        ++i;
        continue;
      }
      if (tok.kind == TokenKind::Word) {
        if (tok.timestamp) {
          ignored.push_back("the time stamp '" + std::string(tok.text) + "' at " + place(tok));
          ++i;
          continue;
        }
        if (try_header(&i)) continue;
        i = key(i);
        continue;
      }
      if (tok.kind == TokenKind::Number) {
        loose.push_back(tok.number);
        if (tok.number.line != loose_last_line) {
          if (loose_last_line != 0) ++loose_layout.lines;
          loose_last_line = tok.number.line;
        }
        ++i;
        continue;
      }
      if (tok.kind == TokenKind::Semicolon && !loose.empty()) loose_layout.row_breaks = true;
      ++i;
    }
    loose_layout = layout_of(loose, loose_layout);
  }

 private:
  struct Section {
    std::string key;
    int indent = -1;       // a key alone on its line: children are indented deeper
    int brace_depth = -1;  // a key before '{': children are inside the braces
  };

  const std::vector<TextToken>& t_;
  std::vector<Section> sections_;
  int depth_ = 0;
  bool line_start_ = true;

  static std::string place(const TextToken& t) {
    return "line " + std::to_string(t.number.line) + ", column " + std::to_string(t.number.column);
  }

  std::string prefix_path() const {
    std::string p;
    for (const Section& s : sections_) {
      if (!p.empty()) p += ".";
      p += s.key;
    }
    return p;
  }

  // Row structure of a list of numbers: bracket groups, lines.
  Layout layout_of(const std::vector<NumberToken>& numbers, Layout base) const {
    if (numbers.empty()) return base;
    // Groups: count numbers between innermost brackets / ';' / line breaks.
    std::vector<int> counts;
    int current = 0;
    std::size_t first = numbers.front().offset;
    std::size_t last = numbers.back().offset;
    int lines = 1;
    int prev_line = numbers.front().line;
    for (const NumberToken& n : numbers) {
      if (n.line != prev_line) {
        ++lines;
        prev_line = n.line;
      }
    }
    for (const TextToken& tok : t_) {
      if (tok.number.offset < first || tok.number.offset > last) continue;
      if (tok.kind == TokenKind::Number) ++current;
      if ((tok.kind == TokenKind::Close || tok.kind == TokenKind::Semicolon ||
           tok.kind == TokenKind::Newline || tok.kind == TokenKind::Open) &&
          current > 0) {
        counts.push_back(current);
        current = 0;
      }
      if (tok.kind == TokenKind::Semicolon) base.row_breaks = true;
    }
    if (current > 0) counts.push_back(current);
    base.lines = lines;
    base.groups = static_cast<int>(counts.size());
    base.per_group = 0;
    if (!counts.empty() && std::all_of(counts.begin(), counts.end(), [&](int c) { return c == counts[0]; })) {
      base.per_group = counts[0];
    }
    return base;
  }

  // Numbers after position i: stops at a word, at a line end outside the brackets opened
  // here, or at a bracket closing below the starting depth.
  std::size_t collect(std::size_t i, Collected* out) {
    int local = 0;
    bool any = false;
    while (i < t_.size()) {
      const TextToken& tok = t_[i];
      if (tok.kind == TokenKind::Number) {
        out->numbers.push_back(tok.number);
        any = true;
      } else if (tok.kind == TokenKind::Open) {
        ++local;
        ++depth_;
      } else if (tok.kind == TokenKind::Close) {
        if (local == 0) break;
        --local;
        --depth_;
        if (local == 0 && any) {
          ++i;
          break;
        }
      } else if (tok.kind == TokenKind::Newline) {
        if (local == 0 && any) break;
        if (local == 0 && !any) break;
      } else if (tok.kind == TokenKind::Word) {
        if (local == 0 || !tok.timestamp) break;
      } else if (tok.kind == TokenKind::Assign) {
        break;
      }
      ++i;
    }
    depth_ -= local;
    out->layout = layout_of(out->numbers, Layout{});
    return i;
  }

  void add_field(const TextToken& key_tok, const std::string& key_text, std::vector<NumberToken> values) {
    Field f;
    f.key = &key_tok;
    const std::string pre = prefix_path();
    std::string k = lower(key_text);
    // Split a dotted or slashed name: "pose.orientation.w", "orientation/w", "q->w".
    for (const char* sep : {"/", "->", "::"}) {
      std::size_t p;
      while ((p = k.find(sep)) != std::string::npos) k.replace(p, std::string(sep).size(), ".");
    }
    f.path = pre.empty() ? k : pre + "." + k;
    const auto dot = f.path.rfind('.');
    f.prefix = dot == std::string::npos ? "" : f.path.substr(0, dot);
    const std::string last = dot == std::string::npos ? f.path : f.path.substr(dot + 1);
    f.name = bare_name(last);
    // "orientation_w": the part before the name is a prefix too.
    if (f.name != last && last.size() > f.name.size() + 1) {
      const std::string own = last.substr(0, last.size() - f.name.size() - 1);
      f.prefix = f.prefix.empty() ? own : f.prefix + "." + own;
    }
    f.values = std::move(values);
    fields.push_back(std::move(f));
  }

  // A line of names followed by as many numbers (on the same line after ':' / '=' or on
  // the next line): each name labels the number in its place. "w x y z\n1 0 0 0",
  // "(x, y, z, w) = (0, 0, 0.38, 0.92)".
  bool try_header(std::size_t* pi) {
    std::size_t i = *pi;
    std::vector<const TextToken*> names;
    const int line = t_[i].number.line;
    while (i < t_.size() && t_[i].number.line == line) {
      const TextToken& tok = t_[i];
      if (tok.kind == TokenKind::Word && !tok.timestamp) {
        names.push_back(&tok);
      } else if (tok.kind == TokenKind::Number || tok.kind == TokenKind::Assign ||
                 tok.kind == TokenKind::Newline) {
        break;
      }
      ++i;
    }
    if (names.size() < 3) return false;
    for (const TextToken* n : names) {
      const Role r = role_of(bare_name(lower(n->text)));
      if (r == Role::Unknown || r == Role::Ignored || r == Role::Axis || r == Role::Translation) return false;
    }
    std::size_t j = i;
    if (j < t_.size() && t_[j].kind == TokenKind::Assign) ++j;
    if (j < t_.size() && t_[j].kind == TokenKind::Newline) ++j;
    Collected c;
    const int saved_depth = depth_;
    const std::size_t end = collect(j, &c);
    if (c.numbers.size() != names.size()) {
      depth_ = saved_depth;
      return false;
    }
    for (std::size_t k = 0; k < names.size(); ++k)
      add_field(*names[k], std::string(names[k]->text), {c.numbers[k]});
    *pi = end;
    return true;
  }

  // A word at position i: a key with values, a section, a hint, or an ignored field.
  std::size_t key(std::size_t i) {
    const TextToken& k = t_[i];
    std::size_t j = i + 1;
    const bool assigned = j < t_.size() && t_[j].kind == TokenKind::Assign;
    if (assigned) ++j;
    // A section: "orientation:" alone on its line, or "orientation: {".
    if (assigned && (j >= t_.size() || t_[j].kind == TokenKind::Newline)) {
      sections_.push_back({lower(k.text), line_indent(i), -1});
      return j;
    }
    if (j < t_.size() && t_[j].kind == TokenKind::Open && t_[j].bracket == '{' && assigned) {
      // An object unless it holds only numbers.
      std::size_t p = j + 1;
      while (p < t_.size() && (t_[p].kind == TokenKind::Newline)) ++p;
      if (p < t_.size() && t_[p].kind == TokenKind::Word) {
        ++depth_;
        sections_.push_back({lower(k.text), -1, depth_});
        return j + 1;
      }
    }
    if (j < t_.size() && (t_[j].kind == TokenKind::Number || t_[j].kind == TokenKind::Open)) {
      Collected c;
      const std::size_t end = collect(j, &c);
      if (!c.numbers.empty()) {
        std::string last = lower(k.text);
        for (const char* sep : {".", "/", "->", "::"}) {
          const auto p = last.rfind(sep);
          if (p != std::string::npos) last = last.substr(p + std::string(sep).size());
        }
        const std::string name = bare_name(last);
        const Role r = role_of(name);
        const Hint h = hint_of(std::string(k.text));
        if (r == Role::Unknown && h == Hint::None) {
          if (c.numbers.size() == 1) {
            ignored.push_back("the field '" + std::string(k.text) + "' at " + place(k));
          } else {
            // An unknown name before several numbers: keep the numbers as loose ones.
            ignored.push_back("the name '" + std::string(k.text) + "' at " + place(k));
            for (const NumberToken& n : c.numbers) loose.push_back(n);
            loose_layout = c.layout;
          }
        } else if (r == Role::Ignored) {
          ignored.push_back("the field '" + std::string(k.text) + "' at " + place(k));
        } else {
          add_field(k, std::string(k.text), c.numbers);
        }
        return end;
      }
    }
    if (assigned) {
      ignored.push_back("the field '" + std::string(k.text) + "' at " + place(k));
      // Skip its value word.
      if (j < t_.size() && t_[j].kind == TokenKind::Word) ++j;
      return j;
    }
    const Hint h = hint_of(std::string(k.text));
    if (h != Hint::None && loose_hint == Hint::None) {
      loose_hint = h;
    } else {
      ignored.push_back("the word '" + std::string(k.text) + "' at " + place(k));
    }
    return i + 1;
  }

  int line_indent(std::size_t i) const {
    std::size_t p = i;
    while (p > 0 && t_[p - 1].kind != TokenKind::Newline) --p;
    return t_[p].number.column;
  }
};

// Labelled readings: quaternion components, Euler names, rotation-vector names, axis and
// angle. Translation fields fill *translation.
struct Labelled {
  std::vector<Reading> readings;
  std::optional<Eigen::Vector3d> translation;
  std::vector<std::string> names;
  std::optional<Error> error;
  bool used_any = false;
};

Labelled labelled_readings(const std::vector<Field>& fields, const IntakePreferences& prefs) {
  Labelled out;
  // Group single-value fields by prefix.
  std::map<std::string, std::map<Role, const Field*>> groups;
  std::vector<const Field*> multi;
  for (const Field& f : fields) {
    Role r = role_of(f.name);
    if (translation_prefix(f.prefix) && (r == Role::X || r == Role::Y || r == Role::Z)) {
      r = r == Role::X ? Role::Tx : r == Role::Y ? Role::Ty : Role::Tz;
    }
    if (f.values.size() == 1 && r != Role::Unknown && r != Role::HintOnly && r != Role::Translation &&
        r != Role::Axis) {
      groups[f.prefix][r] = &f;
    } else {
      multi.push_back(&f);
    }
  }
  auto val = [](const Field* f) { return f->values.front(); };
  auto names_of = [&](const std::map<Role, const Field*>& g) {
    std::string s;
    for (const auto& [r, f] : g) {
      (void)r;
      if (!s.empty()) s += " ";
      s += std::string(f->key->text);
    }
    return s;
  };
  for (const auto& entry : groups) {
    const std::string& prefix = entry.first;
    const std::map<Role, const Field*>& g = entry.second;
    auto has = [&](Role r) { return g.count(r) > 0; };
    auto v = [&](Role r) { return val(g.at(r)).value; };
    if (has(Role::Tx) && has(Role::Ty) && has(Role::Tz)) {
      out.translation = Eigen::Vector3d(v(Role::Tx), v(Role::Ty), v(Role::Tz));
    }
    const std::string where = prefix.empty() ? "" : " under '" + prefix + "'";
    if (has(Role::W) && has(Role::X) && has(Role::Y) && has(Role::Z)) {
      auto r = quaternion_reading({v(Role::W), v(Role::X), v(Role::Y), v(Role::Z)}, val(g.at(Role::W)));
      if (!r) {
        out.error = r.error();
        continue;
      }
      Reading q = r.value();
      q.layout = "wxyz";
      q.as = ReadingKind::QuatWxyz;
      q.score = kScoreDecided;
      q.why = "the labels " + names_of(g) + where + " name the quaternion's scalar and vector parts";
      out.readings.push_back(q);
      out.names.push_back(names_of(g));
    } else if (has(Role::Q0) && has(Role::Q1) && has(Role::Q2) && has(Role::Q3) && !has(Role::Q4)) {
      auto r = quaternion_reading({v(Role::Q0), v(Role::Q1), v(Role::Q2), v(Role::Q3)}, val(g.at(Role::Q0)));
      if (!r) {
        out.error = r.error();
        continue;
      }
      Reading q = r.value();
      q.layout = "wxyz";
      q.as = ReadingKind::QuatWxyz;
      q.score = kScoreDecided;
      q.why = "labels q0..q3: numbered from 0, q0 is the scalar (common practice)";
      out.readings.push_back(q);
      out.names.push_back(names_of(g));
    } else if (has(Role::Q1) && has(Role::Q2) && has(Role::Q3) && has(Role::Q4)) {
      // q1..q4 has two usual meanings: q4 the scalar (spacecraft practice), or q1 the
      // scalar numbered from 1. The numbers alone cannot decide.
      const double a = v(Role::Q1), b = v(Role::Q2), c = v(Role::Q3), d = v(Role::Q4);
      for (int k = 0; k < 2; ++k) {
        const bool last = k == 0;
        auto r =
            quaternion_reading(last ? std::array<double, 4>{d, a, b, c} : std::array<double, 4>{a, b, c, d},
                               val(g.at(Role::Q1)));
        if (!r) {
          out.error = r.error();
          break;
        }
        Reading q = r.value();
        q.layout = last ? "xyzw" : "wxyz";
        q.as = last ? ReadingKind::QuatXyzw : ReadingKind::QuatWxyz;
        q.score = last ? 0.66 : 0.6;
        if ((prefs.quat_layout == QuatLayout::ScalarLast) == last) q.score += kHouseBonus;
        q.why = last ? "labels q1..q4 read with q4 as the scalar (the usual spacecraft meaning)"
                     : "labels q1..q4 read with q1 as the scalar (numbered from 1, scalar first)";
        q.warnings.push_back(
            "q1..q4 has two usual meanings (q4 or q1 the scalar): check which one the source uses");
        out.readings.push_back(q);
      }
      out.names.push_back(names_of(g));
    }
    if (has(Role::Roll) || has(Role::Pitch) || has(Role::Yaw)) {
      std::vector<NumberToken> angles;
      for (Role r : {Role::Yaw, Role::Pitch, Role::Roll}) {
        if (has(r)) angles.push_back(val(g.at(r)));
      }
      const UnitGuess u = guess_angle_unit(angles, prefs.unit);
      // Roll about x, pitch about y, yaw about z (common practice); applied yaw, pitch, roll:
      // the aerospace intrinsic ZYX sequence, unless the house uses another Tait-Bryan one.
      EulerConvention conv{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
      if (!prefs.euler.proper()) conv = prefs.euler;
      const double about[3] = {has(Role::Roll) ? v(Role::Roll) : 0.0, has(Role::Pitch) ? v(Role::Pitch) : 0.0,
                               has(Role::Yaw) ? v(Role::Yaw) : 0.0};
      Eigen::Vector3d a;
      for (int k = 0; k < 3; ++k) a(k) = about[static_cast<int>(conv.axes[static_cast<std::size_t>(k)])];
      for (AngleUnit unit :
           {u.unit, u.unit == AngleUnit::Degrees ? AngleUnit::Radians : AngleUnit::Degrees}) {
        if (u.written && unit != u.unit) break;
        Reading e = euler_reading(conv, a, unit);
        e.score = kScoreDecided *
                  (u.written ? 1.0 : 0.5 + 0.5 * (unit == u.unit ? u.confidence : 1.0 - u.confidence));
        e.why = "the labels " + names_of(g) +
                " name the angles (roll about x, pitch about y, yaw about z), read " + conv.name() + " in " +
                (unit == AngleUnit::Degrees ? "degrees" : "radians") + "; " +
                (unit == u.unit ? u.why : "the other unit");
        if (!(has(Role::Roll) && has(Role::Pitch) && has(Role::Yaw))) {
          e.warnings.push_back("not all three angles are labelled: the missing ones were read as 0");
        }
        if (!u.written) e.warnings.push_back("no unit is written: the unit is a guess");
        out.readings.push_back(e);
      }
      out.names.push_back(names_of(g));
    }
    if (has(Role::Rx) && has(Role::Ry) && has(Role::Rz)) {
      std::vector<NumberToken> n = {val(g.at(Role::Rx)), val(g.at(Role::Ry)), val(g.at(Role::Rz))};
      std::optional<Error> err;
      Layout layout;
      // rx ry rz: most often a rotation vector (robot tool poses, common practice), else
      // angles about x, y and z applied in the house's Tait-Bryan order.
      EulerConvention conv{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
      if (!prefs.euler.proper()) conv = prefs.euler;
      for (Reading& r : shape_readings(n, Hint::None, layout, prefs, &err)) {
        if (r.kind == IntakeKind::RotationVector) {
          r.score *= 1.6;
        } else if (r.kind == IntakeKind::Euler) {
          Eigen::Vector3d a;
          for (int k = 0; k < 3; ++k)
            a(k) = n[static_cast<std::size_t>(conv.axes[static_cast<std::size_t>(k)])].value;
          Reading e = euler_reading(conv, a, r.unit);
          e.score = r.score;
          e.warnings = r.warnings;
          e.why = "angles about x, y and z read " + conv.name() + " in " +
                  (r.unit == AngleUnit::Degrees ? "degrees" : "radians");
          r = e;
        }
        r.why = "labels rx ry rz: " + r.why;
        out.readings.push_back(r);
      }
      if (err) out.error = err;
      out.names.push_back(names_of(g));
    }
  }
  // Multi-value fields: axis + angle, translations, hinted groups.
  const Field* axis = nullptr;
  const Field* angle = nullptr;
  for (const Field* f : multi) {
    const Role r = role_of(f->name);
    if (r == Role::Axis && f->values.size() == 3) axis = f;
    if (r == Role::Translation && f->values.size() == 3) {
      out.translation = Eigen::Vector3d(f->values[0].value, f->values[1].value, f->values[2].value);
    }
  }
  for (const Field& f : fields) {
    if (role_of(f.name) == Role::Angle && f.values.size() == 1) angle = &f;
  }
  if (axis && angle) {
    std::vector<NumberToken> n = axis->values;
    n.push_back(angle->values.front());
    std::optional<Error> err;
    for (Reading& r : shape_readings(n, Hint::AxisAngle, Layout{}, prefs, &err)) {
      if (r.kind != IntakeKind::AxisAngle) continue;
      r.score = kScoreDecided * (angle->values.front().unit ? 1.0 : 0.9);
      r.why = "labels axis and angle: " + r.why;
      out.readings.push_back(r);
    }
    if (err) out.error = err;
  }
  for (const Field* f : multi) {
    const Role r = role_of(f->name);
    if ((r == Role::Axis || r == Role::Translation) && f->values.size() == 3) continue;
    const auto dot = f->path.rfind('.');
    const Hint h = hint_of(dot == std::string::npos ? f->path : f->path.substr(dot + 1));
    if (h == Hint::None) continue;
    std::optional<Error> err;
    for (Reading& rd : shape_readings(f->values, h, Layout{}, prefs, &err)) {
      rd.why = "named '" + std::string(f->key->text) + "': " + rd.why;
      out.readings.push_back(rd);
    }
    if (err && !out.error) out.error = err;
  }
  return out;
}

// Drops of leading and trailing numbers that leave a shape a reading takes.
struct Window {
  std::size_t front = 0;
  std::size_t back = 0;
  double factor = 1.0;
};

/// A leading number at least this large looks like a Unix time stamp (seconds or finer).
constexpr double kEpochLike = 1e5;
/// A quaternion left after leaving numbers out must be this close to unit.
constexpr double kWindowUnitNorm = 1e-2;

bool is_shape(std::size_t n) {
  return n == 3 || n == 4 || n == 9 || n == 12 || n == 16;
}

std::vector<Window> windows(std::size_t n) {
  std::vector<Window> out;
  if (is_shape(n)) {
    out.push_back({0, 0, 1.0});
    return out;  // a count a reading takes is read whole
  }
  if (n > 1 && is_shape(n - 1)) {
    out.push_back({1, 0, 0.85});  // a leading time stamp
    out.push_back({0, 1, 0.75});  // a trailing id
  }
  if (n > 2 && is_shape(n - 2)) {
    out.push_back({1, 1, 0.7});
    out.push_back({2, 0, 0.65});
  }
  return out;
}

Error count_error(std::string_view text, const std::vector<NumberToken>& numbers) {
  const std::string msg = "got " + std::to_string(numbers.size()) +
                          " numbers; a pose is 3 (Euler angles or a rotation vector), 4 (a quaternion or "
                          "axis-angle), 9 (a matrix), 12 or 16 (a transform)";
  if (numbers.size() > 16)
    return Error{msg + " (the 17th number is here)", numbers[16].line, numbers[16].column};
  if (numbers.size() >= 3) {
    const NumberToken& last = numbers.back();
    return Error{msg + " (the last number is here)", last.line, last.column};
  }
  int line = 1, column = 1;
  for (char ch : text) {
    if (ch == '\n') {
      ++line;
      column = 1;
    } else if ((static_cast<unsigned char>(ch) & 0xC0) != 0x80) {
      ++column;
    }
  }
  if (!numbers.empty()) return Error{msg + " (too few: the text ends here)", line, column};
  return Error{"no numbers found: nothing to read as a rotation", line, column};
}

// Several lines of equal count (three or more numbers each) that are not one printed matrix.
bool looks_like_track(const std::vector<TextToken>& tokens) {
  std::vector<int> counts;
  int current = 0;
  int words_in_data = 0;
  for (const TextToken& t : tokens) {
    if (t.kind == TokenKind::Number) ++current;
    if (t.kind == TokenKind::Assign) return false;
    if (t.kind == TokenKind::Word && current > 0) ++words_in_data;
    if (t.kind == TokenKind::Newline) {
      if (current > 0) counts.push_back(current);
      current = 0;
    }
  }
  if (current > 0) counts.push_back(current);
  if (counts.size() < 2) return false;
  const int c0 = counts[0];
  if (c0 < 3) return false;
  for (int c : counts) {
    if (c != c0) return false;
  }
  const std::size_t total = counts.size() * static_cast<std::size_t>(c0);
  // One printed matrix or transform: 3 rows of 3, 3 rows of 4, 4 rows of 3 or 4.
  if ((counts.size() == 3 || counts.size() == 4) && (c0 == 3 || c0 == 4) && is_shape(total)) return false;
  if (counts.size() == 2 && c0 <= 8) return false;  // a wrapped printout of one pose
  (void)words_in_data;
  return true;
}

}  // namespace

Expected<IntakeResult> read_pasted(std::string_view text, const IntakePreferences& prefs) {
  IntakeResult result;
  ScanOptions scan;
  scan.decimal_comma = looks_like_decimal_commas(text);
  if (scan.decimal_comma) result.notes.push_back("commas between digits were read as decimal commas");
  // A long text is looked at through its head first: a log need not be tokenised whole.
  constexpr std::size_t kTrackProbeBytes = 64 * 1024;
  std::string_view head = text;
  if (head.size() > kTrackProbeBytes) {
    head = head.substr(0, kTrackProbeBytes);
    const auto nl = head.rfind('\n');
    if (nl != std::string_view::npos) head = head.substr(0, nl + 1);
  }
  const bool track_like = looks_like_track(scan_tokens(head, scan));
  const std::vector<TextToken> tokens =
      track_like && head.size() < text.size() ? std::vector<TextToken>{} : scan_tokens(text, scan);

  if (track_like) {
    ColumnPreferences cp;
    cp.quat_layout = prefs.quat_layout;
    cp.matrix_storage = prefs.matrix_storage;
    cp.euler = prefs.euler;
    cp.euler_unit = prefs.unit;
    auto mapping = find_columns(head, cp);
    if (mapping) {
      auto track = read_track_text(text, mapping.value());
      if (track && track.value().size() > 0) {
        const Track& tr = track.value();
        result.track = mapping.value();
        result.track_rows = tr.size();
        result.shape = "track of " + std::to_string(tr.size()) + " rows";
        auto first = quaternion_reading({tr.qw[0], tr.qx[0], tr.qy[0], tr.qz[0]}, NumberToken{});
        if (first) {
          Reading r = first.value();
          const ColumnMapping& mp = mapping.value();
          const TrackForm f = mp.form;
          r.kind = f == TrackForm::Euler                                  ? IntakeKind::Euler
                   : f == TrackForm::QuatWxyz || f == TrackForm::QuatXyzw ? IntakeKind::Quaternion
                                                                          : IntakeKind::Matrix;
          r.layout = track_form_name(f);
          if (f == TrackForm::Euler) {
            r.euler = mp.euler;
            r.unit = mp.euler_unit;
            r.layout = mp.euler.name() + ", " + angle_unit_name(mp.euler_unit);
          }
          r.as = parse_reading_kind(track_form_name(f));
          r.score = mp.ambiguous ? 0.6 : 0.9;
          r.why = "the first of " + std::to_string(tr.size()) + " rows of a track, read as " +
                  track_reading_text(mp);
          r.warnings.clear();
          for (const BadRow& b : tr.bad_rows) {
            r.warnings.push_back("line " + std::to_string(b.line) + ": " + b.reason);
            if (r.warnings.size() > 5) break;
          }
          result.readings.push_back(r);
          finish_readings(&result.readings, prefs, &result.ambiguous);
          result.ambiguous = mapping.value().ambiguous;
          return result;
        }
      }
    }
  }

  if (track_like && tokens.empty() && !text.empty()) {
    return Error{"this long text looks like a log, but its columns were not found: see attiscope track", 1,
                 1};
  }
  Structure s(tokens);
  s.run();
  for (const std::string& n : s.ignored) result.notes.push_back("ignored " + n);

  Labelled lab = labelled_readings(s.fields, prefs);
  std::optional<Error> first_error = lab.error;
  std::vector<Reading> readings = lab.readings;
  if (!readings.empty()) {
    result.shape = "labelled fields";
    for (const std::string& n : lab.names) result.shape += " " + n;
  }

  // i/j/k notation: "0.92 + 0.38k", "0.7071 - 0.7071i + 0j + 0k".
  const bool imaginary = std::any_of(s.loose.begin(), s.loose.end(), [&](const NumberToken& n) {
    for (const TextToken& t : tokens) {
      if (t.kind == TokenKind::Number && t.number.offset == n.offset) return t.imaginary != 0;
    }
    return false;
  });
  if (readings.empty() && imaginary) {
    std::array<double, 4> wxyz{0, 0, 0, 0};
    std::optional<NumberToken> first;
    for (const TextToken& t : tokens) {
      if (t.kind != TokenKind::Number) continue;
      if (!first) first = t.number;
      if (!std::isfinite(t.number.value)) {
        return Error{"this number is not finite (NaN or Inf)", t.number.line, t.number.column};
      }
      const std::size_t slot = t.imaginary == 'i' ? 1 : t.imaginary == 'j' ? 2 : t.imaginary == 'k' ? 3 : 0;
      wxyz[slot] += t.number.value;
    }
    auto r = quaternion_reading(wxyz, *first);
    if (!r) return r.error();
    Reading q = r.value();
    q.layout = "w + xi + yj + zk";
    q.as = ReadingKind::QuatWxyz;
    q.score = kScoreDecided;
    q.why = "written as a quaternion with i, j, k terms: the plain number is the scalar";
    readings.push_back(q);
    result.shape = "quaternion in i/j/k notation";
  }

  if (readings.empty() && lab.error && s.loose.empty()) return *lab.error;
  if (readings.empty()) {
    const std::vector<NumberToken>& n = s.loose;
    const auto ws = windows(n.size());
    if (ws.empty()) return count_error(text, n);
    for (const Window& w : ws) {
      std::vector<NumberToken> part(n.begin() + static_cast<std::ptrdiff_t>(w.front),
                                    n.end() - static_cast<std::ptrdiff_t>(w.back));
      Layout layout = s.loose_layout;
      if (w.front + w.back > 0) layout.per_group = 0;
      std::optional<Error> err;
      for (Reading r : shape_readings(part, s.loose_hint, layout, prefs, &err)) {
        if (w.front + w.back > 0) {
          // With numbers left out, keep only readings the rest validates by itself (a unit
          // quaternion, a matrix or transform) or that follow an epoch-like time stamp.
          const bool epoch_like = w.front > 0 && std::abs(n.front().value) >= kEpochLike;
          const bool self_checked = r.kind == IntakeKind::Matrix || r.kind == IntakeKind::Transform ||
                                    (r.kind == IntakeKind::Quaternion && r.quaternion_norm &&
                                     std::abs(*r.quaternion_norm - 1.0) < kWindowUnitNorm);
          if (!self_checked && !epoch_like) continue;
        }
        r.score *= w.factor;
        if (w.front > 0) {
          r.warnings.push_back("the first " + std::string(w.front == 1 ? "number" : "two numbers") +
                               " (line " + std::to_string(n.front().line) + ", column " +
                               std::to_string(n.front().column) +
                               ") read as a time stamp or index, not used");
        }
        if (w.back > 0) {
          r.warnings.push_back("the last number (line " + std::to_string(n.back().line) + ", column " +
                               std::to_string(n.back().column) + ") read as a trailing field, not used");
        }
        readings.push_back(r);
      }
      if (err && !first_error) first_error = err;
    }
    result.shape = std::to_string(n.size()) + " numbers";
  }
  if (readings.empty()) {
    if (first_error) return *first_error;
    return count_error(text, s.loose);
  }
  if (lab.translation) {
    for (Reading& r : readings) {
      if (!r.translation) r.translation = lab.translation;
    }
  }
  finish_readings(&readings, prefs, &result.ambiguous);
  result.readings = std::move(readings);
  return result;
}

}  // namespace attiscope
