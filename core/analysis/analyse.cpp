#include "analysis/analyse.h"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <map>
#include <string>

#include "analysis/bouts.h"
#include "analysis/cycles.h"
#include "analysis/strides.h"
#include "analysis/summary.h"
#include "analysis/support_patterns.h"
#include "analysis/tag_checks.h"
#include "common/error.h"

namespace stridemark::analysis {
namespace {

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
  for (std::size_t i = 0; i < options.speedChanges.size(); ++i) {
    const model::SpeedStep& step = options.speedChanges[i];
    if (!(step.ms >= 0 && std::isfinite(step.ms)))
      fail("speed from frame " + std::to_string(step.fromFrame) +
           " must be a finite number of metres per second, 0 or more");
    if (i > 0 && step.fromFrame <= options.speedChanges[i - 1].fromFrame)
      fail("speed changes must be in ascending frame order (frame " +
           std::to_string(step.fromFrame) + " follows frame " +
           std::to_string(options.speedChanges[i - 1].fromFrame) + ")");
  }
  if (!options.speedChanges.empty() && !options.speedMs)
    fail("a speed change needs a starting speed: give the speed from the start too");
  if (options.minBoutStrides < 1) fail("a bout needs at least 1 stride");
  if (!(options.steadyTolerance > 0 && options.steadyTolerance < 1))
    fail("the steadiness tolerance must be between 0 and 1 of a stride");
}

StrideSettings strideSettings(const AnalysisOptions& options) {
  StrideSettings settings;
  settings.tolerances.symmetry = options.symmetryTolerance;
  settings.tolerances.tau = options.asymmetricTau;
  settings.tolerances.wave = options.asymmetricTau;
  settings.minTauFrames = options.minTauFrames;
  settings.steadyTolerance = options.steadyTolerance;
  return settings;
}

std::vector<model::SpeedStep> speedSchedule(const AnalysisOptions& options) {
  if (!options.speedMs) return {};
  std::vector<model::SpeedStep> schedule{{0, *options.speedMs}};
  schedule.insert(schedule.end(), options.speedChanges.begin(), options.speedChanges.end());
  return schedule;
}

std::string secondsText(double seconds) {
  char text[32];
  std::snprintf(text, sizeof text, "%.2f", seconds);
  return text;
}

// Stride times no walking or running animal has ask whether the capture rate is right
// (a high-speed clip opened at its file rate). Our thresholds: 4 s and 0.04 s.
void checkStrideTimes(const Report& report, std::vector<Problem>& problems) {
  if (report.strides.size() < 2) return;
  std::vector<double> seconds;
  for (const StrideRecord& s : report.strides) seconds.push_back(s.durationS);
  std::nth_element(seconds.begin(),
                   seconds.begin() + static_cast<std::ptrdiff_t>(seconds.size() / 2),
                   seconds.end());
  const double median = seconds[seconds.size() / 2];
  if (median <= 4.0 && median >= 0.04) return;
  problems.push_back(
      {report.strides.front().startFrame, report.referenceLimb,
       "the median stride lasts " + secondsText(median) + " s at a capture rate of " +
           toString(report.fps) + " fps, " + (median > 4.0 ? "longer" : "shorter") +
           " than any walking or running animal's: is the capture rate right? High-speed "
           "footage is often stored at a lower file rate - set the rate the camera recorded "
           "(Trial card, or --fps)"});
}

void sortProblems(std::vector<Problem>& problems) {
  std::stable_sort(problems.begin(), problems.end(), [](const Problem& a, const Problem& b) {
    if (a.frame != b.frame) return a.frame < b.frame;
    return a.limb.value_or(-1) < b.limb.value_or(-1);
  });
}

// Strides a person excluded keep their label and place (so bouts stay whole) but are left
// out of every summary.
void markExclusions(const model::Annotation& annotation, std::vector<StrideRecord>& strides) {
  for (const model::StrideExclusion& x : annotation.excluded) {
    const auto it = std::lower_bound(
        strides.begin(), strides.end(), x.startFrame,
        [](const StrideRecord& s, std::int64_t frame) { return s.startFrame < frame; });
    if (it != strides.end() && it->startFrame == x.startFrame) it->excluded = x.reason;
  }
}

// Strides the trial's summaries use: steady and not transitions (unclassified strides still
// give the limbs they have, so a trial tagged on some limbs only is measured).
std::vector<int> trialMembers(const std::vector<StrideRecord>& strides) {
  std::vector<int> members;
  for (std::size_t i = 0; i < strides.size(); ++i)
    if (strides[i].steady && strides[i].gait != "transition" && !strides[i].excluded)
      members.push_back(static_cast<int>(i));
  return members;
}

// Summaries of the same strides are the same: a gait seen in one bout, or a trial of one
// gait, copies the summary instead of making it again (the desk re-scores after every edit).
struct Summaries {
  std::vector<int> members;
  const Summary* summary = nullptr;
};

std::map<std::string, Summaries> summariseBouts(Report& report, const SummaryInputs& in) {
  std::map<std::string, std::vector<int>> members;
  std::map<std::string, int> boutsOf;
  for (Bout& bout : report.bouts) {
    const std::vector<int> own = summarisedMembers(report.strides, bout);
    bout.summary = summariseStrides(report.strides, own, in);
    std::vector<int>& all = members[bout.gait];
    all.insert(all.end(), own.begin(), own.end());
    ++boutsOf[bout.gait];
  }
  std::map<std::string, Summaries> out;
  for (auto& [gait, all] : members) {
    const auto single = std::find_if(report.bouts.begin(), report.bouts.end(),
                                     [&name = gait](const Bout& b) { return b.gait == name; });
    report.byGait[gait] =
        boutsOf[gait] == 1 ? single->summary : summariseStrides(report.strides, all, in);
    out[gait] = {std::move(all), &report.byGait[gait]};
  }
  report.mixedGaits = report.byGait.size() > 1;
  return out;
}

void summariseTrial(Report& report, const SummaryInputs& in, const AnalysisOptions& options,
                    const std::map<std::string, Summaries>& byGait) {
  const std::vector<int> members = trialMembers(report.strides);
  Summary trial = byGait.size() == 1 && byGait.begin()->second.members == members
                      ? *byGait.begin()->second.summary
                      : summariseStrides(report.strides, members, in);
  report.limbSummary = std::move(trial.limbs);
  report.phase = std::move(trial.phase);
  report.hildebrand = std::move(trial.hildebrand);
  report.support = std::move(trial.support);
  report.supportByCombination = std::move(trial.supportByCombination);
  report.symmetry = std::move(trial.symmetry);
  report.dap = std::move(trial.dap);
  // One speed for the trial only when the belt kept one speed (§12); else per bout.
  if (options.speedMs && options.speedChanges.empty())
    report.speed =
        summariseSpeed(options.speedMs, options.legLengthM,
                       report.limbSummary[static_cast<std::size_t>(report.referenceLimb)]);
}

// Every valid cycle, limb after limb, each limb's in frame order.
std::vector<LimbCycle> allCycles(const CycleScan& scan) {
  std::vector<LimbCycle> cycles;
  for (const LimbTrack& track : scan.tracks)
    cycles.insert(cycles.end(), track.cycles.begin(), track.cycles.end());
  return cycles;
}

AnalysisOptions withTrialCard(const model::Project& project, const AnalysisOptions& options) {
  AnalysisOptions merged = options;
  if (!merged.speedMs) merged.speedMs = project.trial.speedMs;
  if (!merged.legLengthM) merged.legLengthM = project.trial.legLengthM;
  if (!options.speedMs) merged.speedChanges = project.trial.speedChanges;
  return merged;
}

}  // namespace

Report analyse(const model::Annotation& annotation, const AnalysisOptions& options) {
  const int reference = options.referenceLimb.value_or(annotation.referenceLimb);
  checkOptions(annotation, options, reference);
  Report report;
  report.limbs = annotation.limbs;
  report.fps = annotation.captureRate;
  report.referenceLimb = reference;

  CycleScan scan = scanCycles(annotation);
  checkTracks(annotation, reference, scan);
  const SupportTimeline support(annotation.limbs, scan.tracks);
  report.strides =
      buildStrides(annotation, reference, scan, support, strideSettings(options), scan.problems);
  report.cycles = allCycles(scan);
  checkStrideTimes(report, scan.problems);

  markExclusions(annotation, report.strides);
  report.bouts = findBouts(report.strides, options.minBoutStrides);
  report.transitions = findTransitions(report.bouts, report.strides);
  const SummaryInputs in{annotation.limbs, annotation.captureRate, reference,
                         speedSchedule(options), options.legLengthM};
  const auto byGait = summariseBouts(report, in);
  summariseTrial(report, in, options, byGait);
  report.problems = std::move(scan.problems);
  sortProblems(report.problems);
  return report;
}

Report analyse(const model::Project& project, const AnalysisOptions& options) {
  return analyse(project.annotation, withTrialCard(project, options));
}

}  // namespace stridemark::analysis
