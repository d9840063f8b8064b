// The document's edits of foot seeds and proposals (issue 18 item 3): each one is an undo
// command from commands.h; this file decides what the command changes.
#include <QCoreApplication>
#include <algorithm>
#include <tuple>

#include "ui/document/commands.h"
#include "ui/document/project_document.h"

namespace stridemark::ui {

namespace {

bool inRange(std::int64_t frame, const model::FrameRange& range) {
  return frame >= range.first && frame <= range.last;
}

bool hasLimb(const std::vector<int>& limbs, int limb) {
  return std::find(limbs.begin(), limbs.end(), limb) != limbs.end();
}

void sortProposals(model::Proposals& p) {
  std::sort(p.events.begin(), p.events.end(),
            [](const auto& a, const auto& b) { return a.event < b.event; });
  std::sort(p.hidden.begin(), p.hidden.end(), [](const auto& a, const auto& b) {
    return std::tie(a.limb, a.first, a.last) < std::tie(b.limb, b.first, b.last);
  });
}

}  // namespace

bool ProjectDocument::setSeed(const model::FootSeed& seed) {
  if (seed.limb < 0 || seed.limb >= project_.annotation.limbs.size() || seed.frame < 0)
    return false;
  const auto& seeds = project_.seeds;
  if (std::find(seeds.begin(), seeds.end(), seed) != seeds.end()) return false;
  undo_.push(new SeedCommand(this, seed.limb, seed.frame, seed));
  return true;
}

bool ProjectDocument::removeSeed(int limb, std::int64_t frame) {
  const auto& seeds = project_.seeds;
  const bool present = std::any_of(seeds.begin(), seeds.end(), [&](const model::FootSeed& s) {
    return s.limb == limb && s.frame == frame;
  });
  if (!present) return false;
  undo_.push(new SeedCommand(this, limb, frame, std::nullopt));
  return true;
}

void ProjectDocument::storeProposals(const model::Proposals& result, const std::vector<int>& limbs,
                                     const model::FrameRange& range) {
  model::Proposals after = project_.proposals;
  std::erase_if(after.events, [&](const model::ProposedEvent& p) {
    return hasLimb(limbs, p.event.limb) && inRange(p.event.frame, range);
  });
  std::erase_if(after.hidden, [&](const model::HiddenSpan& h) {
    return hasLimb(limbs, h.limb) && h.last >= range.first && h.first <= range.last;
  });
  int added = 0;
  for (const auto& p : result.events) {
    if (!hasLimb(limbs, p.event.limb) || contains(p.event)) continue;
    after.events.push_back(p);
    ++added;
  }
  for (const auto& h : result.hidden)
    if (hasLimb(limbs, h.limb)) after.hidden.push_back(h);
  sortProposals(after);
  undo_.push(new ProposalsCommand(
      this,
      QCoreApplication::translate("Stridemark", "Propose %n event(s)", nullptr, added) +
          tr(" in frames %1-%2").arg(range.first).arg(range.last),
      std::move(after)));
}

const model::ProposedEvent* ProjectDocument::findProposal(const model::Event& event) const {
  const auto& events = project_.proposals.events;
  const auto it = std::find_if(events.begin(), events.end(),
                               [&](const model::ProposedEvent& p) { return p.event == event; });
  return it == events.end() ? nullptr : &*it;
}

ProjectDocument::AcceptOutcome ProjectDocument::acceptProposal(const model::Event& event) {
  if (!findProposal(event)) return AcceptOutcome::missing;
  if (hasTagOn(event.limb, event.frame)) return AcceptOutcome::tagOnFrame;
  model::Proposals after = project_.proposals;
  std::erase_if(after.events, [&](const model::ProposedEvent& p) { return p.event == event; });
  const QString limb = QString::fromStdString(project_.annotation.limbs.label(event.limb));
  undo_.push(
      new ProposalsCommand(this,
                           tr("Accept %1 %2 at frame %3")
                               .arg(limb, QString::fromUtf8(model::eventWord(event.kind).data()))
                               .arg(event.frame),
                           std::move(after), {event}));
  return AcceptOutcome::accepted;
}

bool ProjectDocument::rejectProposal(const model::Event& event) {
  if (!findProposal(event)) return false;
  model::Proposals after = project_.proposals;
  std::erase_if(after.events, [&](const model::ProposedEvent& p) { return p.event == event; });
  const QString limb = QString::fromStdString(project_.annotation.limbs.label(event.limb));
  undo_.push(
      new ProposalsCommand(this,
                           tr("Reject %1 %2 at frame %3")
                               .arg(limb, QString::fromUtf8(model::eventWord(event.kind).data()))
                               .arg(event.frame),
                           std::move(after)));
  return true;
}

std::optional<model::Event> ProjectDocument::nudgeProposal(const model::Event& event,
                                                           std::int64_t delta) {
  if (delta == 0 || !findProposal(event)) return std::nullopt;
  model::Event target = event;
  target.frame += delta;
  if (target.frame < 0) return std::nullopt;
  const auto& clip = project_.annotation.clip;
  if (clip && target.frame > clip->last) return std::nullopt;
  if (findProposal(target)) return std::nullopt;
  model::Proposals after = project_.proposals;
  for (auto& p : after.events)
    if (p.event == event) p.event = target;
  sortProposals(after);
  undo_.push(
      ProposalsCommand::nudge(this, tr("Nudge a proposal"), std::move(after), event, target));
  return target;
}

std::vector<model::ProposedEvent> ProjectDocument::acceptableFrom(double minConfidence) const {
  std::vector<model::ProposedEvent> out;
  for (const auto& p : project_.proposals.events) {
    if (p.confidence < minConfidence || hasTagOn(p.event.limb, p.event.frame)) continue;
    // Two proposals of one limb on one frame: the first one taken keeps the frame.
    const bool frameTaken = std::any_of(out.begin(), out.end(), [&](const auto& q) {
      return q.event.limb == p.event.limb && q.event.frame == p.event.frame;
    });
    if (!frameTaken) out.push_back(p);
  }
  return out;
}

int ProjectDocument::acceptProposalsFrom(double minConfidence) {
  const auto accepted = acceptableFrom(minConfidence);
  if (accepted.empty()) return 0;
  model::Proposals after = project_.proposals;
  std::vector<model::Event> tags;
  for (const auto& p : accepted) {
    tags.push_back(p.event);
    std::erase(after.events, p);
  }
  const int n = static_cast<int>(accepted.size());
  undo_.push(new ProposalsCommand(
      this,
      QCoreApplication::translate("Stridemark", "Accept %n proposal(s)", nullptr, n) +
          tr(" at confidence %1 or more").arg(minConfidence, 0, 'f', 2),
      std::move(after), std::move(tags)));
  return n;
}

int ProjectDocument::acceptProposedHiddenSpans() {
  const auto spans = project_.proposals.hidden;
  if (spans.empty()) return 0;
  std::vector<model::HiddenSpan> added;
  const auto& hidden = project_.annotation.hidden;
  for (const auto& s : spans)
    if (std::find(hidden.begin(), hidden.end(), s) == hidden.end()) added.push_back(s);
  model::Proposals after = project_.proposals;
  after.hidden.clear();
  const int n = static_cast<int>(spans.size());
  undo_.push(new ProposalsCommand(
      this,
      QCoreApplication::translate("Stridemark", "Accept %n proposed hidden span(s)", nullptr, n),
      std::move(after), {}, std::move(added)));
  return n;
}

}  // namespace stridemark::ui
