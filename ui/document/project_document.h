#pragma once
// The open project: owns the model::Project value and the undo stack. Every change to the
// model goes through an undo command (commands.h); the document only notifies listeners and
// keeps the autosave journal current after each edit.
#include <QObject>
#include <QString>
#include <QUndoStack>
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"

namespace stridemark::ui {

class ProjectDocument : public QObject {
  Q_OBJECT
 public:
  explicit ProjectDocument(QObject* parent = nullptr);
  ~ProjectDocument() override;

  const model::Project& project() const { return project_; }
  const model::Annotation& annotation() const { return project_.annotation; }
  QUndoStack* undoStack() { return &undo_; }

  // Where the project was last saved or opened from; empty for a project never saved.
  QString projectPath() const { return projectPath_; }
  // Absolute path of the linked video, resolved against the project file.
  QString videoPath() const;
  // The journal file next to the project (or next to the video while unsaved).
  QString journalPath() const;
  bool isModified() const { return !undo_.isClean(); }
  // Grows on every change; lets async consumers drop stale results.
  std::uint64_t revision() const { return revision_; }

  // Replaces the whole project (open, new, recover). Clears history; `modified` marks the
  // loaded state as unsaved (used after recovering a journal).
  void reset(model::Project project, const QString& projectPath, bool modified = false);
  // Atomic save through core/formats; clears the modified flag and removes the journal.
  void saveAs(const QString& path);
  void save() { saveAs(projectPath_); }

  // --- edits (each pushes one undo command) ---
  // Marks touchdown if the limb is in swing at `frame`, lift-off if it is in stance. Returns
  // the event added, or nothing when an identical event already exists there.
  // `opposite` marks the other kind (a first lift-off when the clip starts in stance).
  std::optional<model::Event> tag(int limb, std::int64_t frame, bool opposite = false);
  bool addEvent(const model::Event& event);
  void removeEvents(const std::vector<model::Event>& events);
  // Moves events by `delta` frames. Nudges (one-frame key moves) merge into one history entry.
  bool moveEvents(const std::vector<model::Event>& events, std::int64_t delta, bool nudge);
  // Swaps touchdown and lift-off of `limb`'s tags at and after `fromFrame` (one undo step).
  void swapTagsFrom(int limb, std::int64_t fromFrame);
  // Leaves the reference stride starting at `startFrame` out of the statistics, with a reason;
  // includeStride() takes it back. Both are undo steps; a no-op returns false.
  bool excludeStride(std::int64_t startFrame, const std::string& reason);
  bool includeStride(std::int64_t startFrame);
  bool isExcluded(std::int64_t startFrame) const;
  void setTrialCard(const model::TrialCard& card);
  void addHiddenSpan(const model::HiddenSpan& span);
  void removeHiddenSpan(const model::HiddenSpan& span);
  void setCaptureRate(Rational rate);
  void setReferenceLimb(int limb);
  // Only while nothing is tagged, seeded or proposed (limb numbers would lose their meaning);
  // returns false otherwise.
  bool setLimbSet(const model::LimbSet& limbs);
  bool limbSetLocked() const;

  // True when `event` (same limb, frame and kind) is present.
  bool contains(const model::Event& event) const;
  // True when the limb has a tag of either kind on `frame`.
  bool hasTagOn(int limb, std::int64_t frame) const;

  // --- foot seeds and proposals (issue 18 item 3); each edit is one undo step ---
  // Sets the seed of seed.limb on seed.frame, replacing one there; false for an unknown limb,
  // a negative frame or an unchanged seed.
  bool setSeed(const model::FootSeed& seed);
  bool removeSeed(int limb, std::int64_t frame);
  // Stores a run's result: earlier proposals of `limbs` inside `range` give way to it. A
  // proposal equal to a tag already there is left out (nothing to review).
  void storeProposals(const model::Proposals& result, const std::vector<int>& limbs,
                      const model::FrameRange& range);
  const model::ProposedEvent* findProposal(const model::Event& event) const;
  enum class AcceptOutcome { accepted, missing, tagOnFrame };
  // The proposal becomes a tag and leaves the list. Refused (tagOnFrame) when the limb has a
  // tag on that frame already: one event per limb and frame, the person's tag wins.
  AcceptOutcome acceptProposal(const model::Event& event);
  bool rejectProposal(const model::Event& event);
  // Moves a proposal by `delta` frames (inside the clip, not onto another proposal of the same
  // limb and kind); returns where it is now. Consecutive nudges merge into one history entry.
  std::optional<model::Event> nudgeProposal(const model::Event& event, std::int64_t delta);
  // The proposals at or above `minConfidence` that accepting would turn into tags (in event
  // order; those on a frame where their limb has a tag are not among them).
  std::vector<model::ProposedEvent> acceptableFrom(double minConfidence) const;
  // Accepts acceptableFrom(minConfidence) as one undo step; returns how many.
  int acceptProposalsFrom(double minConfidence);
  // The proposed hidden spans become hidden spans of the annotation (one undo step; a span
  // already there is not added twice); returns how many were proposed.
  int acceptProposedHiddenSpans();

  // Journal handling. writeJournal() is called after every edit; readJournal() returns the
  // journalled project if one exists for `journalFile`.
  void writeJournal() const;
  void removeJournal() const;
  static std::optional<model::Project> readJournal(const QString& journalFile);
  static QString journalPathFor(const QString& projectOrVideoPath);

 signals:
  void annotationChanged();
  void trialChanged();
  void projectReset();
  void pathChanged(const QString& path);
  // The journal could not be written (disk full, read-only folder): the UI must warn until
  // journalWritten() says a later write succeeded. The message names the file and the reason.
  void journalFailed(const QString& message);
  void journalWritten();

 private:
  friend class EditCommand;
  model::Project& mutableProject() { return project_; }
  void afterEdit(bool trialToo);
  // Writes (or, when clean, removes) the journal; reports the outcome by signal, never throws.
  void syncJournal();

  model::Project project_;
  QUndoStack undo_;
  QString projectPath_;
  std::uint64_t revision_ = 0;
  bool resetting_ = false;
};

}  // namespace stridemark::ui
