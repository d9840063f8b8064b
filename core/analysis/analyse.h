#pragma once
// Scoring entry point: turns tags into every gait figure of the report (docs/methods.md).
// Pure: same annotation and options, same report. Never throws for annotation problems (they go to
// Report::problems); throws stridemark::Error(analysis) only for unusable options (e.g. a reference
// limb outside the limb set).
#include <optional>

#include "analysis/report.h"
#include "model/annotation.h"

namespace stridemark::analysis {

struct AnalysisOptions {
  // Our choices (docs/methods.md §2.3, §3.3); configurable.
  double symmetryTolerance = 0.10;             // |contralateral phase - 0.5| allowed per girdle
  double asymmetricTau = 0.05;                 // share of stride for "simultaneous" in §3.3
  int minTauFrames = 2;                        // ... but never less than this many frames
  std::optional<int> referenceLimb;            // overrides Annotation::referenceLimb
  std::optional<double> speedMs;               // overrides TrialCard speed (from the start)
  std::vector<model::SpeedStep> speedChanges;  // later speeds; with speedMs, override the card's
  int minBoutStrides = 2;                      // strides of one gait that make a bout (§11)
  double steadyTolerance = 0.15;     // each limb's cycle within this share of the stride (§1.5)
  std::optional<double> legLengthM;  // overrides TrialCard leg length
};

Report analyse(const model::Annotation& annotation, const AnalysisOptions& options = {});

// Same, taking speed and leg length from the trial card unless the options override them.
Report analyse(const model::Project& project, const AnalysisOptions& options = {});

}  // namespace stridemark::analysis
