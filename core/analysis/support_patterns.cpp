#include "analysis/support_patterns.h"

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

namespace {

// Every frame at which some limb's known state begins or ends, ascending.
std::vector<std::int64_t> changeFrames(const std::vector<LimbTrack>& tracks) {
  std::vector<std::int64_t> frames;
  for (const LimbTrack& track : tracks) {
    for (const StateInterval& interval : track.known) {
      frames.push_back(interval.first);
      frames.push_back(interval.end);
    }
  }
  std::sort(frames.begin(), frames.end());
  frames.erase(std::unique(frames.begin(), frames.end()), frames.end());
  return frames;
}

}  // namespace

SupportTimeline::SupportTimeline(const LimbSet& limbs, const std::vector<LimbTrack>& tracks)
    : limbs_(limbs) {
  const std::vector<std::int64_t> frames = changeFrames(tracks);
  std::vector<std::size_t> next(tracks.size(), 0);  // per limb: first interval not yet passed
  for (std::size_t f = 0; f + 1 < frames.size(); ++f) {
    SupportSegment segment{frames[f], frames[f + 1], 0, 0, true};
    for (std::size_t limb = 0; limb < tracks.size(); ++limb) {
      const std::vector<StateInterval>& known = tracks[limb].known;
      while (next[limb] < known.size() && known[next[limb]].end <= segment.first) ++next[limb];
      const bool inKnown = next[limb] < known.size() && known[next[limb]].first <= segment.first;
      if (!inKnown) {
        segment.known = false;
      } else if (known[next[limb]].stance) {
        ++segment.count;
        if (limb < 64) segment.mask |= std::uint64_t{1} << limb;
      }
    }
    if (!segment.known) segment.count = 0, segment.mask = 0;
    segments_.push_back(segment);
  }
}

SupportShares SupportTimeline::window(std::int64_t first, std::int64_t end) const {
  const auto from =
      std::upper_bound(segments_.begin(), segments_.end(), first,
                       [](std::int64_t frame, const SupportSegment& s) { return frame < s.end; });
  const auto to =
      std::lower_bound(from, segments_.end(), end,
                       [](const SupportSegment& s, std::int64_t frame) { return s.first < frame; });
  SupportShares out = shares(from, to, first, end);
  out.complete = out.knownFrames == end - first;
  return out;
}

SupportShares SupportTimeline::overall() const {
  if (segments_.empty()) return shares(segments_.begin(), segments_.end(), 0, 0);
  return shares(segments_.begin(), segments_.end(), segments_.front().first, segments_.back().end);
}

SupportShares SupportTimeline::shares(std::vector<SupportSegment>::const_iterator from,
                                      std::vector<SupportSegment>::const_iterator to,
                                      std::int64_t first, std::int64_t end) const {
  SupportShares out;
  out.byCount.assign(static_cast<std::size_t>(limbs_.size()) + 1, 0.0);
  std::vector<std::pair<std::uint64_t, std::int64_t>> framesByMask;  // in order of appearance
  for (auto s = from; s != to; ++s) {
    const std::int64_t frames = std::min(end, s->end) - std::max(first, s->first);
    if (frames <= 0 || !s->known) continue;
    out.knownFrames += frames;
    out.byCount[static_cast<std::size_t>(s->count)] += static_cast<double>(frames);
    if (s->count == 0) out.aerial = true;
    auto slot = std::find_if(framesByMask.begin(), framesByMask.end(),
                             [&](const auto& entry) { return entry.first == s->mask; });
    if (slot == framesByMask.end()) {
      framesByMask.push_back({s->mask, frames});
    } else {
      slot->second += frames;
    }
  }
  if (out.knownFrames == 0) {
    out.byCount.clear();
    return out;
  }
  const auto known = static_cast<double>(out.knownFrames);
  for (double& share : out.byCount) share /= known;
  if (limbs_.size() > 64) return out;  // masks cannot name the combinations
  for (const auto& [mask, frames] : framesByMask)
    out.byCombination[combinationName(limbs_, mask)] += static_cast<double>(frames) / known;
  return out;
}

}  // namespace stridemark::analysis
