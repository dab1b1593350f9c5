// chain_view.cpp: the frame chain's marks in the Scene (see chain_view.hpp).
#include "gui/chain_view.hpp"

#ifdef ATTISCOPE_HAS_RENDER
#include "attiscope/render/chain_overlay.hpp"
#include "attiscope/render/frames.hpp"
#endif

namespace attiscope::gui {

#ifdef ATTISCOPE_HAS_RENDER
void apply_chain_overlay(const Ui& ui, render::SceneState* scene) {
  const MountPanelState& st = ui.mount;
  if (scene == nullptr || !st.show_chain || st.chain.frames().empty()) return;
  auto marks = render::scene_chain_marks(st.chain, scene->world,
                                         st.chain.has_frame(st.selected_frame) ? st.selected_frame : "");
  if (marks) scene->chain = marks.value();
}
#endif

nlohmann::json chain_view_dump(const Ui& ui) {
  nlohmann::json j = nlohmann::json::object();
  const MountPanelState& st = ui.mount;
  j["frames"] = st.chain.frames();
  j["selected"] = st.selected_frame;
  j["shown"] = st.show_chain && !st.chain.frames().empty();
  j["message"] = st.chain_message;
#ifdef ATTISCOPE_HAS_RENDER
  render::SceneState probe;
  apply_chain_overlay(ui, &probe);
  nlohmann::json marks = nlohmann::json::array();
  for (const ChainFrameMark& m : probe.chain) {
    marks.push_back({{"name", m.name},
                     {"parent", m.parent},
                     {"origin", {m.origin.x(), m.origin.y(), m.origin.z()}},
                     {"selected", m.selected}});
  }
  j["marks"] = marks;
#endif
  return j;
}

}  // namespace attiscope::gui
