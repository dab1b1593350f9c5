// cmd_render.cpp: `attiscope render [TEXT] --out F.png`: a picture of the body in a pose,
// made headless (EGL surfaceless context, no display needed).
#include <cstdlib>
#include <iostream>
#include <optional>
#include <sstream>
#include <thread>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/mount.hpp"
#include "attiscope/core/mount_setup.hpp"
#include "attiscope/core/pose_text.hpp"
#include "cli/cli.hpp"
#include "cli/pose_input.hpp"

#ifdef ATTISCOPE_HAVE_RENDER
#include "attiscope/render/chain_overlay.hpp"
#include "attiscope/render/headless.hpp"
#include "attiscope/render/scene_renderer.hpp"
#endif

namespace attiscope::cli {

namespace {

/// Largest picture side accepted, in pixels.
constexpr int kMaxSide = 8192;
/// Default picture size.
constexpr int kDefaultWidth = 1024, kDefaultHeight = 768;
/// Camera distance that frames the body alone, and the body inside the gimbal rings.
constexpr double kBodyViewDistance = 6.2;
constexpr double kRingsViewDistance = 10.5;

std::string render_help() {
  std::string models, views;
#ifdef ATTISCOPE_HAVE_RENDER
  for (const auto& m : render::model_infos())
    models += std::string("    ") + m.name + ": " + m.summary + "\n";
  views = render::view_preset_list();
#else
  models = "    (this build has no renderer)\n";
#endif
  return "usage: attiscope render [TEXT] --out F.png [--size WxH] [--model NAME] [--view NAME]\n"
         "                        [--rings] [--ghost TEXT] [--world ENU|NED|XYZ] [--body FLU|FRD|RDF]\n"
         "                        [--model-file F.obj|F.stl] [--chain SETUP.toml [--select FRAME]\n"
         "                        [--chain-in FRAME]] [--as READING] [options]\n"
         "\n"
         "Draws the body in the pose read from TEXT (or standard input) and writes a PNG, with no\n"
         "display needed (EGL surfaceless; software rendering when there is no GPU).\n"
         "\n"
         "  --out F.png        the picture to write (required)\n"
         "  --size WxH         picture size in pixels (default 1024x768)\n"
         "  --model NAME       body model (default box):\n" +
         models +
         "  --model-file F     your own model, OBJ or STL, written in body coordinates\n"
         "  --view NAME        camera preset, in world terms: " +
         views +
         " (default iso)\n"
         "  --rings            draw the gimbal rings of the --euler convention around the body\n"
         "  --ghost TEXT       a reference pose (read like TEXT), drawn translucent\n"
         "  --world NAME       world frame: ENU (z up, default), NED (z down), XYZ (z up)\n"
         "  --body NAME        body frame the model is placed in: FLU (default), FRD, RDF (camera)\n"
         "  --no-labels        no axis letters\n"
         "  --chain FILE       draw the frame chain of a mount setup file (its frames and [[link]]s):\n"
         "                     one small triad per frame, named, in a row beside the body\n"
         "  --select FRAME     with --chain: highlight this frame (its axes lettered x, y, z)\n"
         "  --chain-in FRAME   with --chain: the frame whose axes are the world's (default the root)\n"
         "\n"
         "Examples:\n"
         "  attiscope render --as euler --euler ZYX \"30 20 10\" --out pose.png\n"
         "  attiscope render --as quat-wxyz \"0.7071 0 0 0.7071\" --model aircraft --view top --out a.png\n"
         "  attiscope render --as euler \"0 80 0\" --rings --out near-lock.png\n"
         "\n";
}

}  // namespace

#ifdef ATTISCOPE_HAVE_RENDER
namespace {

/// Reads one pose from a text with the shared options (core's read_pose_text, as every
/// command reads); errors say which text (`what`) they are about.
Expected<ExplicitReading> read_pose(const std::string& text, const CommonOptions& o, const char* what) {
  auto pose = read_pose_text(text, pose_options(o));
  if (!pose) {
    Error e = pose.error();
    e.message = std::string(what) + ": " + e.message;
    return e;
  }
  return ExplicitReading{pose.value().rotation, pose.value().warnings};
}

bool parse_size(const std::string& s, int* w, int* h) {
  const std::size_t x = s.find_first_of("xX");
  if (x == std::string::npos) return false;
  try {
    std::size_t a = 0, b = 0;
    *w = std::stoi(s.substr(0, x), &a);
    *h = std::stoi(s.substr(x + 1), &b);
    if (a != x || b != s.size() - x - 1) return false;
  } catch (...) {
    return false;
  }
  return *w >= 1 && *h >= 1 && *w <= kMaxSide && *h <= kMaxSide;
}

}  // namespace
#endif

int run_render(const std::vector<std::string>& args, Streams io) {
  CommonOptions o;
  const std::vector<OptionSpec> own = {{"--out", true},        {"--size", true},   {"--model", true},
                                       {"--view", true},       {"--rings", false}, {"--ghost", true},
                                       {"--world", true},      {"--body", true},   {"--model-file", true},
                                       {"--no-labels", false}, {"--chain", true},  {"--select", true},
                                       {"--chain-in", true}};
  if (auto err = parse_common(args, own, &o)) {
    io.err << "attiscope render: " << *err << "\n";
    return kExitBadInput;
  }
  if (o.help) {
    io.out << render_help() << common_options_help();
    return kExitOk;
  }
#ifndef ATTISCOPE_HAVE_RENDER
  io.err << "attiscope render: this build has no renderer (configured with ATTISCOPE_BUILD_GUI=OFF)\n";
  return kExitBadInput;
#else
  const auto out = o.last("--out");
  if (!out) {
    io.err << "attiscope render: --out F.png is required (see --help)\n";
    return kExitBadInput;
  }
  render::SceneState scene;
  scene.width_px = kDefaultWidth;
  scene.height_px = kDefaultHeight;
  if (auto s = o.last("--size")) {
    if (!parse_size(*s, &scene.width_px, &scene.height_px)) {
      io.err << "attiscope render: --size needs WxH with whole numbers from 1 to " << kMaxSide << ", got '"
             << *s << "'\n";
      return kExitBadInput;
    }
  }
  if (auto m = o.last("--model")) {
    auto kind = render::parse_model_kind(*m);
    if (!kind) {
      io.err << "attiscope render: unknown model '" << *m << "'; use one of " << render::model_list() << "\n";
      return kExitBadInput;
    }
    scene.model.kind = *kind;
  }
  if (auto v = o.last("--view")) {
    auto view = render::parse_view_preset(*v);
    if (!view) {
      io.err << "attiscope render: unknown view '" << *v << "'; use one of " << render::view_preset_list()
             << "\n";
      return kExitBadInput;
    }
    scene.camera = render::Camera::preset(*view);
  }
  if (auto w = o.last("--world")) {
    auto world = render::parse_world_frame(*w);
    if (!world) {
      io.err << "attiscope render: unknown world frame '" << *w << "'; use ENU, NED or XYZ\n";
      return kExitBadInput;
    }
    scene.world = *world;
  }
  if (auto b = o.last("--body")) {
    auto body = render::parse_body_frame(*b);
    if (!body) {
      io.err << "attiscope render: unknown body frame '" << *b << "'; use FLU, FRD or RDF\n";
      return kExitBadInput;
    }
    scene.body = *body;
  }
  scene.show_labels = !o.has("--no-labels");
  std::optional<render::Mesh> user_mesh;
  if (auto f = o.last("--model-file")) {
    auto mesh = render::load_mesh_file(*f);
    if (!mesh) {
      io.err << "attiscope render: " << mesh.error().describe() << "\n";
      return kExitBadInput;
    }
    user_mesh = std::move(mesh.value());
    scene.model.user_mesh = true;
  }
  const std::string text = input_text(o, io.in);
  if (auto missing = no_pose_given(text)) {
    io.err << "attiscope render: " << *missing << "\n";
    return kExitBadInput;
  }
  auto pose = read_pose(text, o, "the pose");
  if (!pose) {
    io.err << "attiscope render: " << pose.error().describe() << "\n";
    return kExitBadInput;
  }
  scene.world_R_body = pose.value().rotation;
  for (const std::string& w : pose.value().warnings) io.err << "attiscope render: warning: " << w << "\n";
  if (auto g = o.last("--ghost")) {
    auto ghost = read_pose(*g, o, "the ghost");
    if (!ghost) {
      io.err << "attiscope render: --ghost: " << ghost.error().describe() << "\n";
      return kExitBadInput;
    }
    scene.ghost_world_R_body = ghost.value().rotation;
  }
  scene.camera.distance = kBodyViewDistance;
  if (o.has("--rings")) {
    scene.rings = to_euler(scene.world_R_body, o.euler);
    scene.camera.distance = kRingsViewDistance;
  }
  if ((o.has("--select") || o.has("--chain-in")) && !o.has("--chain")) {
    io.err << "attiscope render: --select and --chain-in need --chain SETUP.toml\n";
    return kExitBadInput;
  }
  if (auto path = o.last("--chain")) {
    std::vector<std::string> warnings;
    auto setup = load_mount_setup(*path, &warnings);
    if (!setup) {
      io.err << "attiscope render: --chain: " << *path << ": " << setup.error().describe() << "\n";
      return kExitBadInput;
    }
    for (const std::string& w : warnings)
      io.err << "attiscope render: warning: " << *path << ": " << w << "\n";
    if (setup->chain.frames().empty()) {
      io.err << "attiscope render: --chain: " << *path << " has no frames or [[link]] tables\n";
      return kExitBadInput;
    }
    auto marks = render::scene_chain_marks(setup->chain, scene.world, o.last("--select").value_or(""),
                                           o.last("--chain-in").value_or(""));
    if (!marks) {
      io.err << "attiscope render: --chain: " << marks.error().describe() << "\n";
      return kExitBadInput;
    }
    scene.chain = marks.value();
    scene.camera = render::chain_framing(scene, scene.camera.distance);
    io.err << "attiscope render: note: " << kMountCaution << "\n";
  }

  auto context = render::HeadlessContext::create();
  if (!context) {
    io.err << "attiscope render: " << context.error().describe() << "\n";
    return kExitBadInput;
  }
  auto renderer = render::SceneRenderer::create();
  if (!renderer) {
    io.err << "attiscope render: " << renderer.error().describe() << "\n";
    return kExitBadInput;
  }
  if (user_mesh) renderer.value()->set_user_mesh(*user_mesh);
  const render::Image image = renderer.value()->render_image(scene);
  for (const std::string& w : renderer.value()->warnings())
    io.err << "attiscope render: warning: " << w << "\n";
  // The PNG is encoded on a second thread while this one releases the renderer and the GL
  // context (llvmpipe's threads, its memory): both take CPU time, and they overlap.
  std::optional<Expected<bool> > written;
  std::thread encoder([&] { written = render::write_png(*out, image); });
  renderer.value().reset();
  context.value().reset();
  encoder.join();
  if (!*written) {
    io.err << "attiscope render: " << written->error().describe() << "\n";
    return kExitBadInput;
  }
  if (scene.rings && scene.rings->at_lock) {
    io.err << "attiscope render: note: the pose is at gimbal lock in " << o.euler.name()
           << " (the third angle is set to 0 and the first carries the free turn)\n";
  }
  return kExitOk;
#endif
}

}  // namespace attiscope::cli
