// document.cpp: the document's commands and its undo/redo history.
#include "gui/document.hpp"
#include "attiscope/core/report.hpp"

#include <algorithm>

namespace attiscope::gui {

const std::vector<Card>& all_cards() {
  static const std::vector<Card> kCards = {
      Card::Quaternion,     Card::Matrix, Card::EulerHouse, Card::EulerSecond, Card::AxisAngle,
      Card::RotationVector, Card::Gibbs,  Card::Mrp,        Card::Su2,         Card::LeftRight};
  return kCards;
}

std::string card_key(Card c) {
  switch (c) {
    case Card::Quaternion: return "quaternion";
    case Card::Matrix: return "matrix";
    case Card::EulerHouse: return "euler_house";
    case Card::EulerSecond: return "euler_second";
    case Card::AxisAngle: return "axis_angle";
    case Card::RotationVector: return "rotation_vector";
    case Card::Gibbs: return "gibbs";
    case Card::Mrp: return "mrp";
    case Card::Su2: return "su2";
    case Card::LeftRight: return "left_right";
  }
  return "unknown";
}

void Document::push_undo(const std::string& what) {
  in_motion_ = false;
  undo_.push_back({state_, what});
  if (undo_.size() > kMaxHistory) undo_.erase(undo_.begin());
  redo_.clear();
  changed_ = true;
}

void Document::set_pose(const Rotation& world_R_body, const std::string& what) {
  push_undo(what);
  state_.world_R_body = world_R_body;
}

void Document::set_pose_and_reference(const Rotation& world_R_body, const Rotation& world_R_reference,
                                      const std::string& what) {
  push_undo(what);
  state_.world_R_body = world_R_body;
  state_.world_R_reference = world_R_reference;
}
void Document::set_reference(const Rotation& world_R_reference, const std::string& what) {
  push_undo(what);
  state_.world_R_reference = world_R_reference;
}

void Document::set_second_euler(const EulerConvention& c) {
  if (c == state_.second_euler) return;
  push_undo("second Euler convention " + c.name());
  state_.second_euler = c;
  edits_.erase(Card::EulerSecond);
}

void Document::set_convention(const DisplayConvention& c) {
  if (c == state_.convention) return;
  push_undo("house convention " + c.house.name);
  state_.convention = c;
  edits_.clear();  // typed numbers were in the old convention's layout
}

void Document::set_unit(AngleUnit unit) {
  if (unit == state_.convention.house.euler.unit) return;
  push_undo(unit == AngleUnit::Degrees ? "degrees" : "radians");
  state_.convention.house.euler.unit = unit;
  edits_.clear();
}

void Document::set_precision(int significant_digits) {
  significant_digits = std::clamp(significant_digits, 1, 17);
  if (significant_digits == state_.convention.house.precision) return;
  push_undo("precision " + std::to_string(significant_digits));
  state_.convention.house.precision = significant_digits;
}

void Document::nudge(Axis axis, double angle_rad, bool about_body_axis) {
  const Rotation turn = elementary_rotation(axis, angle_rad);
  const std::string what = std::string("turn about ") + (about_body_axis ? "body " : "world ") +
                           static_cast<char>(axis_letter(axis) - 'A' + 'a');
  // About a body axis the turn is applied first (right), about a world axis last (left).
  set_pose(about_body_axis ? state_.world_R_body * turn : turn * state_.world_R_body, what);
}

void Document::reset_to_identity() {
  set_pose(Rotation::identity(), "reset to identity");
  edits_.clear();
}

void Document::begin_motion(const std::string& what) {
  push_undo(what);
  in_motion_ = true;
}

void Document::move_pose(const Rotation& world_R_body) {
  if (!in_motion_) begin_motion("motion");
  state_.world_R_body = world_R_body;
  changed_ = true;
}

void Document::undo() {
  in_motion_ = false;
  if (undo_.empty()) return;
  redo_.push_back({state_, undo_.back().what});
  state_ = undo_.back().state;
  undo_.pop_back();
  edits_.clear();
  changed_ = true;
}

void Document::redo() {
  in_motion_ = false;
  if (redo_.empty()) return;
  undo_.push_back({state_, redo_.back().what});
  state_ = redo_.back().state;
  redo_.pop_back();
  edits_.clear();
  changed_ = true;
}

std::vector<std::string> Document::history() const {
  std::vector<std::string> out;
  for (const HistoryEntry& e : undo_) out.push_back(e.what);
  return out;
}

const CardEdit* Document::edit(Card c) const {
  auto it = edits_.find(c);
  return it == edits_.end() ? nullptr : &it->second;
}

void Document::draft(Card c, std::vector<double> numbers) {
  CardEdit& e = edits_[c];
  e.numbers = std::move(numbers);
  changed_ = true;
}

void Document::commit(Card c, std::vector<double> numbers, const EditCheck& check) {
  changed_ = true;
  if (check.rotation) {
    edits_.erase(c);
    set_pose(*check.rotation, card_key(c) + " edit");
    return;
  }
  CardEdit& e = edits_[c];
  e.numbers = std::move(numbers);
  e.invalid = true;
  e.check = check;
  e.check_numbers = e.numbers;
}

void Document::accept_nearest(Card c) {
  auto it = edits_.find(c);
  if (it == edits_.end() || !it->second.invalid || !it->second.check.nearest) return;
  const Rotation nearest = *it->second.check.nearest;
  edits_.erase(it);
  set_pose(nearest, card_key(c) + " edit (nearest rotation)");
}

void Document::discard_edit(Card c) {
  edits_.erase(c);
  changed_ = true;
}

nlohmann::json Document::to_json() const {
  nlohmann::json j;
  j["quaternion"] = quaternion_json(state_.world_R_body);
  j["reference_quaternion"] = quaternion_json(state_.world_R_reference);
  j["second_euler"] = state_.second_euler.name();
  j["convention"] = state_.convention.house.name;
  j["convention_path"] = state_.convention.path;
  j["unit"] = state_.convention.house.euler.unit == AngleUnit::Degrees ? "deg" : "rad";
  j["precision"] = state_.convention.house.precision;
  j["undo_depth"] = undo_.size();
  j["redo_depth"] = redo_.size();
  j["history"] = history();
  nlohmann::json edits = nlohmann::json::object();
  for (const auto& [card, e] : edits_) {
    edits[card_key(card)] = {{"numbers", e.numbers},
                             {"invalid", e.invalid},
                             {"problem", e.check.problem},
                             {"has_nearest", e.check.nearest.has_value()}};
  }
  j["edits"] = edits;
  return j;
}

}  // namespace attiscope::gui
