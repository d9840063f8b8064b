#pragma once
// Undo commands: the only code that changes a ProjectDocument's model. Each command stores
// what it needs to go both ways; consecutive nudges of the same events merge into one entry.
#include <QUndoCommand>
#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "model/annotation.h"

namespace stridemark::ui {

class ProjectDocument;

// Base: gives commands write access to the document and notifies after each step.
class EditCommand : public QUndoCommand {
 public:
  EditCommand(ProjectDocument* doc, const QString& text) : QUndoCommand(text), doc_(doc) {}

 protected:
  model::Project& project();
  void finished(bool trialToo = false);
  ProjectDocument* doc_;
};

class AddEventCommand : public EditCommand {
 public:
  AddEventCommand(ProjectDocument* doc, const model::Event& event);
  void redo() override;
  void undo() override;

 private:
  model::Event event_;
};

class RemoveEventsCommand : public EditCommand {
 public:
  RemoveEventsCommand(ProjectDocument* doc, std::vector<model::Event> events);
  void redo() override;
  void undo() override;

 private:
  std::vector<model::Event> events_;
};

class MoveEventsCommand : public EditCommand {
 public:
  static constexpr int kNudgeId = 0x5e01;
  MoveEventsCommand(ProjectDocument* doc, std::vector<model::Event> events, std::int64_t delta,
                    bool nudge);
  void redo() override;
  void undo() override;
  int id() const override { return nudge_ ? kNudgeId : -1; }
  bool mergeWith(const QUndoCommand* other) override;
  std::vector<model::Event> movedEvents() const;  // where the events are after redo()

 private:
  void shift(const std::vector<model::Event>& from, std::int64_t delta);
  std::vector<model::Event> events_;  // positions before the move
  std::int64_t delta_;
  bool nudge_;
};

class SetTrialCardCommand : public EditCommand {
 public:
  SetTrialCardCommand(ProjectDocument* doc, model::TrialCard card);
  void redo() override;
  void undo() override;

 private:
  model::TrialCard before_, after_;
};

class HiddenSpanCommand : public EditCommand {
 public:
  HiddenSpanCommand(ProjectDocument* doc, const model::HiddenSpan& span, bool add);
  void redo() override;
  void undo() override;

 private:
  void apply(bool add);
  model::HiddenSpan span_;
  bool add_;
};

// Swaps touchdown and lift-off of one limb's tags from a frame on: the fix for one key press
// too many, which flips the meaning of every later tag (docs/methods.md §1.5).
class SwapTagsCommand : public EditCommand {
 public:
  SwapTagsCommand(ProjectDocument* doc, int limb, std::int64_t fromFrame);
  void redo() override;
  void undo() override { redo(); }  // swapping twice restores the tags

 private:
  int limb_;
  std::int64_t fromFrame_;
};

// Leaves a reference stride out of the statistics with a reason, or takes it back in.
class StrideExclusionCommand : public EditCommand {
 public:
  StrideExclusionCommand(ProjectDocument* doc, std::int64_t startFrame, std::string reason,
                         bool exclude);
  void redo() override;
  void undo() override;

 private:
  void apply(bool exclude);
  model::StrideExclusion exclusion_;
  bool exclude_;
};

// Limb set, capture rate and reference limb: analysis settings kept in the annotation. The
// limb set may change only while nothing is tagged (the document checks).
struct AnnotationSettings {
  model::LimbSet limbs = model::LimbSet::quadruped();
  Rational captureRate{240, 1};
  int referenceLimb = 0;
};

class AnnotationSettingsCommand : public EditCommand {
 public:
  AnnotationSettingsCommand(ProjectDocument* doc, AnnotationSettings after);
  void redo() override;
  void undo() override;

 private:
  void apply(const AnnotationSettings& s);
  AnnotationSettings before_, after_;
};

// Sets, replaces or removes the seed of one limb on one frame (one seed per limb and frame):
// where a person clicked the foot so proposals can track it (issue 18 item 3).
class SeedCommand : public EditCommand {
 public:
  // `after` empty removes the seed of `limb` on `frame`.
  SeedCommand(ProjectDocument* doc, int limb, std::int64_t frame,
              std::optional<model::FootSeed> after);
  void redo() override { apply(after_); }
  void undo() override { apply(before_); }

 private:
  void apply(const std::optional<model::FootSeed>& seed);
  int limb_;
  std::int64_t frame_;
  std::optional<model::FootSeed> before_, after_;
};

// Every change of the proposals under review: a run's result stored, an accept (the proposal
// leaves the list and becomes a tag), a reject, a nudge, an accept of all above a confidence.
// It keeps the proposals before and after and the tags it added, so undo restores both.
// Consecutive nudges of the same proposal merge into one history entry.
class ProposalsCommand : public EditCommand {
 public:
  static constexpr int kNudgeId = 0x5e02;
  ProposalsCommand(ProjectDocument* doc, const QString& text, model::Proposals after,
                   std::vector<model::Event> tagsAdded = {},
                   std::vector<model::HiddenSpan> hiddenAdded = {});
  // A nudge: the proposal moved from `from` to `to` (merges with the next nudge of `to`).
  static ProposalsCommand* nudge(ProjectDocument* doc, const QString& text, model::Proposals after,
                                 const model::Event& from, const model::Event& to);
  void redo() override;
  void undo() override;
  int id() const override { return nudgedTo_ ? kNudgeId : -1; }
  bool mergeWith(const QUndoCommand* other) override;

 private:
  model::Proposals before_, after_;
  std::vector<model::Event> tagsAdded_;
  std::vector<model::HiddenSpan> hiddenAdded_;
  std::optional<model::Event> nudgedFrom_, nudgedTo_;  // set for nudges
};

}  // namespace stridemark::ui
