// window.cpp: the GLFW window, the Dear ImGui frame, the panel layout and the main loop.
// The loop waits for events and draws only when something happened (input, a resize, the
// spin animation, a pending settings save), so an idle window costs almost nothing on the
// CPU renderer. Test scripts (script.hpp) and the frame-time benchmark drive the same loop.
#include <GLFW/glfw3.h>
#include <imgui.h>
#include <imgui_impl_glfw.h>
#include <imgui_impl_opengl3.h>
#include <stb_image_write.h>

#include <unistd.h>
#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <optional>
#include <sstream>
#include <thread>

#include "attiscope/core/columns.hpp"
#include "gui/card_values.hpp"
#include "gui/gui.hpp"
#include "gui/plot_picture.hpp"
#include "gui/redraw.hpp"
#include "gui/script.hpp"
#include "gui/ui.hpp"
#include "gui/views.hpp"

namespace attiscope::gui {

namespace {

using Clock = std::chrono::steady_clock;

constexpr double kPi = 3.14159265358979323846;
constexpr float kBaseFontPx = 16.0f;
/// Frames drawn after each wake-up, so hover and click state settle.
constexpr int kFramesAfterEvent = 2;
/// The spin animation's turn rate about the body z axis.
constexpr double kSpinRadPerS = 30.0 * kPi / 180.0;
/// Longest wait between frames while something is animating or due.
constexpr double kAnimationWaitS = 1.0 / 60.0;
/// A script's `wait` step sleeps this long between frames.
constexpr double kScriptWaitS = 0.01;

const char* kWindowHelp =
    "usage: attiscope gui [FILE...] [--size WxH] [--script FILE] [--bench N]\n"
    "\n"
    "Opens the window on the demo scene (an invented survey-aircraft pose). FILE: a house\n"
    "convention (.toml) to load, or a pose log to open in the Track panel (CSV, TSV,\n"
    "space-separated columns or JSON lines); a file dropped on the window opens the same way.\n"
    "  --size WxH      initial window size in screen coordinates\n"
    "  --full-redraw   repaint the whole window every frame (by default, on Mesa's software\n"
    "                  renderer, a frame repaints only the parts that changed)\n"
    "  --script FILE   drive the window with a test script, then close (see app/gui/script.hpp)\n"
    "  --bench N       frame-time benchmark: N frames while the body turns (or, with a log,\n"
    "                  while the Track panel scrubs through it), then print the median and\n"
    "                  95th percentile frame time and the time to the first frame\n"
    "Settings and the panel layout are kept in $XDG_CONFIG_HOME/attiscope (else\n"
    "~/.config/attiscope).\n";

struct WindowOptions {
  std::vector<std::string> files;
  std::optional<std::string> script_path;
  int bench_frames = 0;
  bool full_redraw = false;
  int width = 0;
  int height = 0;
};

std::optional<std::string> parse_options(const std::vector<std::string>& args, WindowOptions* o, bool* help) {
  for (std::size_t i = 0; i < args.size(); ++i) {
    const std::string& a = args[i];
    auto value = [&](std::string* out) -> bool {
      if (i + 1 >= args.size()) return false;
      *out = args[++i];
      return true;
    };
    std::string v;
    if (a == "--help" || a == "-h") {
      *help = true;
    } else if (a == "--script") {
      if (!value(&v)) return "--script needs a FILE";
      o->script_path = v;
    } else if (a == "--bench") {
      if (!value(&v)) return "--bench needs a frame count";
      o->bench_frames = std::atoi(v.c_str());
      if (o->bench_frames < 1) return "--bench needs a positive frame count";
    } else if (a == "--full-redraw") {
      o->full_redraw = true;
    } else if (a == "--size") {
      if (!value(&v) || std::sscanf(v.c_str(), "%dx%d", &o->width, &o->height) != 2 || o->width < 1 ||
          o->height < 1)
        return "--size needs WxH, e.g. 1600x900";
    } else if (!a.empty() && a[0] == '-') {
      return "unknown option '" + a + "'";
    } else {
      o->files.push_back(a);
    }
  }
  return std::nullopt;
}

/// The demo scene: an invented survey aircraft on a photo run, heading 62 deg, elevation
/// 4 deg, bank -12 deg (intrinsic ZYX). Invented for the demo; not data of any vehicle.
DocumentState demo_state(const Settings& settings) {
  DocumentState s;
  if (!settings.convention_path.empty()) {
    auto last = load_display_convention(settings.convention_path);  // a file that went away: the default
    if (last) s.convention = last.value();
  }
  const EulerConvention zyx{{Axis::Z, Axis::Y, Axis::X}, EulerKind::Intrinsic};
  s.world_R_body = from_euler(zyx, Eigen::Vector3d(62.0, 4.0, -12.0) * (kPi / 180.0));
  return s;
}

void build_fonts(Ui& ui, float scale) {
  ImGuiIO& io = ImGui::GetIO();
  io.Fonts->Clear();
  static const ImWchar kRanges[] = {0x0020, 0x00FF, 0x2010, 0x2027, 0x2212, 0x2212, 0};
  const std::string dir = ATTISCOPE_FONT_DIR;
  auto load = [&](const char* file, float px) -> ImFont* {
    const std::string path = dir + "/" + file;
    if (std::ifstream(path).good())
      return io.Fonts->AddFontFromFileTTF(path.c_str(), px * scale, nullptr, kRanges);
    ImFontConfig cfg;
    cfg.SizePixels = px * scale;
    return io.Fonts->AddFontDefault(&cfg);
  };
  load("DejaVuSans.ttf", kBaseFontPx);  // the first font is the default
  ui.heading = load("DejaVuSans-Bold.ttf", kBaseFontPx);
  ui.mono = load("DejaVuSansMono.ttf", kBaseFontPx - 1.0f);
  io.Fonts->Build();
  apply_theme(scale);
  ui.scale = scale;
}

float window_scale(GLFWwindow* w, const Settings& s) {
  float xs = 1.0f, ys = 1.0f;
  if (s.use_content_scale) glfwGetWindowContentScale(w, &xs, &ys);
  return std::clamp(std::max(xs, ys), 0.5f, 4.0f) * std::clamp(s.ui_scale, 0.5f, 4.0f);
}

/// Lays out the panels in fixed regions of the display (Dear ImGui 1.86 has no docking).
void draw_panels(Ui& ui) {
  const ImGuiIO& io = ImGui::GetIO();
  const float w = std::max(1.0f, io.DisplaySize.x);
  const float h = std::max(1.0f, io.DisplaySize.y);
  const ImGuiStyle& st = ImGui::GetStyle();
  const float toolbar_h = std::min(h, 2.0f * ImGui::GetFrameHeightWithSpacing() + 2.0f * st.WindowPadding.y);
  // No panel draws its own background: the frame's clear paints the panel colour once, so
  // llvmpipe does not blend a full-window quad over it (the largest cost of an ImGui frame).
  const ImGuiWindowFlags fixed = ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoResize |
                                 ImGuiWindowFlags_NoCollapse | ImGuiWindowFlags_NoBackground;
  auto place = [](float x, float y, float ww, float hh) {
    ImGui::SetNextWindowPos(ImVec2(x, y), ImGuiCond_Always);
    ImGui::SetNextWindowSize(ImVec2(std::max(1.0f, ww), std::max(1.0f, hh)), ImGuiCond_Always);
  };
  place(0, 0, w, toolbar_h);
  if (ImGui::Begin("Toolbar", nullptr,
                   fixed | ImGuiWindowFlags_NoTitleBar | ImGuiWindowFlags_HorizontalScrollbar |
                       ImGuiWindowFlags_NoScrollWithMouse)) {
    draw_toolbar(ui);
  }
  ImGui::End();

  const float body_h = std::max(1.0f, h - toolbar_h);
  const float left_w = std::min(w, std::max(std::min(w, 470.0f * ui.scale), 0.38f * w));
  place(0, toolbar_h, left_w, body_h);
  if (ImGui::Begin("Readouts", nullptr, fixed)) draw_readouts(ui);
  ImGui::End();

  const float right_x = left_w;
  const float right_w = std::max(1.0f, w - left_w);
  // The tabs with wide forms or plots (Mount check, House convention, Track) take the Gimbal
  // rings' place and more height.
  const bool wide =
      ui.track.tab_open_last || ui.lower_tab == "Mount check" || ui.lower_tab == "House convention";
  const float scene_h = std::floor(body_h * (wide ? 0.4f : 0.54f));
  const ImGuiWindowFlags view = fixed | ImGuiWindowFlags_NoBackground | ImGuiWindowFlags_NoScrollbar |
                                ImGuiWindowFlags_NoScrollWithMouse;
  ui.scene_viewport = {};
  ui.gimbal_viewport = {};
  if (ui.settings.show_scene) {
    place(right_x, toolbar_h, right_w, scene_h);
    if (ImGui::Begin("Scene", nullptr, view)) draw_scene_panel(ui);
    ImGui::End();
  }
  const float bottom_y = toolbar_h + scene_h;
  const float bottom_h = std::max(1.0f, body_h - scene_h);
  // The tools window keeps room for its forms (about 26 characters) while the rings keep at
  // least 40% of the width.
  const float tools_w = std::min(std::max(0.4f * right_w, 26.0f * ImGui::GetFontSize()), 0.6f * right_w);
  const float gimbal_w = wide ? 0.0f : std::floor(right_w - tools_w);
  if (ui.settings.show_gimbal && !wide) {
    place(right_x, bottom_y, gimbal_w, bottom_h);
    if (ImGui::Begin("Gimbal rings", nullptr, view)) draw_gimbal_panel(ui);
    ImGui::End();
  }
  place(right_x + gimbal_w, bottom_y, right_w - gimbal_w, bottom_h);
  // Titled by the open tab; "###tools" keeps one window identity whichever tab is open.
  const std::string tools_title = ui.lower_tab + "###tools";
  if (ImGui::Begin(tools_title.c_str(), nullptr, fixed)) draw_lower_tabs(ui);
  ImGui::End();
}

nlohmann::json dump_json(const Ui& ui, GLFWwindow* window) {
  nlohmann::json j;
  j["document"] = ui.doc.to_json();
  nlohmann::json cards = nlohmann::json::object();
  for (Card c : all_cards()) {
    const CardView v = card_view(c, ui.doc.state());
    cards[card_key(c)] = {{"title", v.title}, {"labels", v.labels}, {"numbers", v.numbers}, {"info", v.info}};
  }
  j["cards"] = cards;
  nlohmann::json widgets = nlohmann::json::array();
  for (const auto& [name, rect] : ui.widgets) widgets.push_back(name);
  j["widgets"] = widgets;
  int fw = 0, fh = 0;
  glfwGetFramebufferSize(window, &fw, &fh);
  j["framebuffer"] = {fw, fh};
  auto rect = [](const FramebufferRect& r) { return nlohmann::json{r.x, r.y, r.width, r.height}; };
  j["scene_viewport"] = rect(ui.scene_viewport);
  j["gimbal_viewport"] = rect(ui.gimbal_viewport);
  j["status"] = ui.status;
  j["redraw"] = ui.partial_redraw ? "partial" : "full";
  j["intake"] = ui.intake_listing;
  j["views"] = views_dump(ui);
  j["house"] = {{"error", ui.house.error}, {"warnings", ui.house.warnings}, {"message", ui.house.message}};
  {
    const TeachingView v = teaching_view(ui.doc.state(), ui.teach);
    nlohmann::json steps = nlohmann::json::array();
    for (const EulerStep& st : v.steps.steps) {
      const Eigen::Quaterniond a = st.after.quaternion();
      steps.push_back({{"after", {a.w(), a.x(), a.y(), a.z()}},
                       {"axis_world", {st.axis_world.x(), st.axis_world.y(), st.axis_world.z()}},
                       {"angle_rad", st.angle_rad},
                       {"sentence", st.sentence}});
    }
    const Eigen::Quaterniond shown = v.shown_world_R_body.quaternion();
    j["teach"] = {{"active", ui.teach.active},
                  {"position", ui.teach.position},
                  {"other_kind", ui.teach.other_kind},
                  {"convention", v.steps.convention.name()},
                  {"angles_rad", {v.steps.angles_rad.x(), v.steps.angles_rad.y(), v.steps.angles_rad.z()}},
                  {"shown", {shown.w(), shown.x(), shown.y(), shown.z()}},
                  {"sentence", v.sentence},
                  {"steps", steps}};
  }
  j["panels"] = ui.panel_state;
  j["track"] = track_dump(ui);
  return j;
}

/// The back buffer as RGBA rows, bottom-up.
std::vector<unsigned char> read_back_buffer(int width, int height) {
  std::vector<unsigned char> pixels(static_cast<std::size_t>(width) * static_cast<std::size_t>(height) * 4);
  glPixelStorei(GL_PACK_ALIGNMENT, 1);
  glReadBuffer(GL_BACK);
  glReadPixels(0, 0, width, height, GL_RGBA, GL_UNSIGNED_BYTE, pixels.data());
  return pixels;
}

/// "" when two RGBA pictures of width x height (rows bottom-up) agree in colour, else how
/// many pixels differ and where the first is.
std::string picture_difference(const std::vector<unsigned char>& a, const std::vector<unsigned char>& b,
                               int width, int height) {
  std::size_t differing = 0, first = 0;
  for (std::size_t k = 0; k + 4 <= a.size() && k + 4 <= b.size(); k += 4) {
    if (std::memcmp(&a[k], &b[k], 3) == 0) continue;
    if (differing++ == 0) first = k / 4;
  }
  if (differing == 0) return "";
  const auto w = static_cast<std::size_t>(width);
  return std::to_string(differing) + " pixels, the first at x " + std::to_string(first % w) + ", y " +
         std::to_string(height - 1 - static_cast<int>(first / w)) + " from the top";
}

/// Writes RGBA rows as read_back_buffer gives them (bottom-up) as an RGB PNG (top row first).
bool write_png(const std::string& path, const std::vector<unsigned char>& rgba, int width, int height) {
  const auto w = static_cast<std::size_t>(width);
  std::vector<unsigned char> rgb(w * static_cast<std::size_t>(height) * 3);
  for (int y = 0; y < height; ++y) {
    const unsigned char* src = rgba.data() + static_cast<std::size_t>(height - 1 - y) * w * 4;
    unsigned char* dst = rgb.data() + static_cast<std::size_t>(y) * w * 3;
    for (std::size_t x = 0; x < w; ++x) std::copy_n(src + 4 * x, 3, dst + 3 * x);
  }
  return stbi_write_png(path.c_str(), width, height, 3, rgb.data(), static_cast<int>(w * 3)) != 0;
}

bool write_screenshot(GLFWwindow* window, const std::string& path) {
  int fw = 0, fh = 0;
  glfwGetFramebufferSize(window, &fw, &fh);
  if (fw <= 0 || fh <= 0) return false;
  return write_png(path, read_back_buffer(fw, fh), fw, fh);
}

/// Where a script is, and the input it is giving this frame.
struct ScriptPlayer {
  std::vector<ScriptStep> steps;
  std::size_t next = 0;
  int phase = 0;  ///< frame within the current step
  ImVec2 mouse{-FLT_MAX, -FLT_MAX};
  bool mouse_down = false;
  int mouse_button = 0;  ///< the button mouse_down is about (0 left, 1 right, 2 middle)
  ImVec2 drag_start;
  std::optional<KeySpec> key_down;
  bool failed = false;
  bool done() const { return next >= steps.size(); }
};

/// Feeds the current step's input to ImGui. Runs after the platform backend's NewFrame (which
/// reads the real mouse) and before ImGui::NewFrame.
void script_input(ScriptPlayer& p, Ui& ui, GLFWwindow* window, std::ostream& err) {
  ImGuiIO& io = ImGui::GetIO();
  io.MousePos = p.mouse;
  io.MouseDown[p.mouse_button] = p.mouse_down;
  if (p.done()) return;
  const ScriptStep& s = p.steps[p.next];
  auto finish = [&p] {
    ++p.next;
    p.phase = 0;
  };
  auto fail = [&](const std::string& why) {
    err << "attiscope gui: script line " << s.line << ": " << why << "\n";
    p.failed = true;
    p.next = p.steps.size();
  };
  if (s.op == "frames") {
    if (++p.phase >= std::max(1, std::atoi(s.arg.c_str()))) finish();
  } else if (s.op == "click") {
    if (p.phase == 0) {
      auto it = ui.widgets.find(s.arg);
      if (it == ui.widgets.end()) return fail("no widget named '" + s.arg + "' on screen");
      const ImVec4 r = it->second;
      p.mouse = ImVec2(0.5f * (r.x + r.z), 0.5f * (r.y + r.w));
    } else if (p.phase == 1) {
      p.mouse_down = true;
    } else if (p.phase == 2) {
      p.mouse_down = false;
    }
    io.MousePos = p.mouse;
    io.MouseDown[0] = p.mouse_down;
    if (++p.phase > 3) finish();
  } else if (s.op == "drag") {
    const DragSpec d = parse_drag_spec(s.arg).value();
    constexpr int kSteps = 8;  // moves between press and release
    if (p.phase == 0) {
      auto it = ui.widgets.find(d.widget);
      if (it == ui.widgets.end()) return fail("no widget named '" + d.widget + "' on screen");
      const ImVec4 r = it->second;
      p.drag_start = ImVec2(0.5f * (r.x + r.z), 0.5f * (r.y + r.w));
      p.mouse = p.drag_start;
      p.mouse_button = d.button;
    } else if (p.phase == 1) {
      p.mouse_down = true;
    } else if (p.phase <= 1 + kSteps) {
      const float t = static_cast<float>(p.phase - 1) / kSteps;
      p.mouse = ImVec2(p.drag_start.x + t * d.dx, p.drag_start.y + t * d.dy);
    } else if (p.phase == 2 + kSteps) {
      p.mouse_down = false;
    }
    io.MousePos = p.mouse;
    io.MouseDown[p.mouse_button] = p.mouse_down;
    if (++p.phase > 3 + kSteps) {
      p.mouse_button = 0;
      finish();
    }
  } else if (s.op == "scroll") {
    std::istringstream in(s.arg);
    std::string name;
    float notches = 0.0f;
    if (!(in >> name >> notches)) return fail("scroll needs NAME N");
    if (p.phase == 0) {
      auto it = ui.widgets.find(name);
      if (it == ui.widgets.end()) return fail("no widget named '" + name + "' on screen");
      const ImVec4 r = it->second;
      p.mouse = ImVec2(0.5f * (r.x + r.z), 0.5f * (r.y + r.w));
    } else if (p.phase == 1) {
      io.MouseWheel += notches;
    }
    io.MousePos = p.mouse;
    if (++p.phase > 2) finish();
  } else if (s.op == "wait") {
    // Until the Track panel's background job is done (at most the given seconds, 60 if none).
    const double limit_s = s.arg.empty() ? 60.0 : std::atof(s.arg.c_str());
    if (!track_job_running(ui)) return finish();
    if (++p.phase * kScriptWaitS > limit_s) return fail("the Track panel's job did not finish in time");
    std::this_thread::sleep_for(std::chrono::duration<double>(kScriptWaitS));
  } else if (s.op == "type") {
    for (unsigned char c : s.arg) io.AddInputCharacter(c);
    finish();
  } else if (s.op == "key") {
    const KeySpec k = parse_key_spec(s.arg).value();
    const bool down = p.phase == 0;
    io.KeysDown[k.key] = down;
    io.KeyCtrl = down && k.ctrl;
    io.KeyShift = down && k.shift;
    io.KeyAlt = down && k.alt;
    if (++p.phase > 1) finish();
  } else if (s.op == "clipboard") {
    glfwSetClipboardString(window, s.arg.c_str());
    finish();
  } else if (s.op == "resize") {
    int w = 0, h = 0;
    if (std::sscanf(s.arg.c_str(), "%d %d", &w, &h) != 2 || w < 1 || h < 1) return fail("resize needs W H");
    if (p.phase == 0) glfwSetWindowSize(window, w, h);
    if (++p.phase > 3) finish();
  }
  // dump, screenshot and quit act after the frame is drawn (script_after_draw).
}

void script_after_draw(ScriptPlayer& p, Ui& ui, GLFWwindow* window, std::ostream& err) {
  if (p.done()) return;
  const ScriptStep& s = p.steps[p.next];
  if (s.op == "dump") {
    std::ofstream out(s.arg);
    out << dump_json(ui, window).dump(2) << "\n";
    if (!out) {
      err << "attiscope gui: script line " << s.line << ": cannot write " << s.arg << "\n";
      p.failed = true;
    }
    ++p.next;
  } else if (s.op == "screenshot") {
    if (!write_screenshot(window, s.arg)) {
      err << "attiscope gui: script line " << s.line << ": cannot write " << s.arg << "\n";
      p.failed = true;
    }
    ++p.next;
  } else if (s.op == "quit") {
    glfwSetWindowShouldClose(window, GLFW_TRUE);
    ++p.next;
  }
}

/// Seconds since this process started (from /proc/self/stat), or a negative number.
double seconds_since_process_start() {
  std::ifstream stat("/proc/self/stat");
  std::string text((std::istreambuf_iterator<char>(stat)), std::istreambuf_iterator<char>());
  const auto close = text.rfind(')');
  if (close == std::string::npos) return -1.0;
  std::istringstream fields(text.substr(close + 2));
  std::string f;
  unsigned long long start_ticks = 0;
  for (int i = 3; i <= 22 && fields >> f; ++i)
    if (i == 22) start_ticks = std::stoull(f);
  timespec now{};
  clock_gettime(CLOCK_BOOTTIME, &now);
  const double ticks = static_cast<double>(sysconf(_SC_CLK_TCK));
  return static_cast<double>(now.tv_sec) + static_cast<double>(now.tv_nsec) * 1e-9 -
         static_cast<double>(start_ticks) / ticks;
}

double percentile(std::vector<double> v, double p) {
  if (v.empty()) return 0.0;
  std::sort(v.begin(), v.end());
  const std::size_t i =
      std::min(v.size() - 1, static_cast<std::size_t>(std::ceil(p * static_cast<double>(v.size()))) - 1);
  return v[i];
}

double seconds(Clock::time_point a, Clock::time_point b) {
  return std::chrono::duration<double>(b - a).count();
}

/// CPU seconds used so far by the whole process (every llvmpipe thread) or this thread.
double cpu_seconds(clockid_t which) {
  timespec t{};
  clock_gettime(which, &t);
  return static_cast<double>(t.tv_sec) + static_cast<double>(t.tv_nsec) * 1e-9;
}

/// Text and frames are drawn at whole pixels, so the font atlas needs no filtering; nearest
/// sampling is cheaper per pixel on llvmpipe and looks the same.
void nearest_font_filter() {
  const auto texture = static_cast<GLuint>(reinterpret_cast<std::uintptr_t>(ImGui::GetIO().Fonts->TexID));
  glBindTexture(GL_TEXTURE_2D, texture);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MIN_FILTER, GL_NEAREST);
  glTexParameteri(GL_TEXTURE_2D, GL_TEXTURE_MAG_FILTER, GL_NEAREST);
  glBindTexture(GL_TEXTURE_2D, 0);
}

}  // namespace

int run_window(const std::vector<std::string>& args, std::ostream& out, std::ostream& err) {
  const Clock::time_point entered = Clock::now();
  WindowOptions opt;
  bool help = false;
  if (auto e = parse_options(args, &opt, &help)) {
    err << "attiscope gui: " << *e << "\n" << kWindowHelp;
    return 2;
  }
  if (help) {
    out << kWindowHelp;
    return 0;
  }
  ScriptPlayer player;
  if (opt.script_path) {
    std::ifstream in(*opt.script_path);
    if (!in) {
      err << "attiscope gui: cannot read script " << *opt.script_path << "\n";
      return 2;
    }
    std::stringstream text;
    text << in.rdbuf();
    auto steps = parse_script(text.str());
    if (!steps) {
      err << "attiscope gui: " << *opt.script_path << ": " << steps.error().describe() << "\n";
      return 2;
    }
    player.steps = steps.value();
  }
  const bool driven = opt.script_path.has_value() || opt.bench_frames > 0;
  // Scripts save settings like a person's session would (tests point XDG_CONFIG_HOME at a
  // temporary folder); the benchmark leaves them alone.
  const bool saves = opt.bench_frames == 0;

  const std::string dir = config_dir().value_or("");
  std::string warning;
  Settings settings = load_settings(dir, &warning);
  if (!warning.empty()) err << "attiscope gui: " << warning << "\n";
  // Convention files are checked before the window opens, so a bad one is exit code 2; a
  // log's columns are looked for with the house convention the window will read it with
  // (the one in effect at its place in the list).
  HouseConvention house = demo_state(settings).convention.house;
  for (const std::string& f : opt.files) {
    if (std::filesystem::path(f).extension() != ".toml") {
      // A log: its columns must be found (the Track panel reads the rest once the window is up).
      auto head = read_file_head(f);
      auto found = head ? find_columns(head.value(), column_preferences(house))
                        : Expected<ColumnMapping>(head.error());
      if (!found) {
        err << "attiscope gui: " << f << ": " << found.error().describe() << "\n";
        return 2;
      }
      continue;
    }
    auto loaded = load_display_convention(f);
    if (!loaded) {
      err << "attiscope gui: " << f << ": " << loaded.error().describe() << "\n";
      return 2;
    }
    house = loaded.value().house;
  }
  SettingsStore store(dir);
  if (opt.width > 0) {
    settings.window_width = opt.width;
    settings.window_height = opt.height;
  } else if (opt.bench_frames > 0) {
    settings.window_width = 1600;
    settings.window_height = 900;
  }

  glfwSetErrorCallback(
      [](int code, const char* what) { std::fprintf(stderr, "GLFW error %d: %s\n", code, what); });
  if (!glfwInit()) {
    err << "attiscope gui: cannot open a window (no display? set DISPLAY or run under xvfb-run)\n";
    return 2;
  }
  glfwWindowHint(GLFW_CONTEXT_VERSION_MAJOR, 3);
  glfwWindowHint(GLFW_CONTEXT_VERSION_MINOR, 3);
  glfwWindowHint(GLFW_OPENGL_PROFILE, GLFW_OPENGL_CORE_PROFILE);
  glfwWindowHint(GLFW_OPENGL_FORWARD_COMPAT, GLFW_TRUE);
  glfwWindowHint(GLFW_SCALE_TO_MONITOR, GLFW_TRUE);
  GLFWwindow* window =
      glfwCreateWindow(settings.window_width, settings.window_height, "attiscope", nullptr, nullptr);
  if (!window) {
    glfwTerminate();
    err << "attiscope gui: cannot create an OpenGL 3.3 core window\n";
    return 2;
  }
  glfwMakeContextCurrent(window);
  const double context_s = seconds(entered, Clock::now());
  glfwSwapInterval(driven ? 0 : 1);
  glfwSetWindowSizeLimits(window, 200, 150, GLFW_DONT_CARE, GLFW_DONT_CARE);

  IMGUI_CHECKVERSION();
  ImGui::CreateContext();
  ImGuiIO& io = ImGui::GetIO();
  io.IniFilename = nullptr;  // saved by us, atomically, in the config folder
  const std::string ini_path = dir.empty() ? "" : dir + "/imgui.ini";
  if (!ini_path.empty() && saves) {
    std::ifstream ini(ini_path);
    std::stringstream text;
    text << ini.rdbuf();
    const std::string s = text.str();
    if (!s.empty()) ImGui::LoadIniSettingsFromMemory(s.c_str(), s.size());
  }
  ImGui_ImplGlfw_InitForOpenGL(window, true);
  ImGui_ImplOpenGL3_Init("#version 330 core");

  Document doc(demo_state(settings));
  Ui ui(doc, settings);
  ui.status = "demo pose: an invented survey aircraft";
  for (const std::string& f : opt.files) {
    if (std::filesystem::path(f).extension() == ".toml") {
      open_convention(ui, f);
    } else {
      open_track(ui, f);
    }
  }
  // The benchmark turns the body, or with a log scrubs the Track panel's timeline through it
  // (the frames while the log loads are not counted).
  const bool bench_track = opt.bench_frames > 0 && track_job_running(ui);
  ui.spinning = opt.bench_frames > 0 && !bench_track;
  // Files dropped on the window: conventions load, anything else opens as a track.
  std::vector<std::string> dropped;
  glfwSetWindowUserPointer(window, &dropped);
  glfwSetDropCallback(window, [](GLFWwindow* w, int count, const char** paths) {
    auto* list = static_cast<std::vector<std::string>*>(glfwGetWindowUserPointer(w));
    for (int k = 0; k < count; ++k) list->emplace_back(paths[k]);
  });
  PartialPainter painter;
  painter.set_allowed(!opt.full_redraw);
  painter.set_opaque_callback(PlotPicture::opaque_callback());
  float scale = window_scale(window, settings);
  build_fonts(ui, scale);
  ImGui_ImplOpenGL3_CreateDeviceObjects();  // shaders and the font texture, now, to set its filter
  nearest_font_filter();
  const double fonts_s = seconds(entered, Clock::now());
  // The 3D views start after the first frame: the window shows its panels at once, and the
  // renderer's shaders (which llvmpipe compiles on first use: several hundred ms from a cold
  // shader cache on a slow machine) are built on the next frame, which draws the views.
  bool views_started = false, views_shown = false;
  double views_first_process_s = 0.0;

  int frames_left = kFramesAfterEvent;
  bool first_frame = true;
  double first_frame_s = 0.0, first_frame_process_s = 0.0;
  std::vector<double> frame_times, frame_cpu, ui_cpu, imgui_draw_wall, repainted_share, filled_share;
  double previous_cpu = 0.0;
  int last_vertices = 0;
  Clock::time_point last_frame = Clock::now();
  Clock::time_point previous_start = last_frame;
  int frame_index = 0;
  while (!glfwWindowShouldClose(window)) {
    const double now_s = seconds(entered, Clock::now());
    if (driven || frames_left > 0) {
      glfwPollEvents();
    } else if (ui.spinning || ui.teach.playing || track_animating(ui)) {
      glfwWaitEventsTimeout(kAnimationWaitS);  // the animation's pace: at most about 60 frames a second
    } else {
      const double due = store.seconds_until_due(now_s);
      if (due >= 0.0) {
        glfwWaitEventsTimeout(std::max(due, kAnimationWaitS));
      } else {
        glfwWaitEvents();
      }
      frames_left = kFramesAfterEvent;
    }
    if (glfwWindowShouldClose(window)) break;
    for (const std::string& f : dropped) {
      if (std::filesystem::path(f).extension() == ".toml") {
        open_convention(ui, f);
      } else {
        open_track(ui, f);
      }
    }
    dropped.clear();
    const float wanted = window_scale(window, settings);
    if (ui.rebuild_fonts || std::abs(wanted - scale) > 1e-3f) {
      scale = wanted;
      ImGui_ImplOpenGL3_DestroyFontsTexture();
      build_fonts(ui, scale);
      ImGui_ImplOpenGL3_CreateFontsTexture();
      nearest_font_filter();
      ui.rebuild_fonts = false;
      painter.invalidate();
    }

    const Clock::time_point start = Clock::now();
    const double start_cpu = cpu_seconds(CLOCK_PROCESS_CPUTIME_ID);
    const double start_thread = cpu_seconds(CLOCK_THREAD_CPUTIME_ID);
    ImGui_ImplOpenGL3_NewFrame();
    ImGui_ImplGlfw_NewFrame();
    if (opt.script_path) script_input(player, ui, window, err);
    ImGui::NewFrame();
    ui.widgets.clear();
    ui.panel_state = nlohmann::json::object();
    draw_panels(ui);
    handle_shortcuts(ui);
    if (ui.spinning) {
      // The spin: a steady turn about the body's z axis, one undo step for the whole spin.
      const double dt = opt.bench_frames > 0 ? 1.0 / 60.0 : std::min(0.1, seconds(last_frame, start));
      if (!doc.in_motion()) doc.begin_motion("spin");
      doc.move_pose(doc.pose() * elementary_rotation(Axis::Z, kSpinRadPerS * dt));
    }
    if (ui.teach.playing)
      advance_teaching(ui, driven ? 1.0 / 60.0 : std::min(0.1, seconds(last_frame, start)));
    update_track(ui, driven ? 1.0 / 60.0 : std::min(0.1, seconds(last_frame, start)));
    last_frame = start;
    ImGui::Render();
    last_vertices = ImGui::GetDrawData()->TotalVtxCount;
    const double ui_thread = cpu_seconds(CLOCK_THREAD_CPUTIME_ID) - start_thread;

    int fw = 0, fh = 0;
    glfwGetFramebufferSize(window, &fw, &fh);
    glViewport(0, 0, fw, fh);
    const ImVec4 panel = ImGui::GetStyle().Colors[ImGuiCol_WindowBg];
    const Clock::time_point draw_start = Clock::now();
    const ImDrawData& draw_data = *ImGui::GetDrawData();
    if (!first_frame && !views_started) {
      views_init(ui);
      views_started = true;
    }
    // Only what changed is repainted (redraw.hpp): the ImGui triangles that differ from the
    // last frame's and the views whose picture changed mark cells; the panel colour fills
    // them, the views draw into their regions (the Scene and Gimbal panels have no
    // background), then ImGui over them, so popups and tooltips stay on top.
    auto paint = [&] {
      painter.plan(draw_data, fw, fh);
      painter.close(views_plan(ui, painter.grid(), painter.partial()));
      painter.paint_background(panel);
      views_draw(ui, painter.grid());
      painter.draw_imgui(draw_data);
    };
    paint();
    ui.partial_redraw = painter.partial();
    if (opt.bench_frames > 0) glFinish();  // so the draw's own cost can be reported
    const double draw_wall = seconds(draw_start, Clock::now());
    if (opt.bench_frames > 0 && frame_index > 0) {
      repainted_share.push_back(painter.last_dirty_pixels() / (static_cast<double>(fw) * fh));
      filled_share.push_back(painter.last_filled_pixels() / (static_cast<double>(fw) * fh));
    }
    if (opt.script_path && !player.done() && player.steps[player.next].op == "redraw-check") {
      // The same frame repainted whole must give the same pixels as the partial frame.
      const std::vector<unsigned char> partial = read_back_buffer(fw, fh);
      painter.invalidate();
      paint();
      const std::vector<unsigned char> whole = read_back_buffer(fw, fh);
      const ScriptStep& step = player.steps[player.next];
      const std::string difference = picture_difference(partial, whole, fw, fh);
      if (!difference.empty()) {
        if (!step.arg.empty()) {  // both pictures, for a person to compare
          write_png(step.arg + "-partial.png", partial, fw, fh);
          write_png(step.arg + "-full.png", whole, fw, fh);
        }
        err << "attiscope gui: script line " << step.line
            << ": the partial frame differs from a full redraw in " << difference << "\n";
        player.failed = true;
        player.next = player.steps.size();
      } else {
        ++player.next;
      }
    }
    painter.end_frame();
    if (opt.script_path) script_after_draw(player, ui, window, err);
    painter.probe_before_swap();
    glfwSwapBuffers(window);
    painter.probe_after_swap();

    if (first_frame) {
      glFinish();
      first_frame_s = seconds(entered, Clock::now());
      first_frame_process_s = seconds_since_process_start();
      first_frame = false;
    } else if (views_started && !views_shown) {
      glFinish();
      views_first_process_s = seconds_since_process_start();
      views_shown = true;
    }
    if (bench_track && track_job_running(ui)) {
      previous_start = start;
      previous_cpu = start_cpu;
    } else if (opt.bench_frames > 0) {
      if (bench_track && ui.track.track) {
        const std::size_t n = ui.track.track->size();
        step_track(
            ui, static_cast<long>(std::max<std::size_t>(1, n / static_cast<std::size_t>(opt.bench_frames))));
      }
      if (frame_index > 0) {
        frame_times.push_back(seconds(previous_start, start) * 1e3);
        frame_cpu.push_back((start_cpu - previous_cpu) * 1e3);
      }
      ui_cpu.push_back(ui_thread * 1e3);
      imgui_draw_wall.push_back(draw_wall * 1e3);
      previous_start = start;
      previous_cpu = start_cpu;
      if (++frame_index > opt.bench_frames) glfwSetWindowShouldClose(window, GLFW_TRUE);
    }
    if (opt.script_path && player.done()) glfwSetWindowShouldClose(window, GLFW_TRUE);

    if (ui.settings_changed) {
      store.changed(settings, now_s);
      ui.settings_changed = false;
    }
    if (saves) {
      store.save_if_due(seconds(entered, Clock::now()));
      if (io.WantSaveIniSettings && !ini_path.empty()) {
        write_file_atomically(ini_path, ImGui::SaveIniSettingsToMemory());
        io.WantSaveIniSettings = false;
      }
    }
    if (doc.changed()) {
      // One more frame so every card shows the change; while spinning the pace is the timer's.
      if (!ui.spinning) frames_left = std::max(frames_left, 1);
      doc.clear_changed();
    } else if (frames_left > 0) {
      --frames_left;
    }
  }

  if (saves) {
    int ww = 0, wh = 0;
    glfwGetWindowSize(window, &ww, &wh);
    if (ww != settings.window_width || wh != settings.window_height) {
      settings.window_width = ww;
      settings.window_height = wh;
      store.changed(settings, 0.0);
    }
    store.flush();
    if (!ini_path.empty()) write_file_atomically(ini_path, ImGui::SaveIniSettingsToMemory());
  }
  if (opt.bench_frames > 0) {
    char line[400];
    std::snprintf(
        line, sizeof line,
        "frames %zu at %dx%d: median %.2f ms, p95 %.2f ms; first frame %.1f ms after entering the "
        "window code, %.0f ms after process start; 3D views first drawn %.0f ms after process start\n",
        frame_times.size(), settings.window_width, settings.window_height, percentile(frame_times, 0.5),
        percentile(frame_times, 0.95), first_frame_s * 1e3, first_frame_process_s * 1e3,
        views_first_process_s * 1e3);
    out << line;
    std::snprintf(
        line, sizeof line,
        "  per frame: process CPU median %.2f ms (all threads); UI build (NewFrame..Render) median %.2f "
        "ms; ImGui draw to glFinish median %.2f ms; %d ImGui vertices\n",
        percentile(frame_cpu, 0.5), percentile(ui_cpu, 0.5), percentile(imgui_draw_wall, 0.5), last_vertices);
    out << line;
    std::snprintf(
        line, sizeof line,
        "  start-up: window and GL context %.1f ms, fonts and shaders %.1f ms, first frame %.1f ms\n",
        context_s * 1e3, (fonts_s - context_s) * 1e3, (first_frame_s - fonts_s) * 1e3);
    out << line;
    std::snprintf(
        line, sizeof line,
        "  redraw: %s; median share of the window repainted %.0f%%, filled with the panel colour "
        "(not under a view or an opaque picture) %.0f%%\n",
        painter.partial() ? "only what changed (the back buffer is kept)" : "the whole window each frame",
        percentile(repainted_share, 0.5) * 100.0, percentile(filled_share, 0.5) * 100.0);
    out << line;
  }
  shutdown_track(ui);
  views_shutdown(ui);
  painter.release();
  ImGui_ImplOpenGL3_Shutdown();
  ImGui_ImplGlfw_Shutdown();
  ImGui::DestroyContext();
  glfwDestroyWindow(window);
  glfwTerminate();
  return player.failed ? 2 : 0;
}

}  // namespace attiscope::gui
