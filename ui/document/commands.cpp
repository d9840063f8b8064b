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

SwapTagsCommand::SwapTagsCommand(ProjectDocument* doc, int limb, std::int64_t fromFrame)
    : EditCommand(doc, QCoreApplication::translate("Stridemark", "Swap %1's tags from frame %2")
                           .arg(QString::fromStdString(doc->annotation().limbs.label(limb)))
                           .arg(fromFrame)),
      limb_(limb),
      fromFrame_(fromFrame) {}

void SwapTagsCommand::redo() {
  auto& a = project().annotation;
  for (model::Event& e : a.events) {
    if (e.limb != limb_ || e.frame < fromFrame_) continue;
    e.kind = e.kind == model::EventKind::touchdown ? model::EventKind::liftoff
                                                   : model::EventKind::touchdown;
  }
  a.normalize();
  finished();
}

StrideExclusionCommand::StrideExclusionCommand(ProjectDocument* doc, std::int64_t startFrame,
                                               std::string reason, bool exclude)
    : EditCommand(doc, exclude ? QCoreApplication::translate("Stridemark", "Exclude stride")
                               : QCoreApplication::translate("Stridemark", "Include stride")),
      exclusion_{startFrame, std::move(reason)},
      exclude_(exclude) {
  if (exclude) return;
  for (const model::StrideExclusion& x : doc->annotation().excluded)
    if (x.startFrame == startFrame) exclusion_.reason = x.reason;  // to restore on undo
}

void StrideExclusionCommand::apply(bool exclude) {
  auto& list = project().annotation.excluded;
  std::erase_if(
      list, [&](const model::StrideExclusion& x) { return x.startFrame == exclusion_.startFrame; });
  if (exclude) {
    const auto at = std::lower_bound(
        list.begin(), list.end(), exclusion_.startFrame,
        [](const model::StrideExclusion& x, std::int64_t f) { return x.startFrame < f; });
    list.insert(at, exclusion_);
  }
  finished();
}

void StrideExclusionCommand::redo() {
  apply(exclude_);
}

void StrideExclusionCommand::undo() {
  apply(!exclude_);
}

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

// --- Seeds ---

SeedCommand::SeedCommand(ProjectDocument* doc, int limb, std::int64_t frame,
                         std::optional<model::FootSeed> after)
    : EditCommand(doc, {}), limb_(limb), frame_(frame), after_(std::move(after)) {
  for (const model::FootSeed& s : doc->project().seeds)
    if (s.limb == limb && s.frame == frame) before_ = s;
  const QString limbName = limbText(doc->project(), limb);
  if (!after_) {
    setText(QCoreApplication::translate("Stridemark", "Remove %1's seed at frame %2")
                .arg(limbName)
                .arg(frame));
  } else {
    setText((before_ ? QCoreApplication::translate("Stridemark", "Move %1's seed at frame %2")
                     : QCoreApplication::translate("Stridemark", "Seed %1 at frame %2"))
                .arg(limbName)
                .arg(frame));
  }
}

void SeedCommand::apply(const std::optional<model::FootSeed>& seed) {
  auto& seeds = project().seeds;
  std::erase_if(seeds,
                [&](const model::FootSeed& s) { return s.limb == limb_ && s.frame == frame_; });
  if (seed) {
    const auto at = std::find_if(seeds.begin(), seeds.end(), [&](const model::FootSeed& s) {
      return s.limb > seed->limb || (s.limb == seed->limb && s.frame > seed->frame);
    });
    seeds.insert(at, *seed);
  }
  finished();
}

// --- Proposals ---

ProposalsCommand::ProposalsCommand(ProjectDocument* doc, const QString& text,
                                   model::Proposals after, std::vector<model::Event> tagsAdded,
                                   std::vector<model::HiddenSpan> hiddenAdded)
    : EditCommand(doc, text),
      before_(doc->project().proposals),
      after_(std::move(after)),
      tagsAdded_(std::move(tagsAdded)),
      hiddenAdded_(std::move(hiddenAdded)) {}

ProposalsCommand* ProposalsCommand::nudge(ProjectDocument* doc, const QString& text,
                                          model::Proposals after, const model::Event& from,
                                          const model::Event& to) {
  auto* command = new ProposalsCommand(doc, text, std::move(after));
  command->nudgedFrom_ = from;
  command->nudgedTo_ = to;
  return command;
}

void ProposalsCommand::redo() {
  project().proposals = after_;
  for (const auto& e : tagsAdded_) insertSorted(project().annotation.events, e);
  auto& hidden = project().annotation.hidden;
  hidden.insert(hidden.end(), hiddenAdded_.begin(), hiddenAdded_.end());
  project().annotation.normalize();
  finished();
}

void ProposalsCommand::undo() {
  project().proposals = before_;
  for (const auto& e : tagsAdded_) eraseExact(project().annotation.events, e);
  for (const auto& h : hiddenAdded_) {
    auto& hidden = project().annotation.hidden;
    if (const auto it = std::find(hidden.begin(), hidden.end(), h); it != hidden.end())
      hidden.erase(it);
  }
  finished();
}

bool ProposalsCommand::mergeWith(const QUndoCommand* other) {
  const auto* next = dynamic_cast<const ProposalsCommand*>(other);
  // Only a nudge of the proposal this one left behind continues the same gesture.
  if (!next || !nudgedTo_ || next->nudgedFrom_ != nudgedTo_ || next->before_ != after_)
    return false;
  after_ = next->after_;
  nudgedTo_ = next->nudgedTo_;
  if (after_ == before_) setObsolete(true);
  return true;
}

}  // namespace stridemark::ui
