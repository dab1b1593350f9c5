// card.cpp: the convention card picture (see card.hpp). The text is drawn on the CPU with
// the renderer's baked label font (stb_truetype), alpha-blended into the picture.
#include "attiscope/render/card.hpp"

#include <algorithm>
#include <cmath>
#include <fstream>

#include "attiscope/core/convention_card.hpp"
#include "attiscope/render/scene_renderer.hpp"
#include "font.hpp"
#include "image_text.hpp"

namespace attiscope::render {

namespace {

constexpr float kTitlePx = 34.0f;
constexpr float kTextPx = 20.0f;
constexpr int kMargin = 28;
constexpr double kCardArcRad = 1.2;  ///< how much of each positive turn the arrows show (about 69 deg)
constexpr std::size_t kWrapChars = 64;
constexpr std::size_t kCellChars = 14;  ///< width of a table column on the card
constexpr std::uint8_t kInk[3] = {30, 34, 44};

/// UTF-8 punctuation the label font lacks, written in ASCII.
std::string ascii(const std::string& s) {
  std::string out;
  for (std::size_t i = 0; i < s.size(); ++i) {
    const unsigned char ch = static_cast<unsigned char>(s[i]);
    if (ch < 0x80) {
      out += static_cast<char>(ch);
      continue;
    }
    if (s.compare(i, 3, "\xE2\x80\x94") == 0 || s.compare(i, 3, "\xE2\x80\x93") == 0 ||
        s.compare(i, 3, "\xE2\x88\x92") == 0) {
      out += '-';
      i += 2;
    } else if (s.compare(i, 2, "\xC2\xB0") == 0) {
      out += " deg";
      i += 1;
    } else {
      out += '?';
      while (i + 1 < s.size() && (static_cast<unsigned char>(s[i + 1]) & 0xC0) == 0x80) ++i;
    }
  }
  return out;
}

std::vector<std::string> wrap(const std::string& text, std::size_t width) {
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(start, end - start);
    if (!line.empty() && line.size() + 1 + word.size() > width) {
      lines.push_back(line);
      line = "    " + word;
    } else {
      line += (line.empty() ? "" : " ") + word;
    }
    start = end + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

/// Draws one line of text with its baseline at y.
void draw_text(Image* img, const detail::BakedFont& font, const std::string& text, float x, float y,
               float px) {
  detail::draw_image_text(img, font, text, x, y, px, kInk);
}

}  // namespace

SceneState card_scene(const HouseConvention& c) {
  SceneState st;
  st.width_px = kCardSceneSide;
  st.height_px = kCardSceneSide;
  st.model.kind = ModelKind::Aircraft;
  const auto body_m = reference_R_frame(c.body, FrameRole::Body);     // FLU_R_body
  const auto world_m = reference_R_frame(c.world, FrameRole::World);  // ENU_R_world
  if (body_m) {
    const Eigen::Matrix3d body_R_flu = body_m.value().transpose();
    st.body.name = frame_preset_name(c.body, FrameRole::Body);
    st.body.front = body_R_flu * Eigen::Vector3d::UnitX();
    st.body.top = body_R_flu * Eigen::Vector3d::UnitZ();
    st.body.right = body_R_flu * -Eigen::Vector3d::UnitY();
  }
  if (world_m) {
    st.world.name = frame_preset_name(c.world, FrameRole::World);
    st.world.up = world_m.value().transpose() * Eigen::Vector3d::UnitZ();
  }
  st.world.axis_labels = c.world.names;
  st.body.axis_labels = c.body.names;
  // At the identity pose body and world axes coincide: each Euler angle's positive turn is
  // shown about its axis letter, on arcs of growing radius so they do not overlap.
  for (std::size_t i = 0; i < 3; ++i) {
    TurnHighlight t;
    t.axis_world = Eigen::Vector3d::Unit(static_cast<int>(c.euler.convention.axes[i]));
    t.angle_rad = kCardArcRad;
    t.shown_rad = kCardArcRad;
    t.label = "+" + ascii(c.euler.names[i]);
    t.radius = 0.95 + 0.22 * static_cast<double>(i);
    t.show_axis = false;
    st.turns.push_back(t);
  }
  return st;
}

std::vector<std::string> card_text_lines(const HouseConvention& c) {
  // Every line of the Markdown page that says something (headings and table rules dropped).
  std::vector<std::string> out;
  const std::string md = convention_card_markdown(c);
  std::size_t start = 0;
  while (start < md.size()) {
    std::size_t end = md.find('\n', start);
    if (end == std::string::npos) end = md.size();
    std::string line = ascii(md.substr(start, end - start));
    start = end + 1;
    line.erase(std::remove(line.begin(), line.end(), '`'), line.end());
    line.erase(std::remove(line.begin(), line.end(), '*'), line.end());
    while (!line.empty() && line[0] == '#') line.erase(0, 1);
    if (line.find("---") != std::string::npos || line.find_first_not_of(" |-") == std::string::npos) continue;
    while (!line.empty() && line[0] == ' ') line.erase(0, 1);
    if (!line.empty() && line[0] == '|') {
      // A table row: its cells in columns, without the rules.
      std::string row;
      std::size_t from = 1;
      while (from < line.size()) {
        std::size_t bar = line.find('|', from);
        if (bar == std::string::npos) bar = line.size();
        std::string cell = line.substr(from, bar - from);
        while (!cell.empty() && cell.front() == ' ') cell.erase(0, 1);
        while (!cell.empty() && cell.back() == ' ') cell.pop_back();
        if (!cell.empty()) {
          cell.resize(std::max<std::size_t>(cell.size() + 2, kCellChars), ' ');
          row += cell;
        }
        from = bar + 1;
      }
      line = "  " + row;
    }
    for (std::string& w : wrap(line, kWrapChars)) out.push_back(w);
  }
  return out;
}

Expected<Image> render_convention_card(const HouseConvention& c) {
  auto renderer = SceneRenderer::create();
  if (!renderer) return renderer.error();
  const SceneState st = card_scene(c);
  const Image scene = renderer.value()->render_image(st);
  Image card;
  card.width = kCardWidth;
  card.height = kCardHeight;
  card.rgba.assign(static_cast<std::size_t>(kCardWidth) * kCardHeight * 4, 255);
  const int top = (kCardHeight - kCardSceneSide) / 2;
  for (int y = 0; y < scene.height && y + top < kCardHeight; ++y) {
    std::copy(scene.pixel(0, y), scene.pixel(0, y) + static_cast<std::ptrdiff_t>(scene.width) * 4,
              &card.rgba[(static_cast<std::size_t>(y + top) * kCardWidth) * 4]);
  }
  std::string problem;
  const detail::BakedFont font = detail::bake_label_font(kTitlePx, &problem);
  if (font.coverage.empty()) return Error("no font for the card's text: " + problem);
  const float x = static_cast<float>(kCardSceneSide + kMargin);
  float y = kMargin + kTitlePx;
  draw_text(&card, font, ascii(c.name), x, y, kTitlePx);
  y += kTitlePx * 0.6f;
  const std::vector<std::string> lines = card_text_lines(c);
  const float line_h = std::min(
      kTextPx * 1.3f, (kCardHeight - y - kMargin) / std::max(1.0f, static_cast<float>(lines.size())));
  const float px = std::min(kTextPx, line_h / 1.3f);
  for (std::size_t i = 1; i < lines.size(); ++i) {  // line 0 is the title
    y += line_h;
    draw_text(&card, font, lines[i], x, y, px);
  }
  draw_text(&card, font, "Check against your own test procedure before a vehicle test.", kMargin,
            kCardHeight - kMargin * 0.6f, kTextPx * 0.8f);
  return card;
}

Expected<std::string> write_convention_card(const HouseConvention& c, const std::string& png_path,
                                            const std::string& md_path) {
  if (png_path.empty()) return Error("no PNG path for the card");
  auto ok = validate_convention(c);
  if (!ok) return ok.error();
  auto image = render_convention_card(c);
  if (!image) return image.error();
  auto written = write_png(png_path, image.value());
  if (!written) return written.error();
  std::string what = png_path;
  if (!md_path.empty()) {
    std::ofstream md(md_path, std::ios::binary);
    md << convention_card_markdown(c);
    if (!md) return Error("cannot write " + md_path);
    what += " and " + md_path;
  }
  return what;
}

}  // namespace attiscope::render
