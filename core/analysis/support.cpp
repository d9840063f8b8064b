#include "analysis/support.h"

#include <algorithm>
#include <bit>

namespace stridemark::analysis {
namespace {

using model::LimbSet;
using model::LimbSetKind;

std::string joined(const LimbSet& limbs, std::uint64_t mask, bool sortLabels) {
  std::vector<std::string> labels;
  for (int i = 0; i < limbs.size() && i < 64; ++i)
    if (mask & (std::uint64_t{1} << i)) labels.push_back(limbs.label(i));
  if (sortLabels) std::sort(labels.begin(), labels.end());
  std::string out;
  for (const std::string& l : labels) out += (out.empty() ? "" : "+") + l;
  return out;
}

std::string quadrupedPairName(const LimbSet& limbs, int a, int b) {
  const model::Limb& la = limbs.limb(a);
  const model::Limb& lb = limbs.limb(b);
  if (la.segment == lb.segment) return la.segment == 0 ? "fore pair" : "hind pair";
  const int hind = la.segment == 1 ? a : b;
  const int fore = hind == a ? b : a;
  const std::string labels = limbs.label(hind) + "+" + limbs.label(fore);
  return (la.side == lb.side ? "lateral " : "diagonal ") + labels;
}

}  // namespace

std::string combinationName(const LimbSet& limbs, std::uint64_t mask) {
  if (mask == 0) return "suspension";
  if (limbs.kind() != LimbSetKind::quadruped) return joined(limbs, mask, true);
  const int count = std::popcount(mask);
  if (count == 4) return "all four";
  if (count == 3) return "tripod " + joined(limbs, mask, false);
  if (count == 1) return joined(limbs, mask, false);
  const int a = std::countr_zero(mask);
  const int b = std::countr_zero(mask & (mask - 1));
  return quadrupedPairName(limbs, a, b);
}

SupportTimeline::SupportTimeline(const LimbSet& limbs, const std::vector<LimbTrack>& tracks)
    : limbs_(limbs), tracks_(tracks), named_(limbs.size() <= 64) {
  restart();
}

void SupportTimeline::restart() {
  cursors_.clear();
  nextChange_.assign(tracks_.size(), kNoChange);
  for (std::size_t i = 0; i < tracks_.size(); ++i) {
    cursors_.push_back(Cursor{KnownStates::Reader(tracks_[i].known), 0});
    if (!cursors_[i].known.done()) nextChange_[i] = cursors_[i].known.current().first;
  }
  unknown_ = static_cast<int>(tracks_.size());
  stance_ = 0;
  mask_ = 0;
  started_ = false;
  producedTo_ = 0;
  buffer_.clear();
  resetTally(overall_);
}

void SupportTimeline::resetTally(Tally& tally) const {
  tally.shares = SupportShares{};
  tally.shares.byCount.assign(static_cast<std::size_t>(limbs_.size()) + 1, 0.0);
  tally.covered = 0;
  tally.byMask.clear();
}

bool SupportTimeline::produce() {
  while (true) {
    const auto earliest = std::min_element(nextChange_.begin(), nextChange_.end());
    if (earliest == nextChange_.end() || *earliest == kNoChange) break;
    const std::int64_t frame = *earliest;
    const bool known = unknown_ == 0;
    const Segment previous{segmentStart_, frame, known ? mask_ : 0, known ? stance_ : 0, known};
    for (std::size_t i = 0; i < nextChange_.size(); ++i) {
      if (nextChange_[i] != frame) continue;
      const int limb = static_cast<int>(i);
      Cursor& c = cursors_[i];
      KnownStates::Reader& states = c.known;
      const int before = c.state;
      while (!states.done() && states.current().end <= frame) states.next();
      std::int64_t nextChange = -1;
      if (!states.done() && states.current().first <= frame) {
        c.state = states.current().stance ? 2 : 1;
        nextChange = states.current().end;
      } else {
        c.state = 0;
        if (!states.done()) nextChange = states.current().first;
      }
      unknown_ += (c.state == 0) - (before == 0);
      stance_ += (c.state == 2) - (before == 2);
      if (named_ && (c.state == 2) != (before == 2)) mask_ ^= std::uint64_t{1} << limb;
      nextChange_[i] = nextChange >= 0 ? nextChange : kNoChange;
    }
    const bool hadSegment = started_ && previous.end > previous.first;
    started_ = true;
    segmentStart_ = frame;
    if (hadSegment) {
      buffer_.push_back(previous);
      producedTo_ = previous.end;
      accumulate(previous, previous.first, previous.end, overall_);
      return true;
    }
  }
  return false;
}

void SupportTimeline::accumulate(const Segment& s, std::int64_t first, std::int64_t end,
                                 Tally& tally) const {
  const std::int64_t frames = std::min(end, s.end) - std::max(first, s.first);
  if (frames <= 0 || !s.known) return;
  tally.covered += frames;
  tally.shares.byCount[static_cast<std::size_t>(s.count)] += static_cast<double>(frames);
  if (s.count == 0) tally.shares.aerial = true;
  if (!named_) return;
  auto slot = std::find_if(tally.byMask.begin(), tally.byMask.end(),
                           [&](const auto& e) { return e.first == s.mask; });
  if (slot == tally.byMask.end()) {
    tally.byMask.push_back({s.mask, frames});
  } else {
    slot->second += frames;
  }
}

SupportShares SupportTimeline::finish(Tally& tally, bool combinations) {
  SupportShares out = std::move(tally.shares);
  const std::int64_t covered = tally.covered;
  out.knownFrames = covered;
  if (covered == 0) {
    out.byCount.clear();
    return out;
  }
  for (double& share : out.byCount) share /= static_cast<double>(covered);
  if (!combinations) return out;
  for (const auto& [m, frames] : tally.byMask)
    out.byCombination[nameOf(m)] += static_cast<double>(frames) / static_cast<double>(covered);
  return out;
}

const std::string& SupportTimeline::nameOf(std::uint64_t mask) {
  auto it = names_.find(mask);
  if (it == names_.end()) it = names_.emplace(mask, combinationName(limbs_, mask)).first;
  return it->second;
}

void SupportTimeline::advanceTo(std::int64_t first, std::int64_t end) {
  const bool passed = buffer_.empty() ? first < producedTo_ : first < buffer_.front().first;
  if (passed) restart();
  // Drop segments wholly before the window; produce until the window is covered.
  auto behind =
      std::find_if(buffer_.begin(), buffer_.end(), [&](const Segment& s) { return s.end > first; });
  buffer_.erase(buffer_.begin(), behind);
  while ((buffer_.empty() || buffer_.back().end < end) && produce()) {
    if (buffer_.size() == 1 && buffer_.front().end <= first) buffer_.clear();
  }
}

SupportTimeline::WindowFlags SupportTimeline::flags(std::int64_t first, std::int64_t end) {
  advanceTo(first, end);
  WindowFlags out;
  std::int64_t covered = 0;
  for (const Segment& s : buffer_) {
    const std::int64_t frames = std::min(end, s.end) - std::max(first, s.first);
    if (frames <= 0 || !s.known) continue;
    covered += frames;
    if (s.count == 0) out.aerial = true;
  }
  out.complete = covered == end - first;
  return out;
}

SupportShares SupportTimeline::window(std::int64_t first, std::int64_t end, bool combinations) {
  advanceTo(first, end);
  resetTally(window_);
  for (const Segment& s : buffer_) accumulate(s, first, end, window_);
  const bool complete = window_.covered == end - first;
  SupportShares out = finish(window_, combinations);
  out.complete = complete;
  return out;
}

SupportShares SupportTimeline::overall() {
  while (produce()) buffer_.clear();  // the rest of the sweep; earlier segments are counted
  SupportShares out = finish(overall_);
  restart();
  return out;
}

}  // namespace stridemark::analysis
