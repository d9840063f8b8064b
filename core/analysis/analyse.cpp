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

double median(std::vector<double> values) {
  const auto mid = values.begin() + static_cast<std::ptrdiff_t>(values.size() / 2);
  std::nth_element(values.begin(), mid, values.end());
  return *mid;
}

// A running stride: the limbs it has spend less than half of it on the ground.
bool running(const StrideRecord& s) {
  double sum = 0;
  int n = 0;
  for (const auto& df : s.dutyFactor)
    if (df) {
      sum += *df;
      ++n;
    }
  return n > 0 && sum / n < 0.5;
}

std::string rateQuestion(double medianS, const Report& report, const std::string& what) {
  return "the median " + what + " lasts " + secondsText(medianS) + " s at a capture rate of " +
         toString(report.fps) + " fps, " + (medianS < 0.04 ? "shorter" : "longer") +
         " than any walking or running animal's: is the capture rate right? High-speed footage "
         "is often stored at a lower file rate - set the rate the camera recorded (Trial card, "
         "or --fps)";
}

// Stride times no walking or running animal has ask whether the capture rate is right (a
// high-speed clip opened at its file rate). Our thresholds: any stride over 4 s or under
// 0.04 s, and running strides (duty factor below 0.5) over 2 s - a trotting dog's 0.4 s
// stride from a 240 fps clip opened at 30 fps reads 3.2 s.
void checkStrideTimes(const Report& report, std::vector<Problem>& problems) {
  if (report.strides.size() < 2) return;
  std::vector<double> all, runs;
  for (const StrideRecord& s : report.strides) {
    all.push_back(s.durationS);
    if (running(s)) runs.push_back(s.durationS);
  }
  const std::int64_t frame = report.strides.front().startFrame;
  if (const double m = median(all); m > 4.0 || m < 0.04) {
    problems.push_back({frame, report.referenceLimb, rateQuestion(m, report, "stride")});
  } else if (runs.size() >= 2 && median(runs) > 2.0) {
    problems.push_back(
        {frame, report.referenceLimb, rateQuestion(median(runs), report, "running stride")});
  }
}

bool hiddenFoot(const StrideRecord& s) {
  return s.note && s.note->find(" is hidden at ") != std::string::npos;
}

std::string unclassifiedAdvice(const StrideRecord& s, const model::LimbSet& limbs) {
  if (!s.incompleteLimb) return "check the tags of this stride";
  const std::string& label = limbs.label(*s.incompleteLimb);
  if (s.touchdownSlipped)
    return "check " + label + "'s tags here: a touchdown may be missed or extra, or its cycle " +
           "changed length (a change of speed)";
  if (hiddenFoot(s)) return "tag the foot where it can be seen, or leave the stride out";
  return "tag the missing event, or leave the stride out";
}

// A problem already points at this limb near the stride (a missing tag, a suspicious cycle).
// A hidden foot always gets its own: the person must decide what it did there.
bool alreadyExplained(const StrideRecord& s, const std::vector<Problem>& problems) {
  if (hiddenFoot(s)) return false;
  const std::int64_t span = s.endFrame - s.startFrame;
  return std::any_of(problems.begin(), problems.end(), [&](const Problem& p) {
    return p.limb && p.limb == s.incompleteLimb && p.frame >= s.startFrame - span &&
           p.frame <= s.endFrame + span;
  });
}

// Every stride left unclassified once the bouts are known says why, with the limb, in
// `problems` (docs/methods.md §1.5), unless a problem about that limb there says it already
// or the limb's tags simply begin or end inside it.
void explainUnclassified(const Report& report, std::vector<Problem>& problems) {
  std::vector<Problem> added;
  for (const StrideRecord& s : report.strides) {
    if (s.gait != "unclassified" || s.cutByTagEnds || alreadyExplained(s, problems)) continue;
    added.push_back({s.startFrame, s.incompleteLimb,
                     "stride " + std::to_string(s.startFrame) + "-" + std::to_string(s.endFrame) +
                         " is unclassified: " + s.note.value_or("its phases fit no gait") + " - " +
                         unclassifiedAdvice(s, report.limbs)});
  }
  problems.insert(problems.end(), added.begin(), added.end());
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
  report.strides = buildStrides(annotation, reference, scan, support, strideSettings(options));
  report.cycles = allCycles(scan);
  checkStrideTimes(report, scan.problems);

  markExclusions(annotation, report.strides);
  report.bouts = findBouts(report.strides, options.minBoutStrides);
  report.transitions = findTransitions(report.bouts, report.strides);
  explainUnclassified(report, scan.problems);
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
