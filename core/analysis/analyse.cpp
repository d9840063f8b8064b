#include "analysis/analyse.h"

#include <algorithm>
#include <cmath>
#include <span>

#include "analysis/bouts.h"
#include "analysis/circular.h"
#include "analysis/cycles.h"
#include "analysis/gait.h"
#include "analysis/hildebrand.h"
#include "analysis/parallel.h"
#include "analysis/phase.h"
#include "analysis/speed.h"
#include "analysis/stats.h"
#include "analysis/summary.h"
#include "analysis/support.h"
#include "common/error.h"
#include "common/huge_pages.h"

namespace stridemark::analysis {
namespace {

using model::Side;

void checkOptions(const model::Annotation& annotation, const AnalysisOptions& options,
                  int reference) {
  const auto fail = [](const std::string& message) {
    throw Error(ErrorCategory::analysis, message);
  };
  if (!annotation.captureRate.valid())
    fail("capture rate " + toString(annotation.captureRate) +
         " is not a positive frame rate; set the capture rate (frames per second) of the clip");
  if (reference < 0 || reference >= annotation.limbs.size())
    fail("reference limb #" + std::to_string(reference) + " is not in the " +
         annotation.limbs.name() + " limb set; choose one of " + annotation.limbs.labelList());
  if (!(options.symmetryTolerance >= 0 && options.symmetryTolerance <= 0.5))
    fail("symmetry tolerance must be between 0 and 0.5 of a stride");
  if (!(options.asymmetricTau >= 0 && options.asymmetricTau < 0.5) || options.minTauFrames < 0)
    fail("the simultaneity tolerance must be between 0 and 0.5 of a stride, at least 0 frames");
  if (options.speedMs && !(*options.speedMs >= 0 && std::isfinite(*options.speedMs)))
    fail("speed must be a finite number of metres per second, 0 or more");
  if (options.legLengthM && !(*options.legLengthM > 0 && std::isfinite(*options.legLengthM)))
    fail("leg length must be a positive number of metres");
}

// Problem spans of every limb, merged into disjoint ascending spans.
std::vector<FlaggedSpan> mergedFlags(const std::vector<LimbTrack>& tracks) {
  std::vector<FlaggedSpan> all;
  for (const LimbTrack& t : tracks) all.insert(all.end(), t.flagged.begin(), t.flagged.end());
  std::sort(all.begin(), all.end(),
            [](const FlaggedSpan& a, const FlaggedSpan& b) { return a.first < b.first; });
  std::vector<FlaggedSpan> merged;
  for (const FlaggedSpan& f : all) {
    if (!merged.empty() && f.first <= merged.back().last + 1) {
      merged.back().last = std::max(merged.back().last, f.last);
    } else {
      merged.push_back(f);
    }
  }
  return merged;
}

bool touchesFlag(const std::vector<FlaggedSpan>& flags, std::int64_t first, std::int64_t end) {
  auto it = std::lower_bound(flags.begin(), flags.end(), first,
                             [](const FlaggedSpan& f, std::int64_t v) { return f.last < v; });
  return it != flags.end() && it->first < end;
}

// Lower bound of `value` in ascending keys of `items`, galloped outward from `hint`: consecutive
// strides look up nearby frames, so a lookup costs O(log distance) and stays in cache instead of
// a cold O(log n) binary search over the whole track.
template <typename Item, typename Key>
std::size_t lowerBoundNear(std::span<const Item> items, std::size_t hint, std::int64_t value,
                           Key key) {
  const std::size_t n = items.size();
  hint = std::min(hint, n);
  std::size_t lo = 0, hi = n;
  if (hint < n && key(items[hint]) < value) {  // answer in (hint, n]
    lo = hint + 1;
    for (std::size_t step = 1;; step *= 2) {
      const std::size_t probe = lo + step - 1;
      if (probe >= n) break;
      if (key(items[probe]) >= value) {
        hi = probe;
        break;
      }
      lo = probe + 1;
    }
  } else {  // answer in [0, hint]
    hi = hint;
    for (std::size_t step = 1; hi >= step; step *= 2) {
      const std::size_t probe = hi - step;
      if (key(items[probe]) < value) {
        lo = probe + 1;
        break;
      }
      hi = probe;
    }
  }
  const auto begin = items.begin() + static_cast<std::ptrdiff_t>(lo);
  const auto end = items.begin() + static_cast<std::ptrdiff_t>(hi);
  const auto it =
      std::partition_point(begin, end, [&](const Item& item) { return key(item) < value; });
  return static_cast<std::size_t>(it - items.begin());
}

// One limb's track with remembered positions of the last lookups (see lowerBoundNear).
class TrackCursor {
 public:
  explicit TrackCursor(const LimbTrack& track) : track_(&track) {}

  // Same result as phaseInWindow(track.touchdowns, start, end).
  WindowPhase phaseIn(std::int64_t start, std::int64_t end) {
    WindowPhase out;
    if (end <= start) return out;
    const auto& td = track_->touchdowns;
    const auto frame = [](std::int64_t f) { return f; };
    const std::size_t first = lowerBoundNear<std::int64_t>(td, touchdownHint_, start, frame);
    const std::size_t last = lowerBoundNear<std::int64_t>(td, first, end, frame);
    touchdownHint_ = first;
    out.touchdowns = static_cast<int>(last - first);
    if (out.touchdowns > 0) out.first = td[first];
    if (out.touchdowns == 1) out.phase = relativePhase(td[first], start, end);
    return out;
  }

  // Same result as nearestTouchdown(track.touchdowns, frame).
  std::optional<std::int64_t> nearest(std::int64_t frame) {
    const auto& td = track_->touchdowns;
    if (td.empty()) return std::nullopt;
    const std::size_t after =
        lowerBoundNear<std::int64_t>(td, nearestHint_, frame, [](std::int64_t f) { return f; });
    nearestHint_ = after;
    if (after == 0) return td[0];
    const std::int64_t before = td[after - 1];
    if (after == td.size()) return before;
    return (frame - before) <= (td[after] - frame) ? before : td[after];
  }

  // Same result as cycleStartingAt(track, touchdown).
  const LimbCycle* cycleAt(std::int64_t touchdown) {
    const auto& cycles = track_->cycles;
    const std::size_t i = lowerBoundNear<LimbCycle>(cycles, cycleHint_, touchdown,
                                                    [](const LimbCycle& c) { return c.touchdown; });
    cycleHint_ = i;
    if (i == cycles.size() || cycles[i].touchdown != touchdown) return nullptr;
    return &cycles[i];
  }

 private:
  const LimbTrack* track_;
  std::size_t touchdownHint_ = 0;
  std::size_t cycleHint_ = 0;
  std::size_t nearestHint_ = 0;
};

class StrideBuilder {
 public:
  StrideBuilder(const model::Annotation& annotation, const AnalysisOptions& options,
                const CycleScan& scan)
      : limbs_(annotation.limbs),
        fps_(annotation.captureRate),
        options_(options),
        leftFore_(limbs_.at(Side::left, 0).value_or(-1)),
        rightFore_(limbs_.at(Side::right, 0).value_or(-1)),
        leftHind_(limbs_.at(Side::left, 1).value_or(-1)),
        rightHind_(limbs_.at(Side::right, 1).value_or(-1)) {
    cursors_.reserve(scan.tracks.size());
    for (const LimbTrack& track : scan.tracks) cursors_.emplace_back(track);
  }

  // Fills `s` in place (the report's vector owns it: no per-stride temporaries). Support and
  // suspension come from the support sweep (strideSupport()), which runs beside this.
  void build(const LimbCycle& reference, StrideRecord& s) {
    s.startFrame = reference.touchdown;
    s.endFrame = reference.nextTouchdown;
    s.durationS = framesToSeconds(reference.strideFrames(), fps_);
    fillLimbs(s);
    const double tau =
        std::max(options_.asymmetricTau,
                 options_.minTauFrames / static_cast<double>(reference.strideFrames()));
    switch (limbs_.kind()) {
      case model::LimbSetKind::quadruped:
        classifyQuadruped(s, tau);
        break;
      case model::LimbSetKind::biped:
        classifyBiped(s, tau);
        break;
      default:
        classifyMultiPair(s);
    }
  }

 private:
  TrackCursor& cursor(int limb) { return cursors_[static_cast<std::size_t>(limb)]; }

  // Also remembers each limb's first touchdown in the window and the cycle it starts, which the
  // pair phases and the diagonal placement below look up again.
  void fillLimbs(StrideRecord& s) {
    const std::size_t n = static_cast<std::size_t>(limbs_.size());
    s.phase.assign(n, std::nullopt);
    s.dutyFactor.assign(n, std::nullopt);
    s.touchdownCount.assign(n, 0);
    firsts_.assign(n, std::nullopt);
    firstCycles_.assign(n, nullptr);
    for (int limb = 0; limb < limbs_.size(); ++limb) {
      const auto i = static_cast<std::size_t>(limb);
      const WindowPhase wp = cursor(limb).phaseIn(s.startFrame, s.endFrame);
      s.touchdownCount[i] = wp.touchdowns;
      s.phase[i] = wp.phase;
      firsts_[i] = wp.first;
      if (!wp.first) continue;
      const LimbCycle* cycle = cursor(limb).cycleAt(*wp.first);
      firstCycles_[i] = cycle;
      if (const auto stance = cycle ? cycle->stanceFrames() : std::nullopt)
        s.dutyFactor[i] = static_cast<double>(*stance) / static_cast<double>(cycle->strideFrames());
    }
  }

  // Phase of `target` in the cycle of `base` that starts first in the stride; falls back to the
  // difference of their phases in the reference stride when that cycle is not usable.
  std::optional<double> pairPhase(const StrideRecord& s, int base, int target) {
    if (const LimbCycle* c = firstCycles_[static_cast<std::size_t>(base)]) {
      const WindowPhase wp = cursor(target).phaseIn(c->touchdown, c->nextTouchdown);
      if (wp.phase) return wp.phase;
      if (wp.ambiguous()) return std::nullopt;
    }
    const auto& pb = s.phase[static_cast<std::size_t>(base)];
    const auto& pt = s.phase[static_cast<std::size_t>(target)];
    if (pb && pt) return wrapPhase(*pt - *pb);
    return std::nullopt;
  }

  std::optional<double> meanDutyFactor(const StrideRecord& s,
                                       std::initializer_list<int> limbs) const {
    double sum = 0;
    int n = 0;
    for (int limb : limbs) {
      if (const auto& df = s.dutyFactor[static_cast<std::size_t>(limb)]) {
        sum += *df;
        ++n;
      }
    }
    if (n == 0) return std::nullopt;
    return sum / n;
  }

  void classifyQuadruped(StrideRecord& s, double tau) {
    const int lf = leftFore_, rf = rightFore_, lh = leftHind_, rh = rightHind_;
    s.hindDutyFactor = meanDutyFactor(s, {lh, rh});
    s.limbPhase = pairPhase(s, lh, lf);
    const auto hindContra = pairPhase(s, lh, rh);
    const auto foreContra = pairPhase(s, lf, rf);
    if (hindContra && foreContra &&
        isSymmetrical(*hindContra, *foreContra, options_.symmetryTolerance)) {
      s.symmetrical = true;
      if (!s.limbPhase || !s.hindDutyFactor) return;
      s.band = hildebrandBand(*s.limbPhase);
      s.quadrant = cartmillQuadrant(*s.limbPhase);
      s.sequence = footfallSequence(*s.limbPhase);
      s.gait = symmetricalQuadrupedGait(*s.band, *s.hindDutyFactor);
      if (s.gait == "trot") fillDap(s, {{lh, rf}, {rh, lf}});
      return;
    }
    const auto& p = s.phase;
    const auto at = [&](int limb) { return p[static_cast<std::size_t>(limb)]; };
    if (!at(lf) || !at(rf) || !at(lh) || !at(rh)) return;
    const AsymmetricalGait g = classifyAsymmetrical({*at(lf), *at(rf), *at(lh), *at(rh)}, tau);
    s.gait = g.gait;
    s.lead = g.lead;
    s.foreLag = g.foreLag;
    s.hindLag = g.hindLag;
    s.pairLag = g.pairLag;
  }

  void fillDap(StrideRecord& s, std::initializer_list<std::pair<int, int>> diagonals) {
    double ms = 0, percent = 0;
    int n = 0;
    for (const auto& [hind, fore] : diagonals) {
      const std::optional<std::int64_t>& h = firsts_[static_cast<std::size_t>(hind)];
      if (!h) continue;
      const auto f = cursor(fore).nearest(*h);
      if (!f) continue;
      const AdvancedPlacement dap = advancedPlacement(*h, *f, s.endFrame - s.startFrame, fps_);
      ms += dap.ms;
      percent += dap.percent;
      ++n;
    }
    if (n == 0) return;
    s.dapMs = ms / n;
    s.dapPercent = percent / n;
  }

  void classifyBiped(StrideRecord& s, double tau) {
    const int l = leftFore_, r = rightFore_;
    const auto contra = pairPhase(s, l, r);
    const auto df = meanDutyFactor(s, {l, r});
    if (!contra || !df) return;
    s.symmetrical = circularDistance(*contra, 0.5) <= options_.symmetryTolerance + 1e-9;
    s.gait = bipedGait(*contra, *df, tau, options_.symmetryTolerance);
    if (s.gait == "skip") s.lead = *contra < 0.5 ? "right" : "left";
  }

  void classifyMultiPair(StrideRecord& s) const {
    std::vector<double> phases;
    phases.reserve(s.phase.size());
    for (const auto& p : s.phase) {
      if (!p) return;
      phases.push_back(*p);
    }
    const TemplateMatch match = nearestTemplate(limbs_, phases);
    s.gait = match.gait;
    s.templateDistance = match.distance;
    s.symmetrical = true;
    for (int seg = 0; seg < limbs_.pairs(); ++seg) {
      const auto l = limbs_.at(Side::left, seg), r = limbs_.at(Side::right, seg);
      if (l && r &&
          circularDistance(
              phases[static_cast<std::size_t>(*r)] - phases[static_cast<std::size_t>(*l)], 0.5) >
              options_.symmetryTolerance + 1e-9)
        s.symmetrical = false;
    }
    if (const auto wave = ipsilateralWave(limbs_, phases, options_.asymmetricTau)) {
      s.ipsilateralLag = wave->lag;
      s.waveDirection = wave->direction;
    }
  }

  const model::LimbSet& limbs_;
  Rational fps_;
  const AnalysisOptions& options_;
  // The limbs of the first two pairs (-1 where the set has none): quadrupeds and bipeds ask
  // for them every stride.
  int leftFore_, rightFore_, leftHind_, rightHind_;
  std::vector<TrackCursor> cursors_;  // per limb
  // Per limb, for the stride being built: first touchdown in the window and the cycle it starts.
  std::vector<std::optional<std::int64_t>> firsts_;
  std::vector<const LimbCycle*> firstCycles_;
};

// Where the pipeline below builds strides: in the report itself, or in two reused chunks.
class StrideSlots {
 public:
  virtual ~StrideSlots() = default;
  // Room for the next `count` strides, as default records.
  virtual std::span<StrideRecord> next(std::size_t count) = 0;
};

// The strides stay in the report. Its vector is reserved whole, so the records the other
// thread is still reading never move while the next ones are appended.
class KeptStrides final : public StrideSlots {
 public:
  KeptStrides(std::vector<StrideRecord>& strides, std::size_t total) : strides_(strides) {
    if (strides_.capacity() < total) reserveHuge(strides_, total);
  }
  std::span<StrideRecord> next(std::size_t count) override {
    const std::size_t first = strides_.size();
    for (std::size_t i = 0; i < count; ++i) strides_.emplace_back();
    return {strides_.data() + first, count};
  }

 private:
  std::vector<StrideRecord>& strides_;
};

// The strides are handed on and dropped: a few chunks in turn, one per stage of the pipeline
// below, each reused once the consumer has had it.
class RotatingStrides final : public StrideSlots {
 public:
  explicit RotatingStrides(std::size_t chunks) : chunks_(chunks) {}
  std::span<StrideRecord> next(std::size_t count) override {
    std::vector<StrideRecord>& chunk = chunks_[turn_];
    turn_ = (turn_ + 1) % chunks_.size();
    chunk.clear();
    chunk.resize(count);
    return chunk;
  }

 private:
  std::vector<std::vector<StrideRecord>> chunks_;
  std::size_t turn_ = 0;
};

// The summaries over strides, fed in stride order as each stride is built.
struct StrideSummaries {
  explicit StrideSummaries(int limbCount) : phases(limbCount) {}
  void add(const StrideRecord& s, std::size_t index) {
    phases.add(s);
    hildebrand.add(s);
    bouts.add(s, static_cast<int>(index));
  }
  PhaseSummariser phases;
  HildebrandSummariser hildebrand;
  BoutFinder bouts;
};

// Each stride's support shares (or only its suspension flag), from one forward sweep.
void addSupport(SupportTimeline& timeline, const AnalysisOptions& options,
                std::span<const LimbCycle* const> cycles, std::span<StrideRecord> strides) {
  for (std::size_t i = 0; i < strides.size(); ++i) {
    const LimbCycle& c = *cycles[i];
    StrideRecord& s = strides[i];
    if (!options.strideSupport) {
      s.aerial = timeline.flags(c.touchdown, c.nextTouchdown).aerial;
      continue;
    }
    SupportShares shares = timeline.window(c.touchdown, c.nextTouchdown);
    s.aerial = shares.aerial;
    if (shares.complete) {
      s.supportByCount = std::move(shares.byCount);
      s.supportByCombination = std::move(shares.byCombination);
    }
  }
}

// Reference cycles that make strides: those touching an annotation problem are left out.
std::vector<const LimbCycle*> keptStrides(const CycleScan& scan, int reference) {
  const std::vector<FlaggedSpan> flags = mergedFlags(scan.tracks);
  std::vector<const LimbCycle*> kept;
  for (const LimbCycle& cycle : scan.tracks[static_cast<std::size_t>(reference)].cycles)
    if (!touchesFlag(flags, cycle.touchdown, cycle.nextTouchdown)) kept.push_back(&cycle);
  return kept;
}

// Strides a chunk at a time, in three stages on threads of their own: while chunk k is built
// and added to the summaries, chunk k - 1 gets its support sweep and chunk k - 2 goes to the
// consumer. With two stages (build | support and consume) the second was the longer by half
// and the builder waited for it; in three, both cores stay busy (score child of
// tests/bench/score_bench, 12 interleaved rounds: analysis and writing 0.145 -> 0.129 s).
// 1536 records (about 1 MB each chunk): two chunks of 4096 took 5 MB of fresh pages, which in a
// virtual machine cost more than the extra hand-overs.
constexpr std::size_t kChunkStrides = 1536;
constexpr std::size_t kChunksInFlight = 3;  // one per stage

struct PipeInput {
  const model::Annotation& annotation;
  const AnalysisOptions& options;
  const CycleScan& scan;
  std::span<const LimbCycle* const> kept;
};

SupportShares pipeStrides(const PipeInput& in, StrideSlots& slots, StrideSummaries& summaries,
                          StrideConsumer* consumer) {
  SupportTimeline timeline(in.annotation.limbs, in.scan.tracks);
  StrideBuilder builder(in.annotation, in.options, in.scan);
  const std::size_t total = in.kept.size();
  const std::size_t chunks = (total + kChunkStrides - 1) / kChunkStrides;
  std::span<StrideRecord> built[kChunksInFlight];  // chunk k lives in built[k % kChunksInFlight]
  const auto slot = [&](std::size_t chunk) -> std::span<StrideRecord>& {
    return built[chunk % kChunksInFlight];
  };
  const std::function<void(std::size_t)> stages[] = {
      [&](std::size_t chunk) {
        const std::size_t first = chunk * kChunkStrides;
        const std::size_t count = std::min(kChunkStrides, total - first);
        std::span<StrideRecord> records = slots.next(count);
        for (std::size_t i = 0; i < count; ++i) {
          builder.build(*in.kept[first + i], records[i]);
          summaries.add(records[i], first + i);
        }
        slot(chunk) = records;
      },
      [&](std::size_t chunk) {
        const std::span<StrideRecord> records = slot(chunk);
        addSupport(timeline, in.options, in.kept.subspan(chunk * kChunkStrides, records.size()),
                   records);
      },
      [&](std::size_t chunk) { consumer->consume(slot(chunk)); },
  };
  runStages(chunks, kChunksInFlight, std::span(stages, consumer ? 3 : 2));
  return timeline.overall();
}

// Everything analyse() and analyseStreaming() share. Without a consumer the strides stay in
// the report; with one they go to it and are dropped. `scanCycles` reads the tags once the
// options are checked.
template <typename ScanCycles>
void analyseInto(const model::Annotation& annotation, const AnalysisOptions& options,
                 Report& report, StrideConsumer* consumer, ScanCycles scanCycles) {
  const int reference = options.referenceLimb.value_or(annotation.referenceLimb);
  checkOptions(annotation, options, reference);
  report.limbs = annotation.limbs;
  report.fps = annotation.captureRate;
  report.referenceLimb = reference;

  CycleScan scan = scanCycles();
  report.limbSummary = summariseLimbs(scan.tracks, annotation.captureRate);
  if (consumer) consumer->begin(report);
  const std::vector<const LimbCycle*> kept = keptStrides(scan, reference);
  StrideSummaries summaries(annotation.limbs.size());
  const PipeInput input{annotation, options, scan, kept};
  SupportShares overall;
  if (consumer) {
    RotatingStrides slots(kChunksInFlight);
    overall = pipeStrides(input, slots, summaries, consumer);
  } else {
    KeptStrides slots(report.strides, kept.size());
    overall = pipeStrides(input, slots, summaries, nullptr);
  }
  report.support = std::move(overall.byCount);
  report.supportByCombination = std::move(overall.byCombination);
  // Cycles move into the report once strides and support no longer need the tracks.
  scan.tracks.clear();
  report.cycles = std::move(scan.cycles);

  report.phase = summaries.phases.finish();
  if (annotation.limbs.kind() == model::LimbSetKind::quadruped)
    report.hildebrand = summaries.hildebrand.finish();
  report.bouts = summaries.bouts.take();
  report.transitions = findTransitions(report.bouts);
  report.symmetry = summariseSymmetry(annotation.limbs, report.limbSummary);
  report.speed = summariseSpeed(options.speedMs, options.legLengthM,
                                report.limbSummary[static_cast<std::size_t>(reference)]);
  report.problems = std::move(scan.problems);
}

AnalysisOptions withTrialCard(const model::Project& project, const AnalysisOptions& options) {
  AnalysisOptions merged = options;
  if (!merged.speedMs) merged.speedMs = project.trial.speedMs;
  if (!merged.legLengthM) merged.legLengthM = project.trial.legLengthM;
  return merged;
}

}  // namespace

Report analyse(const model::Annotation& annotation, const AnalysisOptions& options) {
  Report report;
  analyseInto(annotation, options, report, nullptr, [&] { return scanCycles(annotation); });
  return report;
}

Report analyseStreaming(const model::Annotation& annotation, const AnalysisOptions& options,
                        StrideConsumer& consumer) {
  Report report;
  analyseInto(annotation, options, report, &consumer, [&] { return scanCycles(annotation); });
  return report;
}

Report analyse(const model::Project& project, const AnalysisOptions& options) {
  return analyse(project.annotation, withTrialCard(project, options));
}

Report analyseStreaming(const model::Project& project, const AnalysisOptions& options,
                        StrideConsumer& consumer) {
  return analyseStreaming(project.annotation, withTrialCard(project, options), consumer);
}

Report analyseStreaming(model::Project&& project, const AnalysisOptions& options,
                        StrideConsumer& consumer) {
  const AnalysisOptions merged = withTrialCard(project, options);
  model::Annotation& annotation = project.annotation;
  Report report;
  analyseInto(annotation, merged, report, &consumer,
              [&] { return scanCycles(annotation, std::move(annotation.events)); });
  return report;
}

}  // namespace stridemark::analysis
