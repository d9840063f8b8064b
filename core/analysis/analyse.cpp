#include "analysis/analyse.h"

#include <cmath>
#include <string>

#include "analysis/bouts.h"
#include "analysis/cycles.h"
#include "analysis/strides.h"
#include "analysis/summary.h"
#include "analysis/support_patterns.h"
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
}

StrideSettings strideSettings(const AnalysisOptions& options) {
  StrideSettings settings;
  settings.tolerances.symmetry = options.symmetryTolerance;
  settings.tolerances.tau = options.asymmetricTau;
  settings.tolerances.wave = options.asymmetricTau;
  settings.minTauFrames = options.minTauFrames;
  return settings;
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
  const SupportTimeline support(annotation.limbs, scan.tracks);
  report.strides = buildStrides(annotation, reference, scan, support, strideSettings(options));
  report.cycles = allCycles(scan);
  report.limbSummary = summariseLimbs(scan.tracks, annotation.captureRate);

  const SupportShares overall = support.overall();
  report.support = overall.byCount;
  report.supportByCombination = overall.byCombination;
  report.phase = summarisePhases(annotation.limbs.size(), report.strides);
  if (annotation.limbs.kind() == model::LimbSetKind::quadruped)
    report.hildebrand = summariseHildebrand(report.strides);
  report.bouts = findBouts(report.strides);
  report.transitions = findTransitions(report.bouts);
  report.symmetry = summariseSymmetry(annotation.limbs, report.limbSummary);
  report.speed = summariseSpeed(options.speedMs, options.legLengthM,
                                report.limbSummary[static_cast<std::size_t>(reference)]);
  report.problems = std::move(scan.problems);
  return report;
}

Report analyse(const model::Project& project, const AnalysisOptions& options) {
  return analyse(project.annotation, withTrialCard(project, options));
}

}  // namespace stridemark::analysis
