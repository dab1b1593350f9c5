// document.hpp: the one document every panel of the window reads and edits.
//
// It holds the current pose (world_R_body: v_world = R v_body), the reference pose, the
// second Euler convention, the display convention, the pending edit of each card and the
// undo/redo history. Panels never keep a copy of the rotation: they read the document each
// frame and turn edits into the commands below, so every card shows the same rotation and
// every change can be undone. No ImGui here: the document is tested without a window.
#pragma once

#include <map>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "attiscope/core/euler.hpp"
#include "attiscope/core/rotation.hpp"
#include "gui/display_convention.hpp"

namespace attiscope::gui {

/// The cards of the Readouts panel.
enum class Card {
  Quaternion,
  Matrix,
  EulerHouse,
  EulerSecond,
  AxisAngle,
  RotationVector,
  Gibbs,
  Mrp,
  Su2,
  LeftRight
};

/// Every card, in the order the Readouts panel shows them.
const std::vector<Card>& all_cards();
/// "quaternion", "matrix", ...: the card's key in dumps and test scripts.
std::string card_key(Card c);

/// The part of the document that undo/redo restores.
struct DocumentState {
  Rotation world_R_body;
  Rotation world_R_reference;
  EulerConvention second_euler{{Axis::Z, Axis::X, Axis::Z}, EulerKind::Intrinsic};
  DisplayConvention convention;
};

/// What a card's typed numbers turned out to be, computed by core (gui/card_values.hpp).
struct EditCheck {
  std::optional<Rotation> rotation;  ///< set when the numbers are a valid rotation
  std::string problem;               ///< why not (the defect), when rotation is empty
  std::optional<Rotation> nearest;   ///< the nearest valid rotation, when there is one
  std::string note;                  ///< accepted with a remark ("normalised from |q| = 2")
};

/// A card's edit in progress (typed, not yet committed) or committed but invalid.
struct CardEdit {
  std::vector<double> numbers;        ///< the card's numbers as the person typed them
  bool invalid = false;               ///< committed, and not a valid rotation
  EditCheck check;                    ///< valid only when invalid == true
  std::vector<double> check_numbers;  ///< the numbers `check` is about
};

class Document {
 public:
  Document() = default;
  explicit Document(const DocumentState& initial) : state_(initial) {}

  const DocumentState& state() const { return state_; }
  const Rotation& pose() const { return state_.world_R_body; }
  const DisplayConvention& convention() const { return state_.convention; }

  // ---- commands (each one undoable) ----
  /// Sets the current pose; `what` names the change in the history ("quaternion edit").
  void set_pose(const Rotation& world_R_body, const std::string& what);
  void set_reference(const Rotation& world_R_reference, const std::string& what);
  /// Sets pose and reference together, one undo step (the mount check's "show in scene").
  void set_pose_and_reference(const Rotation& world_R_body, const Rotation& world_R_reference,
                              const std::string& what);
  void set_second_euler(const EulerConvention& c);
  void set_convention(const DisplayConvention& c);
  void set_unit(AngleUnit unit);
  void set_precision(int significant_digits);
  /// Turns the body by angle_rad about its own axis (body frame) or the world's.
  void nudge(Axis axis, double angle_rad, bool about_body_axis);
  void reset_to_identity();
  /// A continuous motion (a spin, a drag) is one undo step: begin_motion records it, then
  /// move_pose changes the pose without a step each, until end_motion.
  void begin_motion(const std::string& what);
  void move_pose(const Rotation& world_R_body);
  void end_motion() { in_motion_ = false; }
  bool in_motion() const { return in_motion_; }

  bool can_undo() const { return !undo_.empty(); }
  bool can_redo() const { return !redo_.empty(); }
  void undo();
  void redo();
  /// Names of the changes that undo would revert, oldest first.
  std::vector<std::string> history() const;

  // ---- card edits ----
  /// The edit in progress or pending in a card, if any.
  const CardEdit* edit(Card c) const;
  /// Records typed numbers of a card (the field is still active); the pose is unchanged.
  void draft(Card c, std::vector<double> numbers);
  /// Commits typed numbers: a valid check sets the pose (one undo step) and clears the
  /// card's edit; an invalid one keeps the numbers and the defect in the card and leaves the
  /// pose unchanged until accept_nearest or discard_edit.
  void commit(Card c, std::vector<double> numbers, const EditCheck& check);
  /// Takes the nearest valid rotation an invalid edit offered.
  void accept_nearest(Card c);
  void discard_edit(Card c);

  /// The document as JSON (state, history depth, pending edits), for test dumps.
  nlohmann::json to_json() const;

  /// Changes since the window last drew; cleared by the window.
  bool changed() const { return changed_; }
  void clear_changed() { changed_ = false; }

 private:
  void push_undo(const std::string& what);
  static constexpr std::size_t kMaxHistory = 1000;

  DocumentState state_;
  struct HistoryEntry {
    DocumentState state;
    std::string what;
  };
  std::vector<HistoryEntry> undo_;
  std::vector<HistoryEntry> redo_;
  std::map<Card, CardEdit> edits_;
  bool changed_ = true;
  bool in_motion_ = false;
};

}  // namespace attiscope::gui
