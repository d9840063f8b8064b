#include "analysis/support.h"

#include <algorithm>
#include <bit>
#include <queue>

namespace stridemark::analysis {
namespace {

using model::LimbSet;
using model::LimbSetKind;
using model::Side;

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

// One limb's state as the sweep passes through its known intervals.
struct LimbCursor {
  const std::vector<StateInterval>* intervals = nullptr;
  std::size_t next = 0;
  int state = 0;  // 0 unknown, 1 swing, 2 stance

  // Updates the state at `frame` and returns the frame of the limb's next change, or -1.
  std::int64_t advance(std::int64_t frame) {
    const auto& iv = *intervals;
    while (next < iv.size() && iv[next].end <= frame) ++next;
    if (next < iv.size() && iv[next].first <= frame) {
      state = iv[next].stance ? 2 : 1;
      return iv[next].end;
    }
    state = 0;
    return next < iv.size() ? iv[next].first : -1;
  }
};

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
    : limbs_(limbs), named_(limbs.size() <= 64) {
  build(tracks);
}

void SupportTimeline::build(const std::vector<LimbTrack>& tracks) {
  // k-way merge of the limbs' interval boundaries: O(n log limbs), no global sort.
  using Change = std::pair<std::int64_t, int>;  // frame, limb
  std::priority_queue<Change, std::vector<Change>, std::greater<>> queue;
  std::vector<LimbCursor> cursors(tracks.size());
  for (std::size_t i = 0; i < tracks.size(); ++i) {
    cursors[i].intervals = &tracks[i].known;
    if (!tracks[i].known.empty()) queue.push({tracks[i].known.front().first, static_cast<int>(i)});
  }
  const int limbCount = static_cast<int>(tracks.size());
  int unknown = limbCount;
  int stance = 0;
  std::uint64_t mask = 0;
  while (!queue.empty()) {
    const std::int64_t frame = queue.top().first;
    while (!queue.empty() && queue.top().first == frame) {
      const int limb = queue.top().second;
      queue.pop();
      LimbCursor& cursor = cursors[static_cast<std::size_t>(limb)];
      const int before = cursor.state;
      const std::int64_t nextChange = cursor.advance(frame);
      unknown += (cursor.state == 0) - (before == 0);
      stance += (cursor.state == 2) - (before == 2);
      if (named_ && (cursor.state == 2) != (before == 2)) mask ^= std::uint64_t{1} << limb;
      if (nextChange >= 0) queue.push({nextChange, limb});
    }
    if (!segments_.empty() && segments_.back().end < 0) segments_.back().end = frame;
    if (queue.empty()) break;
    const bool known = unknown == 0;
    if (!segments_.empty() && segments_.back().known == known && segments_.back().mask == mask &&
        segments_.back().count == stance) {
      segments_.back().end = -1;  // same state continues
    } else {
      segments_.push_back({frame, -1, known ? mask : 0, known ? stance : 0, known});
    }
  }
  if (!segments_.empty() && segments_.back().end < 0) segments_.pop_back();
}

const std::string& SupportTimeline::nameOf(std::uint64_t mask) const {
  auto it = names_.find(mask);
  if (it == names_.end()) it = names_.emplace(mask, combinationName(limbs_, mask)).first;
  return it->second;
}

SupportShares SupportTimeline::summarise(std::vector<Segment>::const_iterator begin,
                                         std::int64_t first, std::int64_t end) const {
  SupportShares out;
  out.byCount.assign(static_cast<std::size_t>(limbs_.size()) + 1, 0.0);
  scratch_.clear();
  std::int64_t covered = 0;
  for (auto it = begin; it != segments_.end() && it->first < end; ++it) {
    const std::int64_t frames = std::min(end, it->end) - std::max(first, it->first);
    if (frames <= 0 || !it->known) continue;
    covered += frames;
    out.byCount[static_cast<std::size_t>(it->count)] += static_cast<double>(frames);
    if (it->count == 0) out.aerial = true;
    if (!named_) continue;
    auto slot = std::find_if(scratch_.begin(), scratch_.end(),
                             [&](const auto& s) { return s.first == it->mask; });
    if (slot == scratch_.end()) {
      scratch_.push_back({it->mask, frames});
    } else {
      slot->second += frames;
    }
  }
  out.knownFrames = covered;
  out.complete = covered == end - first;
  if (covered == 0) {
    out.byCount.clear();
    return out;
  }
  for (double& share : out.byCount) share /= static_cast<double>(covered);
  for (const auto& [m, frames] : scratch_)
    out.byCombination[nameOf(m)] += static_cast<double>(frames) / static_cast<double>(covered);
  return out;
}

SupportShares SupportTimeline::window(std::int64_t first, std::int64_t end) const {
  auto begin = std::upper_bound(segments_.begin(), segments_.end(), first,
                                [](std::int64_t f, const Segment& s) { return f < s.end; });
  return summarise(begin, first, end);
}

SupportShares SupportTimeline::overall() const {
  if (segments_.empty()) return {};
  return summarise(segments_.begin(), segments_.front().first, segments_.back().end);
}

}  // namespace stridemark::analysis
