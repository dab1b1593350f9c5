// cmd_track.cpp: `attiscope track FILE`: summary and diagnosis of a pose log, and an
// optional clean copy exported as CSV. The Track panel calls the same core functions.
#include <cmath>
#include <iostream>

#include "attiscope/core/columns.hpp"
#include "attiscope/core/convention.hpp"
#include "attiscope/core/track_analysis.hpp"
#include "attiscope/core/track_clean.hpp"
#include "attiscope/core/track_report.hpp"
#include "cli/cli.hpp"

namespace attiscope::cli {

namespace {

const char* kTrackHelp =
    "usage: attiscope track FILE [--json] [--euler SEQ] [--rate-limit DEG_PER_S] [options]\n"
    "\n"
    "Reads a pose log (columns separated by commas, semicolons, tabs or spaces; the time and\n"
    "rotation columns are found from the header and the numbers) and prints its summary and\n"
    "every discontinuity found. An event's sample is the 0-based index of the first sample\n"
    "after the discontinuity. Kinds: sign_flip (all four quaternion numbers changed sign, same\n"
    "rotation), wrap (an Euler angle crossed +/-180), near_lock (an Euler angle jumped while\n"
    "the middle angle was close to lock), non_unit, time_backwards, time_repeat, fast_motion\n"
    "(angular rate beyond --rate-limit). Rows that cannot be read are counted and listed with\n"
    "their line numbers; the rest loads. A log of Euler angles (columns named roll, pitch, yaw;\n"
    "phi, theta, psi; heading, pitch, bank; or as the --convention file names its angles, with\n"
    "an optional unit suffix such as _deg or (rad)) is read as intrinsic ZYX (common names) or\n"
    "the house convention.\n"
    "\n"
    "Reading options:\n"
    "  --as READING             quat-wxyz, quat-xyzw, matrix-rows, matrix-cols or euler\n"
    "  --as euler --euler SEQ [--intrinsic|--extrinsic] [--deg|--rad]\n"
    "                           read the angle columns in this convention and unit; between\n"
    "                           Tait-Bryan sequences each column keeps its axis\n"
    "\n"
    "Diagnosis options:\n"
    "  --euler SEQ, --intrinsic, --extrinsic   convention of the wrap and lock checks (ZYX)\n"
    "  --rate-limit DEG_PER_S   report fast_motion beyond this angular rate (default: none)\n"
    "  --lock-margin DEG        near lock below this lock margin (default 5)\n"
    "  --unit-tolerance X       non_unit when | |q| - 1 | > X (default 0.001)\n"
    "\n"
    "Clean copy (normalised, sign-continuous, Euler angles unwrapped; times unchanged):\n"
    "  --export OUT.csv         write it, 17 significant digits, and list the changes\n"
    "  --export-as KIND         quaternion (default), euler (--euler, --deg/--rad), matrix\n"
    "  --export-layout L        quaternion numbers wxyz (default) or xyzw\n"
    "  --export-algebra A       hamilton (default) or jpl\n"
    "  --export-direction D     body-to-world (default: world_R_body) or world-to-body\n"
    "  --export-storage S       matrix rows (default) or columns\n"
    "  --no-unwrap              Euler export: keep the angles wrapped\n"
    "\n"
    "Examples:\n"
    "  attiscope track assets/logs/rover_yard_run.csv\n"
    "  attiscope track flight.csv --json --euler 321 --rate-limit 90\n"
    "  attiscope track flight.csv --export clean.csv --export-as euler --euler ZYX --deg\n"
    "\n";

const std::vector<OptionSpec> kTrackOptions = {
    {"--rate-limit", true},     {"--lock-margin", true},      {"--unit-tolerance", true},
    {"--export", true},         {"--export-as", true},        {"--export-layout", true},
    {"--export-algebra", true}, {"--export-direction", true}, {"--export-storage", true},
    {"--no-unwrap", false},
};

// A positive finite number from an option value, or an error message.
std::optional<std::string> parse_positive(const CommonOptions& o, const std::string& name, double* out) {
  const auto v = o.last(name);
  if (!v) return std::nullopt;
  try {
    std::size_t used = 0;
    const double x = std::stod(*v, &used);
    if (used != v->size() || !std::isfinite(x) || x <= 0.0) throw std::invalid_argument(*v);
    *out = x;
  } catch (const std::exception&) {
    return name + " needs a positive number, got '" + *v + "'";
  }
  return std::nullopt;
}

// Picks one of a few names for an option value.
template <class T>
std::optional<std::string> parse_choice(const CommonOptions& o, const std::string& name,
                                        const std::vector<std::pair<std::string, T>>& choices, T* out) {
  const auto v = o.last(name);
  if (!v) return std::nullopt;
  std::string list;
  for (const auto& [key, value] : choices) {
    if (*v == key) {
      *out = value;
      return std::nullopt;
    }
    list += (list.empty() ? "" : ", ") + key;
  }
  return name + " takes one of " + list + ", got '" + *v + "'";
}

std::optional<std::string> export_options(const CommonOptions& o, TrackExportOptions* e) {
  e->euler = o.euler;
  e->unit = o.unit;
  e->unwrap = !o.has("--no-unwrap");
  using R = ExportRepresentation;
  if (auto err = parse_choice<R>(o, "--export-as",
                                 {{"quaternion", R::Quaternion},
                                  {"quat", R::Quaternion},
                                  {"euler", R::Euler},
                                  {"matrix", R::Matrix}},
                                 &e->representation))
    return err;
  if (auto err = parse_choice<QuatLayout>(
          o, "--export-layout", {{"wxyz", QuatLayout::ScalarFirst}, {"xyzw", QuatLayout::ScalarLast}},
          &e->quaternion.layout))
    return err;
  if (auto err = parse_choice<QuatAlgebra>(o, "--export-algebra",
                                           {{"hamilton", QuatAlgebra::Hamilton}, {"jpl", QuatAlgebra::Jpl}},
                                           &e->quaternion.algebra))
    return err;
  Direction dir = Direction::BodyToWorld;
  if (auto err = parse_choice<Direction>(
          o, "--export-direction",
          {{"body-to-world", Direction::BodyToWorld}, {"world-to-body", Direction::WorldToBody}}, &dir))
    return err;
  e->quaternion.direction = dir;
  e->matrix.direction = dir;
  if (auto err = parse_choice<MatrixStorage>(
          o, "--export-storage", {{"rows", MatrixStorage::Rows}, {"columns", MatrixStorage::Columns}},
          &e->matrix.storage))
    return err;
  return std::nullopt;
}

// Reads a pose log into a Track with the intake's column finding and reader; --as forces
// the reading of the rotation columns (for Euler angles with --euler, --intrinsic,
// --extrinsic, --deg and --rad); a --convention file's Euler names, convention and unit are
// the house choices. `notes` receives how the columns were chosen, `used` the mapping read.
Expected<Track> read_log(const std::string& path, const CommonOptions& o, std::vector<std::string>* notes,
                         ColumnMapping* used) {
  auto head = read_file_head(path);
  if (!head) return head.error();
  ColumnPreferences prefs = o.convention ? column_preferences(*o.convention) : ColumnPreferences{};
  if (o.as == ReadingKind::QuatXyzw) prefs.quat_layout = QuatLayout::ScalarLast;
  if (o.as == ReadingKind::MatrixCols) prefs.matrix_storage = MatrixStorage::Columns;
  if (o.as == ReadingKind::Euler && o.unit_given) prefs.euler_unit = o.unit;
  auto found = find_columns(head.value(), prefs);
  if (!found) return found.error();
  ColumnMapping mapping = found.value();
  if (o.as) {
    std::optional<TrackForm> forced;
    switch (*o.as) {
      case ReadingKind::QuatWxyz: forced = TrackForm::QuatWxyz; break;
      case ReadingKind::QuatXyzw: forced = TrackForm::QuatXyzw; break;
      case ReadingKind::MatrixRows: forced = TrackForm::MatrixRows; break;
      case ReadingKind::MatrixCols: forced = TrackForm::MatrixCols; break;
      case ReadingKind::Euler: forced = TrackForm::Euler; break;
      default: break;
    }
    if (!forced)
      return Error{"--as " + reading_kind_name(*o.as) + " is not a track reading: use " +
                   "quat-wxyz, quat-xyzw, matrix-rows, matrix-cols or euler"};
    // --as went into find_columns as the house choice, which decides when the header and the
    // numbers do not. When they do decide, the columns are read as they say (the reader
    // already put them in the form's order), and the note says --as was not needed.
    const std::size_t forced_n = track_form_numbers(*forced), found_n = track_form_numbers(mapping.form);
    if (forced_n != found_n) {
      return Error{"--as " + reading_kind_name(*o.as) + " does not fit this log: its rotation columns are " +
                   (found_n == 4   ? "four quaternion numbers"
                    : found_n == 9 ? "nine matrix numbers"
                                   : "three Euler angles")};
    }
    if (*forced == TrackForm::Euler) {
      // --euler and --deg/--rad say how to read the angle columns. Between two Tait-Bryan
      // sequences each column keeps its axis (roll stays the angle about x) and the columns
      // are put in the new application order; otherwise they stay in the order found.
      if (o.euler_given && o.euler != mapping.euler) {
        std::string how = "in the order found";
        if (!o.euler.proper() && !mapping.euler.proper()) {
          std::array<int, 9> reordered = mapping.rotation_columns;
          for (std::size_t k = 0; k < 3; ++k) {
            for (std::size_t j = 0; j < 3; ++j) {
              if (mapping.euler.axes[j] == o.euler.axes[k]) reordered[k] = mapping.rotation_columns[j];
            }
          }
          mapping.rotation_columns = reordered;
          how = "each column keeping its axis";
        }
        notes->push_back("--as euler --euler: angle columns read as " + o.euler.name() + " instead of " +
                         mapping.euler.name() + ", " + how);
        mapping.euler = o.euler;
      }
      if (o.unit_given && o.unit != mapping.euler_unit) {
        notes->push_back(std::string("--as euler: angles read in ") + angle_unit_name(o.unit) +
                         " instead of " + angle_unit_name(mapping.euler_unit));
        mapping.euler_unit = o.unit;
      }
      assign_column_roles(&mapping);
    } else if (*forced != mapping.form) {
      notes->push_back("--as " + reading_kind_name(*o.as) + " not applied: the log's columns decide (" +
                       track_form_name(mapping.form) + " after ordering)");
    }
  }
  for (const std::string& n : mapping.notes) notes->push_back(n);
  if (mapping.ambiguous && !o.as) {
    notes->push_back("the columns' reading is ambiguous: check it, or force one with --as");
  }
  *used = mapping;
  return read_track_file(path, mapping);
}

}  // namespace

int run_track(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args, kTrackOptions, &o)) {
    io.err << "attiscope track: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << kTrackHelp << common_options_help();
    return kExitOk;
  }
  if (o.positional.size() != 1) {
    io.err << "attiscope track: give one log file (see attiscope track --help)\n";
    return kExitBadInput;
  }
  TrackDiagnosisOptions diag;
  diag.euler = o.euler;
  double rate_limit_deg_s = 0.0, lock_margin_deg = 0.0, unit_tolerance = 0.0;
  for (auto err : {parse_positive(o, "--rate-limit", &rate_limit_deg_s),
                   parse_positive(o, "--lock-margin", &lock_margin_deg),
                   parse_positive(o, "--unit-tolerance", &unit_tolerance)}) {
    if (err) {
      io.err << "attiscope track: " << *err << "\n";
      return kExitBadInput;
    }
  }
  if (o.has("--rate-limit")) diag.rate_limit_rad_s = rate_limit_deg_s * M_PI / 180.0;
  if (o.has("--lock-margin")) diag.near_lock_margin_rad = lock_margin_deg * M_PI / 180.0;
  if (o.has("--unit-tolerance")) diag.unit_tolerance = unit_tolerance;
  TrackExportOptions exp;
  if (auto err = export_options(o, &exp)) {
    io.err << "attiscope track: " << *err << "\n";
    return kExitBadInput;
  }

  const std::string& path = o.positional[0];
  std::vector<std::string> notes;
  ColumnMapping mapping;
  auto track = read_log(path, o, &notes, &mapping);
  if (!track) {
    io.err << "attiscope track: " << path << ": " << track.error().describe() << "\n";
    return kExitBadInput;
  }
  const Track& t = track.value();
  const TrackDiagnosis d = diagnose_track(t, diag);

  std::optional<TrackExportSummary> exported;
  if (auto out_path = o.last("--export")) {
    auto summary = export_clean_track(t, exp, *out_path);
    if (!summary) {
      io.err << "attiscope track: " << *out_path << ": " << summary.error().describe() << "\n";
      return kExitBadInput;
    }
    exported = std::move(summary.value());
  }
  if (o.json) {
    nlohmann::json j = track_json(t, d, diag, exported);
    j["column_notes"] = notes;
    if (mapping.form == TrackForm::Euler) {
      j["euler_columns"] = {{"sequence", mapping.euler.sequence()},
                            {"kind", mapping.euler.kind_name()},
                            {"unit", angle_unit_name(mapping.euler_unit)}};
    }
    io.out << j.dump(2) << "\n";
  } else {
    io.out << "track: " << path << "\n" << track_table(t, d, diag, exported);
    for (const std::string& n : notes) io.out << "note: " << n << "\n";
  }
  return kExitOk;
}

}  // namespace attiscope::cli
