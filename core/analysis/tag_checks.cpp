#include "analysis/tag_checks.h"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdio>
#include <string>

namespace stridemark::analysis {
namespace {

// Median of a few values (at most a dozen here), sorted in place.
template <typename Values>
double median(Values& values, std::size_t n) {
  std::sort(values.begin(), values.begin() + static_cast<std::ptrdiff_t>(n));
  return n % 2 ? values[n / 2] : 0.5 * (values[n / 2 - 1] + values[n / 2]);
}

constexpr std::size_t kMaxNeighbours = 16;

std::string fixed(double value, int decimals) {
  char text[32];
  std::snprintf(text, sizeof text, "%.*f", decimals, value);
  return text;
}

std::string frames(std::int64_t first, std::int64_t last) {
  return std::to_string(first) + "-" + std::to_string(last);
}

void reportUntagged(const model::Annotation& annotation, int referenceLimb, CycleScan& scan) {
  if (annotation.events.empty()) return;  // nothing tagged yet: not a mistake
  std::vector<bool> tagged(static_cast<std::size_t>(annotation.limbs.size()), false);
  std::int64_t first = annotation.events.front().frame;
  for (const model::Event& e : annotation.events) {
    if (e.limb >= 0 && e.limb < annotation.limbs.size())
      tagged[static_cast<std::size_t>(e.limb)] = true;
    first = std::min(first, e.frame);
  }
  for (int limb = 0; limb < annotation.limbs.size(); ++limb) {
    if (tagged[static_cast<std::size_t>(limb)]) continue;
    const std::string& label = annotation.limbs.label(limb);
    if (limb == referenceLimb) {
      scan.problems.push_back(
          {first, limb,
           "the reference limb " + label +
               " has no tags, so no strides can be made - tag its touchdowns and lift-offs, or "
               "choose another reference limb (Trial card, or --reference)"});
    } else {
      scan.problems.push_back({first, limb,
                               label +
                                   " has no tags, so no stride can be classified - tag its "
                                   "touchdowns and lift-offs, or choose a limb set without it"});
    }
  }
}

void reportSuspiciousCycles(const model::Annotation& annotation, int limb, LimbTrack& track,
                            const TagCheckSettings& settings, std::vector<Problem>& problems) {
  const std::vector<LimbCycle>& cycles = track.cycles;
  const auto side = static_cast<std::size_t>(
      std::clamp(settings.neighbours, 1, static_cast<int>(kMaxNeighbours / 2)));
  std::vector<bool> suspicious(cycles.size(), false);
  std::array<double, kMaxNeighbours> around{};
  for (std::size_t i = 0; i < cycles.size(); ++i) {
    std::size_t n = 0;
    for (std::size_t j = i >= side ? i - side : 0; j < std::min(cycles.size(), i + 1 + side); ++j)
      if (j != i) around[n++] = static_cast<double>(cycles[j].strideFrames());
    if (n < 2) continue;
    // The median lies between the least and the greatest neighbour: within the limits of both,
    // the cycle is fine whatever the median is (the common case; no sort needed).
    const double d = static_cast<double>(cycles[i].strideFrames());
    const auto [least, most] = std::minmax_element(around.begin(), around.begin() + n);
    if (d <= settings.longCycle * *least && d >= settings.shortCycle * *most) continue;
    const double ratio = d / median(around, n);
    if (ratio <= settings.longCycle && ratio >= settings.shortCycle) continue;
    suspicious[i] = true;
    const std::string what = annotation.limbs.label(limb) + " cycle " +
                             frames(cycles[i].touchdown, cycles[i].nextTouchdown) + " is " +
                             fixed(ratio, 1) + "x its neighbours: ";
    problems.push_back(
        {cycles[i].touchdown, limb,
         what + (ratio > settings.longCycle
                     ? "a touchdown may be missing - step through these frames and tag it (the "
                       "cycle is left out of the statistics)"
                     : "an extra tag or a stumble - check these tags (the cycle is left out of "
                       "the statistics)")});
  }
  std::vector<LimbCycle> kept;
  for (std::size_t i = 0; i < cycles.size(); ++i)
    if (!suspicious[i]) kept.push_back(cycles[i]);
  track.cycles = std::move(kept);
}

struct DutyRun {
  std::vector<std::int64_t> touchdowns;
  std::vector<double> duty;
};

DutyRun dutyFactors(const LimbTrack& track) {
  DutyRun run;
  for (const LimbCycle& c : track.cycles) {
    if (!c.stanceFrames()) continue;
    run.touchdowns.push_back(c.touchdown);
    run.duty.push_back(static_cast<double>(*c.stanceFrames()) /
                       static_cast<double>(c.strideFrames()));
  }
  return run;
}

// Median duty factor of the up to 5 cycles before and from `frame`; null when either has < 3.
std::optional<std::pair<double, double>> dutyAround(const DutyRun& run, std::int64_t frame) {
  const auto split = static_cast<std::size_t>(
      std::lower_bound(run.touchdowns.begin(), run.touchdowns.end(), frame) -
      run.touchdowns.begin());
  const std::size_t before = std::min<std::size_t>(split, 5);
  const std::size_t after = std::min<std::size_t>(run.duty.size() - split, 5);
  if (before < 3 || after < 3) return std::nullopt;
  const auto at = [&](std::size_t from, std::size_t count) {
    std::array<double, 5> values{};
    std::copy_n(run.duty.begin() + static_cast<std::ptrdiff_t>(from), count, values.begin());
    return median(values, count);
  };
  return std::pair{at(split - before, before), at(split, after)};
}

// Thresholds of the swap check (our choice): the duty factor turns into its complement, by at
// least this much, while every other limb keeps its own.
constexpr double kComplement = 0.10;
constexpr double kSwapChange = 0.15;
constexpr double kOthersSteady = 0.08;

}  // namespace

std::optional<SwappedTags> findSwappedTags(const std::vector<LimbTrack>& tracks, int limb) {
  const DutyRun run = dutyFactors(tracks[static_cast<std::size_t>(limb)]);
  std::optional<SwappedTags> best;
  std::size_t bestIndex = 0;
  for (std::size_t i = 3; i + 3 <= run.duty.size(); ++i) {
    // Both medians lie within the range of the cycles around the split: a range narrower than
    // the change a swap makes settles it without sorting (the common, steady case).
    const auto from = run.duty.begin() + static_cast<std::ptrdiff_t>(i >= 5 ? i - 5 : 0);
    const auto to =
        run.duty.begin() + static_cast<std::ptrdiff_t>(std::min(run.duty.size(), i + 5));
    const auto [least, most] = std::minmax_element(from, to);
    if (*most - *least < kSwapChange) continue;
    const auto around = dutyAround(run, run.touchdowns[i]);
    if (!around) continue;
    const auto [before, after] = *around;
    if (std::abs(before + after - 1.0) > kComplement || std::abs(before - after) < kSwapChange)
      continue;
    if (best && std::abs(before - after) <= std::abs(best->dutyBefore - best->dutyAfter)) continue;
    best = SwappedTags{run.touchdowns[i], before, after};
    bestIndex = i;
  }
  if (!best) return std::nullopt;
  // The first cycle that looks like the later ones, and the one tag before the swap that made
  // it (the touchdown of the cycle in between, when it joins on).
  std::size_t k = bestIndex;
  while (k > 0 && std::abs(run.duty[k - 1] - best->dutyAfter) <= kOthersSteady) --k;
  const LimbTrack& track = tracks[static_cast<std::size_t>(limb)];
  best->fromFrame = run.touchdowns[k];
  for (const LimbCycle& c : track.cycles)
    if (c.nextTouchdown == run.touchdowns[k] && k > 0 && c.touchdown > run.touchdowns[k - 1])
      best->fromFrame = c.touchdown;
  // A real change of gait changes every limb; a swap, this limb alone.
  bool othersMeasured = false;
  for (std::size_t other = 0; other < tracks.size(); ++other) {
    if (static_cast<int>(other) == limb) continue;
    const auto around = dutyAround(dutyFactors(tracks[other]), best->fromFrame);
    if (!around) continue;
    othersMeasured = true;
    if (std::abs(around->first - around->second) > kOthersSteady) return std::nullopt;
  }
  if (!othersMeasured) return std::nullopt;
  return best;
}

void checkTracks(const model::Annotation& annotation, int referenceLimb, CycleScan& scan,
                 const TagCheckSettings& settings) {
  reportUntagged(annotation, referenceLimb, scan);
  for (std::size_t limb = 0; limb < scan.tracks.size(); ++limb) {
    const auto swap = findSwappedTags(scan.tracks, static_cast<int>(limb));
    if (!swap) continue;
    LimbTrack& track = scan.tracks[limb];
    const std::string& label = annotation.limbs.label(static_cast<int>(limb));
    scan.problems.push_back(
        {swap->fromFrame, static_cast<int>(limb),
         label + "'s stance and swing look swapped from frame " + std::to_string(swap->fromFrame) +
             " on (duty factor " + fixed(swap->dutyBefore, 2) + " before, " +
             fixed(swap->dutyAfter, 2) +
             " after, while the other limbs keep theirs): was a tag key pressed once too often? "
             "Swap this limb's tags from here (Checks), then delete the extra tag; strides "
             "from here are left out until then"});
    const std::int64_t last = track.touchdowns.empty() ? swap->fromFrame : track.touchdowns.back();
    track.flagged.push_back(
        {swap->fromFrame, std::max(last, track.known.empty() ? last : track.known.back().end)});
    std::erase_if(track.cycles,
                  [&](const LimbCycle& c) { return c.nextTouchdown > swap->fromFrame; });
  }
  for (std::size_t limb = 0; limb < scan.tracks.size(); ++limb)
    reportSuspiciousCycles(annotation, static_cast<int>(limb), scan.tracks[limb], settings,
                           scan.problems);
  std::stable_sort(scan.problems.begin(), scan.problems.end(),
                   [](const Problem& a, const Problem& b) {
                     if (a.frame != b.frame) return a.frame < b.frame;
                     return a.limb.value_or(-1) < b.limb.value_or(-1);
                   });
}

}  // namespace stridemark::analysis
