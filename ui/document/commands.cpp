#include "ui/document/commands.h"

#include <QCoreApplication>
#include <algorithm>

#include "ui/document/project_document.h"

namespace stridemark::ui {

namespace {

QString limbText(const model::Project& p, int limb) {
  return QString::fromStdString(p.annotation.limbs.label(limb));
}

void insertSorted(std::vector<model::Event>& events, const model::Event& e) {
  events.insert(std::lower_bound(events.begin(), events.end(), e), e);
}

void eraseExact(std::vector<model::Event>& events, const model::Event& e) {
  auto it = std::lower_bound(events.begin(), events.end(), e);
  if (it != events.end() && *it == e) events.erase(it);
}

}  // namespace

model::Project& EditCommand::project() {
  return doc_->mutableProject();
}

void EditCommand::finished(bool trialToo) {
  doc_->afterEdit(trialToo);
}

// --- AddEvent ---

AddEventCommand::AddEventCommand(ProjectDocument* doc, const model::Event& event)
    : EditCommand(doc, {}), event_(event) {
  setText(QCoreApplication::translate("Stridemark", "Tag %1 %2 at frame %3")
              .arg(limbText(doc->project(), event.limb),
                   QString::fromUtf8(model::eventWord(event.kind).data()))
              .arg(event.frame));
}

void AddEventCommand::redo() {
  insertSorted(project().annotation.events, event_);
  finished();
}

void AddEventCommand::undo() {
  eraseExact(project().annotation.events, event_);
  finished();
}

// --- RemoveEvents ---

RemoveEventsCommand::RemoveEventsCommand(ProjectDocument* doc, std::vector<model::Event> events)
    : EditCommand(doc, {}), events_(std::move(events)) {
  setText(QCoreApplication::translate("Stridemark", "Delete %n event(s)", nullptr,
                                      static_cast<int>(events_.size())));
}

void RemoveEventsCommand::redo() {
  for (const auto& e : events_) eraseExact(project().annotation.events, e);
  finished();
}

void RemoveEventsCommand::undo() {
  for (const auto& e : events_) insertSorted(project().annotation.events, e);
  finished();
}

// --- MoveEvents ---

MoveEventsCommand::MoveEventsCommand(ProjectDocument* doc, std::vector<model::Event> events,
                                     std::int64_t delta, bool nudge)
    : EditCommand(doc, {}), events_(std::move(events)), delta_(delta), nudge_(nudge) {
  std::sort(events_.begin(), events_.end());
  setText(nudge_ ? QCoreApplication::translate("Stridemark", "Nudge %n event(s)", nullptr,
                                               static_cast<int>(events_.size()))
                 : QCoreApplication::translate("Stridemark", "Move %n event(s)", nullptr,
                                               static_cast<int>(events_.size())));
}

void MoveEventsCommand::shift(const std::vector<model::Event>& from, std::int64_t delta) {
  auto& events = project().annotation.events;
  for (const auto& e : from) eraseExact(events, e);
  for (auto e : from) {
    e.frame += delta;
    insertSorted(events, e);
  }
  finished();
}

std::vector<model::Event> MoveEventsCommand::movedEvents() const {
  std::vector<model::Event> out = events_;
  for (auto& e : out) e.frame += delta_;
  std::sort(out.begin(), out.end());
  return out;
}

void MoveEventsCommand::redo() {
  shift(events_, delta_);
}

void MoveEventsCommand::undo() {
  shift(movedEvents(), -delta_);
}

bool MoveEventsCommand::mergeWith(const QUndoCommand* other) {
  const auto* next = dynamic_cast<const MoveEventsCommand*>(other);
  if (!next || !nudge_ || !next->nudge_) return false;
  // Only a nudge of exactly the events this one left behind continues the same gesture.
  auto nextFrom = next->events_;
  if (nextFrom != movedEvents()) return false;
  delta_ += next->delta_;
  if (delta_ == 0) setObsolete(true);
  return true;
}

// --- Trial card ---

SetTrialCardCommand::SetTrialCardCommand(ProjectDocument* doc, model::TrialCard card)
    : EditCommand(doc, QCoreApplication::translate("Stridemark", "Edit trial card")),
      before_(doc->project().trial),
      after_(std::move(card)) {}

void SetTrialCardCommand::redo() {
  project().trial = after_;
  finished(true);
}

void SetTrialCardCommand::undo() {
  project().trial = before_;
  finished(true);
}

// --- Hidden spans ---

HiddenSpanCommand::HiddenSpanCommand(ProjectDocument* doc, const model::HiddenSpan& span, bool add)
    : EditCommand(doc, {}), span_(span), add_(add) {
  const QString limb = limbText(doc->project(), span.limb);
  setText(add ? QCoreApplication::translate("Stridemark", "Hide %1 frames %2-%3")
                    .arg(limb)
                    .arg(span.first)
                    .arg(span.last)
              : QCoreApplication::translate("Stridemark", "Unhide %1 frames %2-%3")
                    .arg(limb)
                    .arg(span.first)
                    .arg(span.last));
}

void HiddenSpanCommand::apply(bool add) {
  auto& spans = project().annotation.hidden;
  if (add) {
    spans.push_back(span_);
  } else {
    auto it = std::find(spans.begin(), spans.end(), span_);
    if (it != spans.end()) spans.erase(it);
  }
  project().annotation.normalize();
  finished();
}

void HiddenSpanCommand::redo() {
  apply(add_);
}

void HiddenSpanCommand::undo() {
  apply(!add_);
}

// --- Annotation settings ---

AnnotationSettingsCommand::AnnotationSettingsCommand(ProjectDocument* doc, AnnotationSettings after)
    : EditCommand(doc, QCoreApplication::translate("Stridemark", "Change analysis settings")),
      before_{doc->annotation().limbs, doc->annotation().captureRate,
              doc->annotation().referenceLimb},
      after_(std::move(after)) {}

void AnnotationSettingsCommand::apply(const AnnotationSettings& s) {
  auto& a = project().annotation;
  a.limbs = s.limbs;
  a.captureRate = s.captureRate;
  a.referenceLimb = s.referenceLimb;
  finished(true);
}

void AnnotationSettingsCommand::redo() {
  apply(after_);
}

void AnnotationSettingsCommand::undo() {
  apply(before_);
}

}  // namespace stridemark::ui
