// check_state.hpp: what the Compare and Mount check panels keep between frames (the text a
// person typed, the slider, the choices). No ImGui here. Every number they show is computed
// by core each frame from these inputs and the document.
#pragma once

#include <array>
#include <string>

#include "attiscope/core/frame_chain.hpp"

namespace attiscope::gui {

struct ComparePanelState {
  std::string reference_text;   ///< "load reference from text" box
  std::string reference_error;  ///< why the last load failed (line and column), else empty
  std::string poses_text;       ///< several poses, one per line, for mean and spread
  float slerp_t = 0.0f;         ///< 0 = reference, 1 = current; the preview's place on the path
  bool previewing = false;      ///< the slider was moved: the scene shows the preview pose
};

struct MountPanelState {
  bool nominal_from_list = false;                   ///< the nominal is one of the 24 axis-aligned mounts
  int aligned_index = 0;                            ///< which one (axis_aligned_mounts order)
  std::string nominal_text;                         ///< any representation, or mount words
  std::array<float, 3> trim_deg{0.0f, 0.0f, 0.0f};  ///< about vehicle x, y, z
  bool use_vectors = false;                         ///< measured from vector pairs
  std::string measured_text;
  bool measured_vehicle_to_sensor = false;  ///< the measured value was written the other way
  std::string vectors_text;                 ///< `sx sy sz vx vy vz [w]` lines
  float tolerance_deg = 0.5f;
  std::string axes_code = "FRD";
  /// The vehicle axes follow the loaded house convention's body frame (FRD when none is
  /// loaded) until the person types their own or a setup file names them.
  bool axes_from_house = true;
  std::string sheet_base = "mount-check";  ///< export writes BASE.png and BASE.txt
  std::string message;                     ///< the last export's outcome
  // The frame chain (world -> vehicle -> mount plate -> sensor ...), from a mount setup file.
  std::string setup_path;      ///< the setup file box
  FrameChain chain;            ///< the loaded setup's frames and links (empty: none)
  std::string chain_message;   ///< the last load's outcome or error (with line and column)
  std::string selected_frame;  ///< drawn highlighted in the Scene; its pose is shown in the panel
  bool show_chain = true;      ///< draw every frame of the chain in the Scene
};

}  // namespace attiscope::gui
