// cmd_mount.cpp: `attiscope mount`: the mount check. A nominal mount (from the drawing)
// against a measured one (a calibration value, or solved from vector pairs), with the error
// in vehicle words, pass or fail against a tolerance, and a guess at the cause.
#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <ostream>
#include <sstream>

#include "attiscope/core/mount.hpp"
#include "attiscope/core/mount_report.hpp"
#include "attiscope/core/mount_setup.hpp"
#include "attiscope/core/report.hpp"
#include "attiscope/core/wahba.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

#ifdef ATTISCOPE_HAVE_RENDER
#include "attiscope/render/headless.hpp"
#include "attiscope/render/mount_picture.hpp"
#endif

namespace attiscope::cli {

namespace {

constexpr double kDeg = 180.0 / M_PI;

const char* kMountHelp =
    "usage: attiscope mount --nominal TEXT --measured TEXT [--tolerance DEG] [options]\n"
    "       attiscope mount --vectors FILE [--nominal TEXT] [--tolerance DEG] [options]\n"
    "       attiscope mount --list-aligned [--vehicle CODE]\n"
    "\n"
    "Checks a sensor mount. A mount is vehicle_R_sensor: it maps sensor-frame coordinates into\n"
    "vehicle-frame coordinates (its columns are the sensor axes in vehicle axes).\n"
    "\n"
    "  --nominal TEXT     the mount on the drawing: numbers (read as convert reads them: --as,\n"
    "                     else the --convention house's form, else the paste reader's top\n"
    "                     reading), or words naming two sensor\n"
    "                     axes: \"sensor x toward vehicle aft, sensor z down\" (see --list-aligned)\n"
    "  --trim \"A B C\"     small turns in degrees about the vehicle's x, y, z applied to the nominal\n"
    "  --measured TEXT    the mount as calibrated (same readings as --nominal)\n"
    "  --nominal-direction, --measured-direction  sensor-to-vehicle (default) or\n"
    "                     vehicle-to-sensor: which way round the value was written\n"
    "  --vectors FILE     solve the measured mount from vector pairs: each line\n"
    "                     `sx sy sz vx vy vz [w]`, a direction in sensor axes, the same direction in\n"
    "                     vehicle axes, and a weight (default 1); '#' starts a comment; - is stdin\n"
    "  --tolerance DEG    largest error that passes (default 0.5); exit 1 beyond it\n"
    "  --vehicle CODE     where the vehicle's x, y, z point: FRD, FLU, ... letters from F B R L U D;\n"
    "                     default: the setup file's, else the --convention file's body frame,\n"
    "                     else FRD\n"
    "  --setup FILE       read the nominal, measured, tolerance and vehicle axes from a mount\n"
    "                     setup file (TOML); options given here override it\n"
    "  --save FILE        write the setup (with the measured mount) to FILE, atomically\n"
    "  --sheet FILE       write the text check sheet (inputs, result, tolerance, date, caution)\n"
    "  --sheet-png FILE   write the check sheet's picture: the vehicle model with the sensor at the\n"
    "                     nominal mount (ghost) and the measured one (solid), in four views named by\n"
    "                     the vehicle (from behind, from the left, from above, from ahead, right and\n"
    "                     above), with the setup's frame chain when it has one (needs the renderer)\n"
    "  --vehicle-model NAME  the vehicle drawn on the picture: aircraft (default), rover,\n"
    "                     quadcopter, box\n"
    "  --sensor-names \"A B C\"  the sensor's own names for its x, y, z axes on the picture\n"
    "                     (default \"sx sy sz\")\n"
    "  --select FRAME     the chain frame highlighted on the picture\n"
    "  --list-aligned     print the 24 axis-aligned mounts and their names\n"
    "  --relative \"A B\"   with --setup: frame A relative to frame B from the file's frame chain\n"
    "                     (A_R_B maps B coordinates into A, and B's origin in A, metres)\n"
    "\n"
    "The vector solve is the SVD solution of Wahba's problem (Markley 1988), cross-checked with\n"
    "Davenport's q-method and TRIAD (Shuster & Oh 1981). Vectors too close to parallel are refused,\n"
    "saying which turn they cannot fix: one resting vector (gravity) gives tilt, never heading.\n"
    "An error near 90, 120 or 180 degrees is most likely a convention or direction mistake: the\n"
    "check re-reads the measured value (inverse, transposed, quaternion layout, Euler order,\n"
    "units) and says which reading would explain it.\n"
    "\n"
    "Exit codes: 0 within tolerance (or no nominal given), 1 beyond it, 2 bad input or a refused\n"
    "(unobservable) solve.\n"
    "\n"
    "Examples (invented):\n"
    "  attiscope mount --nominal \"sensor x toward vehicle aft, sensor z down\" \\\n"
    "                  --measured \"0.0087 0.0002 -0.0001 0.9999\" --as quat-wxyz --tolerance 1.5\n"
    "  attiscope mount --vectors rover_tilts.txt --nominal \"x forward, z down\" --json\n"
    "\n";

std::string fmt(double v, int precision) {
  if (v == 0.0) v = 0.0;
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*g", precision, v);
  return buf;
}

std::string quat_text(const Rotation& r, int p) {
  const Eigen::Quaterniond q = r.quaternion();
  return "w " + fmt(q.w(), p) + "  x " + fmt(q.x(), p) + "  y " + fmt(q.y(), p) + "  z " + fmt(q.z(), p);
}

int bad(Streams io, const std::string& message) {
  io.err << "attiscope mount: " << message << "\n";
  return kExitBadInput;
}

Expected<bool> parse_direction(const CommonOptions& o, const std::string& option, bool* inverted) {
  *inverted = false;
  if (auto d = o.last(option)) {
    if (*d == "vehicle-to-sensor") {
      *inverted = true;
    } else if (*d != "sensor-to-vehicle") {
      return Error{option + " is sensor-to-vehicle or vehicle-to-sensor, got '" + *d + "'"};
    }
  }
  return true;
}

int list_aligned(const VehicleAxes& names, const CommonOptions& o, Streams io) {
  const std::vector<AxisAlignedMount> all = axis_aligned_mounts(names);
  if (o.json) {
    nlohmann::json list = nlohmann::json::array();
    for (const AxisAlignedMount& m : all) {
      list.push_back({{"name", m.name},
                      {"quaternion", quaternion_json(m.vehicle_R_sensor)},
                      {"matrix", matrix_json(m.vehicle_R_sensor)}});
    }
    io.out << nlohmann::json{{"vehicle_axes", names.code()}, {"mounts", list}}.dump(2) << "\n";
    return kExitOk;
  }
  io.out << "The 24 axis-aligned mounts, vehicle axes " << names.code()
         << " (vehicle_R_sensor quaternion):\n";
  for (std::size_t i = 0; i < all.size(); ++i) {
    io.out << (i + 1 < 10 ? " " : "") << i + 1 << "  " << all[i].name << "\n      "
           << quat_text(all[i].vehicle_R_sensor, 6) << "\n";
  }
  return kExitOk;
}

// `--relative "A B"`: A_T_B from the setup's frame chain.
int relative_frames(const MountSetup& setup, const std::string& pair, const CommonOptions& o, Streams io) {
  std::istringstream words(pair);
  std::string a, b, extra;
  if (!(words >> a >> b) || (words >> extra))
    return bad(io, "--relative needs two frame names, e.g. \"vehicle sensor\"");
  if (setup.chain.frames().empty()) return bad(io, "--relative needs a --setup file with frames and links");
  auto t = setup.chain.relative(a, b);
  if (!t) return bad(io, "--relative: " + t.error().describe());
  const Rotation& a_R_b = t->rotation;
  if (o.json) {
    io.out << nlohmann::json{{"from", b},
                             {"to", a},
                             {"relation",
                              a + "_R_" + b + " maps " + b + " coordinates into " + a + " coordinates"},
                             {"quaternion", quaternion_json(a_R_b)},
                             {"matrix", matrix_json(a_R_b)},
                             {"translation_m", {t->translation.x(), t->translation.y(), t->translation.z()}},
                             {"path_a", setup.chain.path_from_root(a)},
                             {"path_b", setup.chain.path_from_root(b)}}
                  .dump(2)
           << "\n";
    return kExitOk;
  }
  const int p = o.precision;
  io.out << a << "_R_" << b << "   " << quat_text(a_R_b, p) << "   (maps " << b << " coordinates into " << a
         << " coordinates)\n";
  const Eigen::Matrix3d m = a_R_b.matrix();
  for (int i = 0; i < 3; ++i) {
    io.out << "    " << fmt(m(i, 0), p) << "  " << fmt(m(i, 1), p) << "  " << fmt(m(i, 2), p) << "\n";
  }
  io.out << b << " origin in " << a << "   (" << fmt(t->translation.x(), p) << ", "
         << fmt(t->translation.y(), p) << ", " << fmt(t->translation.z(), p) << ") m\n";
  return kExitOk;
}

}  // namespace

int run_mount(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  if (auto err = parse_common(args,
                              {{"--nominal", true},
                               {"--measured", true},
                               {"--vectors", true},
                               {"--tolerance", true},
                               {"--vehicle", true},
                               {"--trim", true},
                               {"--nominal-direction", true},
                               {"--measured-direction", true},
                               {"--setup", true},
                               {"--save", true},
                               {"--sheet", true},
                               {"--sheet-png", true},
                               {"--vehicle-model", true},
                               {"--sensor-names", true},
                               {"--select", true},
                               {"--relative", true},
                               {"--list-aligned", false}},
                              &o)) {
    return bad(io, *err);
  }
  if (o.help) {
    io.out << kMountHelp << common_options_help() << "\n" << kMountCaution << "\n";
    return kExitOk;
  }
  if (!o.positional.empty()) {
    return bad(io, "unexpected '" + o.positional.front() +
                       "': give mounts with --nominal and --measured (see --help)");
  }
  for (const char* picture_option : {"--select", "--vehicle-model", "--sensor-names"}) {
    if (o.has(picture_option) && !o.has("--sheet-png"))
      return bad(io,
                 std::string(picture_option) + " shapes the check-sheet picture: give --sheet-png F.png too");
  }
  MountSetup setup;
  std::vector<std::string> warnings;
  if (auto path = o.last("--setup")) {
    auto s = load_mount_setup(*path, &warnings);
    if (!s) return bad(io, *path + ": " + s.error().describe());
    setup = s.value();
  }
  // Without a setup file the turns are named in the house's body frame when one is loaded.
  if (!o.has("--setup")) setup.vehicle_axes = default_vehicle_axes(o.convention ? &*o.convention : nullptr);
  VehicleAxes names = setup.vehicle_axes;
  if (auto code = o.last("--vehicle")) {
    auto v = parse_vehicle_axes(*code);
    if (!v) return bad(io, "--vehicle: " + v.error().describe());
    names = v.value();
  }
  setup.vehicle_axes = names;
  if (o.has("--list-aligned")) return list_aligned(names, o, io);
  if (auto rel = o.last("--relative")) return relative_frames(setup, *rel, o, io);

  double tolerance_deg = setup.tolerance_deg;
  if (auto t = o.last("--tolerance")) {
    auto v = parse_number_option("--tolerance", *t, true);
    if (!v) return bad(io, v.error().describe());
    tolerance_deg = v.value();
  }
  setup.tolerance_deg = tolerance_deg;

  // The nominal mount.
  std::optional<MountReading> nominal;
  if (auto text = o.last("--nominal")) {
    bool inverted = false;
    auto d = parse_direction(o, "--nominal-direction", &inverted);
    if (!d) return bad(io, d.error().describe());
    auto m = read_mount_text(*text, pose_options(o), names, inverted);
    if (!m) return bad(io, "--nominal: " + m.error().describe());
    nominal = m.value();
    setup.nominal = nominal->vehicle_R_sensor;
    setup.nominal_words = looks_like_mount_words(*text) && !inverted ? *text : "";
    setup.trim_deg = Eigen::Vector3d::Zero();
  } else if (setup.nominal) {
    nominal = MountReading{*setup.nominal, "from the setup file", {}, {}};
  }
  if (auto trim = o.last("--trim")) {
    if (!nominal) return bad(io, "--trim needs a --nominal mount to trim");
    auto numbers = scan_numbers(*trim);
    if (!numbers) return bad(io, "--trim: " + numbers.error().describe());
    if (numbers.value().size() != 3)
      return bad(io, "--trim needs three angles in degrees (about vehicle x, y, z)");
    Eigen::Vector3d t;
    for (int i = 0; i < 3; ++i) t(i) = numbers.value()[static_cast<std::size_t>(i)].value;
    nominal->vehicle_R_sensor = trimmed_mount(nominal->vehicle_R_sensor, t / kDeg);
    nominal->description += ", trimmed by (" + fmt(t(0), 6) + ", " + fmt(t(1), 6) + ", " + fmt(t(2), 6) +
                            ") degrees about vehicle x, y, z";
    setup.nominal = nominal->vehicle_R_sensor;
    if (!setup.nominal_words.empty()) setup.trim_deg = t;
  }
  if (nominal) {
    for (const std::string& w : nominal->warnings) warnings.push_back("nominal: " + w);
  }

  // The measured mount.
  MountInputs inputs;
  inputs.names = names;
  inputs.tolerance_rad = tolerance_deg / kDeg;
  inputs.nominal = nominal;
  if (o.has("--measured") && o.has("--vectors")) return bad(io, "give --measured or --vectors, not both");
  if (auto text = o.last("--measured")) {
    bool inverted = false;
    auto d = parse_direction(o, "--measured-direction", &inverted);
    if (!d) return bad(io, d.error().describe());
    auto m = read_mount_text(*text, pose_options(o), names, inverted);
    if (!m) return bad(io, "--measured: " + m.error().describe());
    inputs.measured = m.value();
  } else if (auto path = o.last("--vectors")) {
    auto file = read_input_file(*path, io.in);
    if (!file) return bad(io, file.error().describe());
    auto pairs = parse_vector_pairs(file.value());
    if (!pairs) return bad(io, *path + ": " + pairs.error().describe());
    inputs.vectors = pairs.value();
    inputs.vectors_source = *path;
  } else if (setup.measured) {
    inputs.measured = MountReading{*setup.measured, "from the setup file", {}, {}};
  } else {
    return bad(io, "give the measured mount with --measured TEXT or --vectors FILE (see --help)");
  }
  auto result = run_mount_check(inputs);
  if (!result)
    return bad(io, (inputs.vectors ? inputs.vectors_source + ": " : "") + result.error().describe());
  MountResult& r = result.value();
  r.warnings.insert(r.warnings.begin(), warnings.begin(), warnings.end());

  if (auto path = o.last("--save")) {
    if (r.measured) {
      setup.measured = r.measured->vehicle_R_sensor;
      setup.measured_note = r.measured->description;
    }
    auto saved = save_mount_setup(*path, setup);
    if (!saved) return bad(io, "--save: " + saved.error().describe());
  }
  if (auto path = o.last("--sheet")) {
    auto written = write_text_file(*path, mount_report_text(r, o.precision, utc_date_time()));
    if (!written) return bad(io, "--sheet: " + written.error().describe());
  }
  if (auto path = o.last("--sheet-png")) {
    if (!r.nominal || !r.measured) return bad(io, "--sheet-png needs a nominal and a measured mount");
#ifdef ATTISCOPE_HAVE_RENDER
    render::MountPictureOptions picture;
    if (auto m = o.last("--vehicle-model")) {
      auto kind = render::parse_model_kind(*m);
      if (!kind)
        return bad(io, "--vehicle-model: unknown model '" + *m + "'; use one of " + render::model_list());
      picture.vehicle_model = *kind;
    }
    if (auto n = o.last("--sensor-names")) {
      std::istringstream words(*n);
      std::string extra;
      if (!(words >> picture.sensor_axis_names[0] >> picture.sensor_axis_names[1] >>
            picture.sensor_axis_names[2]) ||
          (words >> extra))
        return bad(io, "--sensor-names needs three names, for the sensor's x, y and z (e.g. \"X Y Z\")");
    }
    if (!setup.chain.frames().empty()) picture.chain = setup.chain;
    if (auto sel = o.last("--select")) {
      if (!picture.chain) return bad(io, "--select needs a --setup file with a frame chain");
      if (!setup.chain.has_frame(*sel))
        return bad(io, "--select: no frame called '" + *sel + "' in the setup");
      picture.chain_selected = *sel;
    }
    picture.notes = mount_picture_notes(r, 4, utc_date_time());
    auto context = render::HeadlessContext::create();
    if (!context) return bad(io, "--sheet-png: " + context.error().describe());
    auto renderer = render::SceneRenderer::create();
    if (!renderer) return bad(io, "--sheet-png: " + renderer.error().describe());
    auto written = render::write_mount_picture(*renderer.value(), *path, r.nominal->vehicle_R_sensor,
                                               r.measured->vehicle_R_sensor, r.names, picture);
    if (!written) return bad(io, "--sheet-png: " + written.error().describe());
#else
    return bad(io, "--sheet-png: this build has no renderer (configure with ATTISCOPE_BUILD_GUI=ON)");
#endif
  }

  if (o.json) {
    io.out << mount_json(r).dump(2) << "\n";
  } else {
    io.out << mount_report_text(r, o.precision);
  }
  if (r.refused()) {
    std::string lines;
    for (int line : r.vector_lines) lines += (lines.empty() ? "" : ", ") + std::to_string(line);
    io.err << "attiscope mount: " << inputs.vectors_source << ": lines " << lines
           << ": refused: " << r.solve->observability.sentence << "\n";
    return kExitBadInput;
  }
  return r.failed() ? kExitCheckFailed : kExitOk;
}

}  // namespace attiscope::cli
