// render_bench.cpp: figures for the renderer (a benchmark that prints, not a timed test).
//
//   render_bench [--frames N] [--only TEXT] [--pictures DIR]
//
// Prints the median and 90th percentile time of the 3D pass alone (scene, body, rings,
// labels and the antialiasing pass) into a 900x700 region, finished with glFinish, for
// several variants while the body turns a little every frame; under each, the same pass
// into the view's own 900x700 target without the copy into the region and the labels over
// it (the window's prepare() without a comparison); the same view when nothing
// changed (the kept scene is shown again), and the readback + PNG encode of a 1024x768
// picture. --only keeps the rows whose name holds TEXT (for a profiler); --pictures writes each
// variant's last frame into DIR as a PNG, to look at what the antialiasing does. The whole-process
// time of `attiscope render` is measured by bench/render_process.py.
#define GL_GLEXT_PROTOTYPES 1
#include <GL/glcorearb.h>

#include <algorithm>
#include <cctype>
#include <chrono>
#include <cstdio>
#include <cstring>
#include <ctime>
#include <filesystem>
#include <string>
#include <vector>

#include "attiscope/core/euler.hpp"
#include "attiscope/render/headless.hpp"
#include "attiscope/render/scene_renderer.hpp"

using namespace attiscope;
using namespace attiscope::render;

namespace {

constexpr double kDeg = 3.14159265358979323846 / 180.0;

struct Figures {
  double median_ms, p90_ms, cpu_median_ms;
};

/// CPU time of the whole process (all llvmpipe threads): a steadier figure than wall time
/// on a shared machine.
double cpu_ms() {
  timespec ts;
  clock_gettime(CLOCK_PROCESS_CPUTIME_ID, &ts);
  return static_cast<double>(ts.tv_sec) * 1e3 + static_cast<double>(ts.tv_nsec) * 1e-6;
}

template <class F>
Figures time_it(int frames, F&& f) {
  std::vector<double> t, c;
  f();  // warm-up: first-use uploads and shader variants
  glFinish();
  for (int i = 0; i < frames; ++i) {
    const auto a = std::chrono::steady_clock::now();
    const double c0 = cpu_ms();
    f();
    glFinish();
    t.push_back(std::chrono::duration<double, std::milli>(std::chrono::steady_clock::now() - a).count());
    c.push_back(cpu_ms() - c0);
  }
  std::sort(t.begin(), t.end());
  std::sort(c.begin(), c.end());
  return {t[t.size() / 2], t[std::min(t.size() - 1, t.size() * 9 / 10)], c[c.size() / 2]};
}

}  // namespace

int main(int argc, char** argv) {
  int frames = 40;
  std::string only, pictures;
  for (int i = 1; i + 1 < argc; ++i) {
    if (std::strcmp(argv[i], "--frames") == 0) frames = std::max(1, std::atoi(argv[i + 1]));
    if (std::strcmp(argv[i], "--only") == 0) only = argv[i + 1];
    if (std::strcmp(argv[i], "--pictures") == 0) pictures = argv[i + 1];
  }
  auto ctx = HeadlessContext::create();
  if (!ctx) {
    std::fprintf(stderr, "render_bench: %s\n", ctx.error().describe().c_str());
    return 2;
  }
  std::printf("renderer: %s, %d frames per figure\n", ctx.value()->renderer_name().c_str(), frames);
  struct Variant {
    const char* name;
    ModelKind model;
    bool rings, ghost;
    Antialiasing aa;
  };
  const Variant variants[] = {
      {"box, edge AA", ModelKind::Box, false, false, Antialiasing::Edges},
      {"box, no AA", ModelKind::Box, false, false, Antialiasing::None},
      // The scene the 3D pass target is set for: a body and the three gimbal rings. The
      // smoothing pass is no longer the default; its row is kept to compare.
      {"quadcopter + rings, edge AA", ModelKind::Quadcopter, true, false, Antialiasing::Edges},
      {"quadcopter + rings, post AA", ModelKind::Quadcopter, true, false, Antialiasing::Post},
      {"quadcopter + rings, no AA", ModelKind::Quadcopter, true, false, Antialiasing::None},
      {"quadcopter + rings + ghost, edge AA", ModelKind::Quadcopter, true, true, Antialiasing::Edges},
      {"quadcopter + rings + ghost, no AA", ModelKind::Quadcopter, true, true, Antialiasing::None},
      {"aircraft + rings, edge AA", ModelKind::Aircraft, true, false, Antialiasing::Edges},
  };
  for (const Variant& v : variants) {
    if (!only.empty() && std::string(v.name).find(only) == std::string::npos) continue;
    RendererOptions opt;
    opt.antialiasing = v.aa;
    auto r = SceneRenderer::create(opt);
    if (!r) {
      std::fprintf(stderr, "render_bench: %s\n", r.error().describe().c_str());
      return 2;
    }
    SceneState s;
    s.width_px = 900;
    s.height_px = 700;
    s.model.kind = v.model;
    s.world_R_body = from_euler(EulerConvention{}, Eigen::Vector3d(30, 20, 10) * kDeg);
    if (v.rings) s.rings = to_euler(s.world_R_body, EulerConvention{});
    if (v.ghost) s.ghost_world_R_body = from_euler(EulerConvention{}, Eigen::Vector3d(40, 25, 5) * kDeg);
    s.camera.distance = v.rings ? 8.6 : 6.2;
    // The window's case: draw into a region of a bound framebuffer (an FBO stands in here).
    GLuint fbo = 0, rb[2] = {0, 0};
    glGenFramebuffers(1, &fbo);
    glGenRenderbuffers(2, rb);
    glBindRenderbuffer(GL_RENDERBUFFER, rb[0]);
    glRenderbufferStorage(GL_RENDERBUFFER, GL_RGBA8, 1600, 900);
    glBindRenderbuffer(GL_RENDERBUFFER, rb[1]);
    glRenderbufferStorage(GL_RENDERBUFFER, GL_DEPTH24_STENCIL8, 1600, 900);
    glBindFramebuffer(GL_FRAMEBUFFER, fbo);
    glFramebufferRenderbuffer(GL_FRAMEBUFFER, GL_COLOR_ATTACHMENT0, GL_RENDERBUFFER, rb[0]);
    glFramebufferRenderbuffer(GL_FRAMEBUFFER, GL_DEPTH_STENCIL_ATTACHMENT, GL_RENDERBUFFER, rb[1]);
    const Region region{350, 100, 900, 700, 900};
    // The body turns a little every frame, as in the window while it is turned (an unchanged
    // scene would be reused, not drawn again).
    int frame = 0;
    auto turn = [&] {
      s.world_R_body = from_euler(EulerConvention{}, Eigen::Vector3d(30 + 0.5 * frame++, 20, 10) * kDeg);
      if (v.rings) s.rings = to_euler(s.world_R_body, EulerConvention{});
    };
    const Figures f = time_it(frames, [&] {
      turn();
      r.value()->draw(s, region);
    });
    std::printf("3D pass 900x700, %-36s median %6.2f ms  p90 %6.2f ms  cpu %6.2f ms  (%zu triangles)\n",
                v.name, f.median_ms, f.p90_ms, f.cpu_median_ms, r.value()->last_triangle_count());
    // The same pass into the view's own 900x700 target only: without the copy into the
    // region and the labels drawn over it (prepare() without a comparison).
    const Figures own = time_it(frames, [&] {
      turn();
      (void)r.value()->prepare(s, region.width, region.height, 0, false);
    });
    std::printf("  into its own target, %-31s median %6.2f ms  p90 %6.2f ms  cpu %6.2f ms\n",
                "no copy, no labels", own.median_ms, own.p90_ms, own.cpu_median_ms);
    if (v.aa == Antialiasing::Edges && !v.rings) {
      const Figures u = time_it(frames, [&] { r.value()->draw(s, region); });
      std::printf("3D view 900x700, %-35s median %6.2f ms  p90 %6.2f ms  cpu %6.2f ms  (reused: %s)\n",
                  "unchanged scene, edge AA", u.median_ms, u.p90_ms, u.cpu_median_ms,
                  r.value()->last_draw_reused() ? "yes" : "no");
    }
    glBindFramebuffer(GL_FRAMEBUFFER, 0);
    if (!pictures.empty()) {
      std::string file = v.name;
      for (char& ch : file)
        if (!std::isalnum(static_cast<unsigned char>(ch))) ch = '_';
      const std::string path = (std::filesystem::path(pictures) / (file + ".png")).string();
      if (auto written = write_png(path, r.value()->render_image(s)); !written)
        std::fprintf(stderr, "render_bench: %s\n", written.error().describe().c_str());
    }
    glDeleteFramebuffers(1, &fbo);
    glDeleteRenderbuffers(2, rb);
  }
  if (only.empty() || std::string("render_image").find(only) != std::string::npos) {
    auto r = SceneRenderer::create();
    SceneState s;
    s.width_px = 1024;
    s.height_px = 768;
    Image img;
    const Figures f = time_it(frames, [&] { img = r.value()->render_image(s); });
    std::printf(
        "render_image 1024x768 (pass + readback)          median %6.2f ms  p90 %6.2f ms  cpu %6.2f ms\n",
        f.median_ms, f.p90_ms, f.cpu_median_ms);
    const Figures p = time_it(std::max(frames / 4, 3), [&] {
      (void)write_png((std::filesystem::temp_directory_path() / "attiscope_render_bench.png").string(), img);
    });
    std::printf(
        "PNG encode 1024x768 (libdeflate level %d)          median %6.2f ms  p90 %6.2f ms  cpu %6.2f ms\n",
        kPngCompressionLevel, p.median_ms, p.p90_ms, p.cpu_median_ms);
  }
  return 0;
}
