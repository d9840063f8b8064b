#include "ui/document/project_document.h"

#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <algorithm>

#include "common/error.h"
#include "ui/document/commands.h"
#include "ui/document/journal.h"
#include "ui/document/project_io.h"

namespace stridemark::ui {

ProjectDocument::ProjectDocument(QObject* parent) : QObject(parent) {
  // The journal follows the history: every push, undo or redo rewrites it.
  connect(&undo_, &QUndoStack::indexChanged, this, [this] {
    if (!resetting_) syncJournal();
  });
}

void ProjectDocument::syncJournal() {
  try {
    if (undo_.isClean()) {
      removeJournal();
    } else {
      writeJournal();
    }
    emit journalWritten();
  } catch (const Error& e) {
    emit journalFailed(QString::fromStdString(e.what()));
  }
}

ProjectDocument::~ProjectDocument() {
  // The undo stack clears itself when destroyed, after projectPath_ (declared later) is gone:
  // its indexChanged must not reach the journal handler then. Saving and discarding remove the
  // journal; a document destroyed with unsaved edits keeps it for recovery.
  disconnect(&undo_, nullptr, this, nullptr);
}

QString ProjectDocument::videoPath() const {
  if (!project_.video) return {};
  const QString stored = QString::fromStdString(project_.video->path);
  if (QFileInfo(stored).isAbsolute() || projectPath_.isEmpty()) return stored;
  return QFileInfo(projectPath_).dir().absoluteFilePath(stored);
}

QString ProjectDocument::journalPathFor(const QString& projectOrVideoPath) {
  return projectOrVideoPath + QLatin1String(journal::kSuffix);
}

QString ProjectDocument::journalPath() const {
  if (!projectPath_.isEmpty()) return journalPathFor(projectPath_);
  const QString video = videoPath();
  return video.isEmpty() ? QString() : journalPathFor(video);
}

void ProjectDocument::reset(model::Project project, const QString& projectPath, bool modified) {
  project.annotation.normalize();
  project_ = std::move(project);
  projectPath_ = projectPath;
  resetting_ = true;
  undo_.clear();
  resetting_ = false;
  if (modified) {
    // A recovered state is unsaved: mark clean at an index that can never be reached again.
    undo_.resetClean();
    syncJournal();
  }
  ++revision_;
  emit projectReset();
  emit annotationChanged();
  emit trialChanged();
  emit pathChanged(projectPath_);
}

void ProjectDocument::saveAs(const QString& path) {
  model::Project toSave = project_;
  if (toSave.video) {
    // Store the video relative to the project file when it lives beside or below it.
    const QString absVideo = videoPath();
    const QString rel = QFileInfo(path).dir().relativeFilePath(absVideo);
    toSave.video->path = (rel.startsWith(QLatin1String("..")) ? absVideo : rel).toStdString();
  }
  saveProjectFile(path, toSave);
  const QString oldJournal = journalPath();
  project_ = std::move(toSave);
  projectPath_ = path;
  undo_.setClean();
  if (!oldJournal.isEmpty()) QFile::remove(oldJournal);
  removeJournal();
  emit pathChanged(projectPath_);
}

bool ProjectDocument::contains(const model::Event& event) const {
  const auto& events = project_.annotation.events;
  return std::binary_search(events.begin(), events.end(), event);
}

std::optional<model::Event> ProjectDocument::tag(int limb, std::int64_t frame, bool opposite) {
  // One event per limb and frame: a second press on the same frame is refused.
  for (const auto kind : {model::EventKind::touchdown, model::EventKind::liftoff})
    if (contains({frame, limb, kind})) return std::nullopt;
  const bool stance = project_.annotation.inStance(limb, frame) != opposite;
  const model::Event event{frame, limb,
                           stance ? model::EventKind::liftoff : model::EventKind::touchdown};
  if (!addEvent(event)) return std::nullopt;
  return event;
}

bool ProjectDocument::addEvent(const model::Event& event) {
  if (event.limb < 0 || event.limb >= project_.annotation.limbs.size() || contains(event))
    return false;
  undo_.push(new AddEventCommand(this, event));
  return true;
}

void ProjectDocument::removeEvents(const std::vector<model::Event>& events) {
  std::vector<model::Event> present;
  for (const auto& e : events)
    if (contains(e)) present.push_back(e);
  if (!present.empty()) undo_.push(new RemoveEventsCommand(this, std::move(present)));
}

bool ProjectDocument::moveEvents(const std::vector<model::Event>& events, std::int64_t delta,
                                 bool nudge) {
  if (events.empty() || delta == 0) return false;
  for (const auto& e : events) {
    if (!contains(e)) return false;
    model::Event target = e;
    target.frame += delta;
    if (target.frame < 0) return false;
    if (project_.annotation.clip && target.frame > project_.annotation.clip->last) return false;
    // Refuse to land on an event that is not itself moving.
    const bool moving = std::find(events.begin(), events.end(), target) != events.end();
    if (contains(target) && !moving) return false;
  }
  undo_.push(new MoveEventsCommand(this, events, delta, nudge));
  return true;
}

bool ProjectDocument::hasTagOn(int limb, std::int64_t frame) const {
  return contains({frame, limb, model::EventKind::touchdown}) ||
         contains({frame, limb, model::EventKind::liftoff});
}

void ProjectDocument::setTrialCard(const model::TrialCard& card) {
  if (card == project_.trial) return;
  undo_.push(new SetTrialCardCommand(this, card));
}

void ProjectDocument::addHiddenSpan(const model::HiddenSpan& span) {
  auto s = span;
  if (s.first > s.last) std::swap(s.first, s.last);
  undo_.push(new HiddenSpanCommand(this, s, true));
}

void ProjectDocument::removeHiddenSpan(const model::HiddenSpan& span) {
  const auto& spans = project_.annotation.hidden;
  if (std::find(spans.begin(), spans.end(), span) == spans.end()) return;
  undo_.push(new HiddenSpanCommand(this, span, false));
}

void ProjectDocument::swapTagsFrom(int limb, std::int64_t fromFrame) {
  if (limb < 0 || limb >= project_.annotation.limbs.size()) return;
  undo_.push(new SwapTagsCommand(this, limb, fromFrame));
}

bool ProjectDocument::isExcluded(std::int64_t startFrame) const {
  const auto& list = project_.annotation.excluded;
  return std::any_of(list.begin(), list.end(),
                     [&](const model::StrideExclusion& x) { return x.startFrame == startFrame; });
}

bool ProjectDocument::excludeStride(std::int64_t startFrame, const std::string& reason) {
  if (isExcluded(startFrame)) return false;
  undo_.push(new StrideExclusionCommand(this, startFrame, reason, true));
  return true;
}

bool ProjectDocument::includeStride(std::int64_t startFrame) {
  if (!isExcluded(startFrame)) return false;
  undo_.push(new StrideExclusionCommand(this, startFrame, {}, false));
  return true;
}

void ProjectDocument::setCaptureRate(Rational rate) {
  const auto& a = project_.annotation;
  if (!rate.valid() || rate == a.captureRate) return;
  undo_.push(new AnnotationSettingsCommand(this, {a.limbs, reduced(rate), a.referenceLimb}));
}

void ProjectDocument::setReferenceLimb(int limb) {
  const auto& a = project_.annotation;
  if (limb < 0 || limb >= a.limbs.size() || limb == a.referenceLimb) return;
  undo_.push(new AnnotationSettingsCommand(this, {a.limbs, a.captureRate, limb}));
}

bool ProjectDocument::setLimbSet(const model::LimbSet& limbs) {
  const auto& a = project_.annotation;
  if (limbs == a.limbs) return true;
  if (limbSetLocked()) return false;
  undo_.push(new AnnotationSettingsCommand(this, {limbs, a.captureRate, limbs.defaultReference()}));
  return true;
}

bool ProjectDocument::limbSetLocked() const {
  const auto& a = project_.annotation;
  return !a.events.empty() || !a.hidden.empty() || !project_.seeds.empty() ||
         !project_.proposals.events.empty() || !project_.proposals.hidden.empty();
}

void ProjectDocument::afterEdit(bool trialToo) {
  ++revision_;
  emit annotationChanged();
  if (trialToo) emit trialChanged();
}

void ProjectDocument::writeJournal() const {
  const QString file = journalPath();
  if (!file.isEmpty()) journal::write(file, project_, projectPath_);
}

void ProjectDocument::removeJournal() const {
  const QString file = journalPath();
  if (!file.isEmpty()) QFile::remove(file);
}

std::optional<model::Project> ProjectDocument::readJournal(const QString& journalFile) {
  return journal::read(journalFile);
}

}  // namespace stridemark::ui
