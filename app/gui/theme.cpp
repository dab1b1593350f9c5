// theme.cpp: the window's own look: a dark blue-grey ground, a warm amber accent for what
// can be acted on, generous spacing, rounded frames. Colours chosen for contrast on a
// projector as well as on a screen.
#include "gui/ui.hpp"

namespace attiscope::gui {

namespace {
ImVec4 rgb(int r, int g, int b, float a = 1.0f) {
  return ImVec4(static_cast<float>(r) / 255.0f, static_cast<float>(g) / 255.0f,
                static_cast<float>(b) / 255.0f, a);
}
}  // namespace

void apply_theme(float scale) {
  ImGuiStyle style;  // start from the defaults each time, so scaling never compounds
  style.WindowPadding = ImVec2(12, 10);
  style.FramePadding = ImVec2(7, 4);
  style.ItemSpacing = ImVec2(8, 6);
  style.ItemInnerSpacing = ImVec2(6, 4);
  style.ScrollbarSize = 14;
  // Square corners: a rounded frame costs about 30 vertices instead of 4, and llvmpipe pays
  // per triangle; with some 80 number fields that is most of the frame's geometry.
  style.WindowRounding = 0;
  style.FrameRounding = 0;
  style.GrabRounding = 0;
  style.ScrollbarRounding = 0;
  style.TabRounding = 0;
  style.WindowBorderSize = 1;
  style.FrameBorderSize = 0;
  style.WindowTitleAlign = ImVec2(0.02f, 0.5f);
  ImVec4* c = style.Colors;
  const ImVec4 ground = rgb(24, 29, 38);
  const ImVec4 panel = rgb(30, 36, 47);
  const ImVec4 field = rgb(42, 50, 64);
  const ImVec4 accent = rgb(232, 163, 61);
  const ImVec4 accent_dim = rgb(150, 104, 40);
  const ImVec4 text = rgb(228, 232, 238);
  c[ImGuiCol_Text] = text;
  c[ImGuiCol_TextDisabled] = rgb(150, 160, 175);
  c[ImGuiCol_WindowBg] = panel;
  c[ImGuiCol_ChildBg] = panel;
  c[ImGuiCol_PopupBg] = rgb(36, 43, 56, 0.98f);
  c[ImGuiCol_Border] = rgb(60, 70, 88);
  c[ImGuiCol_FrameBg] = field;
  c[ImGuiCol_FrameBgHovered] = rgb(55, 66, 84);
  c[ImGuiCol_FrameBgActive] = rgb(66, 79, 100);
  c[ImGuiCol_TitleBg] = ground;
  c[ImGuiCol_TitleBgActive] = rgb(38, 46, 60);
  c[ImGuiCol_TitleBgCollapsed] = ground;
  c[ImGuiCol_MenuBarBg] = ground;
  c[ImGuiCol_ScrollbarBg] = ground;
  c[ImGuiCol_ScrollbarGrab] = rgb(70, 82, 102);
  c[ImGuiCol_ScrollbarGrabHovered] = rgb(90, 104, 128);
  c[ImGuiCol_ScrollbarGrabActive] = accent_dim;
  c[ImGuiCol_CheckMark] = accent;
  c[ImGuiCol_SliderGrab] = accent_dim;
  c[ImGuiCol_SliderGrabActive] = accent;
  c[ImGuiCol_Button] = rgb(52, 62, 80);
  c[ImGuiCol_ButtonHovered] = accent_dim;
  c[ImGuiCol_ButtonActive] = accent;
  c[ImGuiCol_Header] = rgb(44, 54, 70);
  c[ImGuiCol_HeaderHovered] = rgb(58, 70, 90);
  c[ImGuiCol_HeaderActive] = accent_dim;
  c[ImGuiCol_Separator] = rgb(60, 70, 88);
  c[ImGuiCol_TextSelectedBg] = rgb(232, 163, 61, 0.35f);
  c[ImGuiCol_NavHighlight] = accent;
  style.ScaleAllSizes(scale);
  ImGui::GetStyle() = style;
}

}  // namespace attiscope::gui
