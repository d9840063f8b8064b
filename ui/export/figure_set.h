#pragma once
// The figures of a scored trial, each drawn by the ui/figures painters (the same code the
// workstation uses on screen): footfall diagram, Support strip, Gait map (quadrupeds), Phase
// dial and per-stride plots of stance, swing and duty factor. One set, one drawing and one file
// naming for `stridemark export`, the Export dialog and the desk's File ▸ Export figures.
#include <cstddef>
#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "analysis/report.h"
#include "model/annotation.h"
#include "ui/export/figure_output.h"
#include "ui/export/staged_output.h"

namespace stridemark::ui::exports {

// A figure as the export knows it: a file stem, a title, and the painter that draws it.
struct NamedFigure {
  std::string stem;  // "footfall_diagram" -> footfall_diagram.svg
  QString title;
  QString caption;
  FigurePaint paint;
  FigureSize size;  // size when written as its own file
};

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

inline const std::vector<FigureFormat> kAllFigureFormats{FigureFormat::svg, FigureFormat::png,
                                                         FigureFormat::pdf};

// "gait_map.svg": the name every figure file gets, wherever it is written.
std::string figureFileName(const NamedFigure& figure, FigureFormat format);

// Called before each file with the files done so far, and once more at the end (done ==
// total). May throw (a cancelled export) to stop before the next file.
using FigureProgress = std::function<void(std::size_t done, std::size_t total)>;

// Stages every figure in every format as `folder`/figureFileName() in `out`; nothing is in
// place until out.commit(). Throws stridemark::Error(export_) when a file cannot be written.
void writeFigureFiles(const std::vector<NamedFigure>& figures,
                      const std::vector<FigureFormat>& formats, StagedOutput& out,
                      const std::filesystem::path& folder, const FigureProgress& progress = {});

// The whole figure set of a trial, in every format, straight into `folder` (all or nothing).
// Returns the files written.
std::vector<std::filesystem::path> writeFigureFolder(const model::Annotation& annotation,
                                                     const analysis::Report& report,
                                                     const std::filesystem::path& folder);

}  // namespace stridemark::ui::exports
