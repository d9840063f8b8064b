#pragma once
// Scoring entry point: turns tags into every gait figure of the report (DESIGN §5-§6,
// docs/methods.md). Pure: same annotation and options, same report. Never throws for annotation
// problems (they go to Report::problems); throws stridemark::Error(analysis) only for
// unusable options (e.g. a reference limb outside the limb set).
#include <optional>
#include <span>

#include "analysis/report.h"
#include "model/annotation.h"

namespace stridemark::analysis {

struct AnalysisOptions {
  // docs/methods.md team decisions; configurable.
  double symmetryTolerance = 0.10;   // |contralateral phase - 0.5| allowed per girdle
  double asymmetricTau = 0.05;       // share of stride for "simultaneous" in §3.3
  int minTauFrames = 2;              // ... but never less than this many frames
  std::optional<int> referenceLimb;  // overrides Annotation::referenceLimb
  std::optional<double> speedMs;     // overrides TrialCard speed
  std::optional<double> legLengthM;  // overrides TrialCard leg length
  // Per-stride support shares (StrideRecord::supportByCount / supportByCombination). Turning
  // them off saves about 0.7 kB per stride on very long annotations; `aerial` stays filled.
  bool strideSupport = true;
};

Report analyse(const model::Annotation& annotation, const AnalysisOptions& options = {});

// Takes the reference strides of a streamed analysis (analyseStreaming), in order, a chunk at a
// time: a report of 10^6 events need never hold its ~80 MB of stride records at once.
class StrideConsumer {
 public:
  virtual ~StrideConsumer() = default;
  // Once, before any stride: the report so far. Filled are the limb set, capture rate,
  // reference limb and limb summaries; not yet the cycles, summaries over strides or problems.
  virtual void begin(const Report& head) = 0;
  // The next strides, complete. Runs on a worker thread while later strides are being built
  // (calls never overlap); the records are reused once it returns. May throw stridemark::Error,
  // which ends the analysis.
  virtual void consume(std::span<const StrideRecord> strides) = 0;
};

// The report analyse() gives, except that `strides` stays empty: each stride goes to `consumer`
// instead. Every other member, including bouts and phase statistics, is the same to the bit.
Report analyseStreaming(const model::Annotation& annotation, const AnalysisOptions& options,
                        StrideConsumer& consumer);
Report analyseStreaming(const model::Project& project, const AnalysisOptions& options,
                        StrideConsumer& consumer);
// Same, consuming the project: its events are freed as soon as they are read, so the rest of
// the analysis reuses their memory (a batch command scoring 10^6 events touches ~16 MB less).
Report analyseStreaming(model::Project&& project, const AnalysisOptions& options,
                        StrideConsumer& consumer);

// Same, taking speed and leg length from the trial card unless the options override them.
Report analyse(const model::Project& project, const AnalysisOptions& options = {});

}  // namespace stridemark::analysis
