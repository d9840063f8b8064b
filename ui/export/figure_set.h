#pragma once
// The figures an export writes, each drawn by the ui/figures painters (the same code the
// workstation uses on screen): footfall diagram, Support strip, Gait map (quadrupeds), Phase
// dial and per-stride plots of stance, swing and duty factor.
#include <cstdint>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"
#include "ui/export/report_pdf.h"

namespace stridemark::ui::exports {

// Frames covered by the tags (first to last event), or nothing when there are no events.
struct ScoredRange {
  std::int64_t first = 0;
  std::int64_t last = 0;
};
std::optional<ScoredRange> scoredRange(const model::Annotation& annotation);

// The painters capture `annotation` and `report` by reference: keep both alive while the
// figures are used.
std::vector<NamedFigure> exportFigures(const model::Annotation& annotation,
                                       const analysis::Report& report);

}  // namespace stridemark::ui::exports
