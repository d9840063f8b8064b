#include "ui/export/figure_set.h"

#include <algorithm>

#include "ui/figures/analysis_figures.h"
#include "ui/figures/figure_style.h"
#include "ui/figures/footfall_diagram.h"
#include "ui/figures/stride_time_plots.h"

namespace stridemark::ui::exports {

namespace figs = stridemark::ui::figures;

std::optional<ScoredRange> scoredRange(const model::Annotation& annotation) {
  if (annotation.events.empty()) return std::nullopt;
  const auto [lo, hi] = std::minmax_element(
      annotation.events.begin(), annotation.events.end(),
      [](const model::Event& a, const model::Event& b) { return a.frame < b.frame; });
  return ScoredRange{lo->frame, hi->frame};
}

namespace {

figs::FootfallOptions footfallOptions(const model::Annotation& a) {
  figs::FootfallOptions o;
  const std::optional<ScoredRange> range = scoredRange(a);
  o.viewFirst = range ? range->first : 0;
  o.viewLast = range ? std::max(range->last, range->first + 1) : 100;
  o.drawTicks = false;  // event ticks are an editing aid; they crowd a printed figure
  o.drawTimeAxis = true;
  o.labelWidth = 34;
  return o;
}

QString limbOrderText(const model::LimbSet& limbs) {
  return QString::fromStdString(limbs.labelList());
}

}  // namespace

std::vector<NamedFigure> exportFigures(const model::Annotation& annotation,
                                       const analysis::Report& report) {
  // 10 px at 96 px per inch = 7.5 pt: readable at journal column width, and the painters'
  // labels fit an 85 mm wide figure.
  figs::FigureStyle style = figs::FigureStyle::print();
  style.fontPx = 10;
  const double lanesMm = 7.0 * annotation.limbs.size();
  std::vector<NamedFigure> figures;
  figures.push_back(
      {"footfall_diagram", QStringLiteral("Footfall diagram"),
       QStringLiteral("Stance of each limb (%1) over the scored frames; bars in the limb colour, "
                      "right limbs hatched. Axis: frame · time in s at the capture rate.")
           .arg(limbOrderText(annotation.limbs)),
       [&annotation, style](QPainter& p, const QRectF& area) {
         figs::paintFootfallDiagram(p, area, annotation, footfallOptions(annotation), style);
       },
       FigureSize{85, lanesMm + 12}});
  figures.push_back({"support_strip", QStringLiteral("Support strip"),
                     QStringLiteral("Number of limbs in stance at each frame of the scored range."),
                     [&annotation, style](QPainter& p, const QRectF& area) {
                       figs::FootfallOptions o = footfallOptions(annotation);
                       const figs::FrameAxis axis = figs::frameAxis(area, o);
                       figs::paintSupportStrip(p, area, annotation, axis, style, o.labelWidth);
                     },
                     FigureSize{85, 14}});
  if (report.limbs.kind() == model::LimbSetKind::quadruped) {
    figures.push_back(
        {"gait_map", QStringLiteral("Gait map"),
         QStringLiteral("Hildebrand plot: hind-limb duty factor against limb phase (LF after LH) "
                        "for each symmetrical stride, over the shaded limb-phase bands."),
         [&report, style](QPainter& p, const QRectF& area) {
           figs::paintGaitMap(p, area, report, style);
         },
         FigureSize{85, 80}});
  }
  figures.push_back(
      {"phase_dial", QStringLiteral("Phase dial"),
       QStringLiteral("Relative phase of each limb per stride (dots) and its circular mean "
                      "(spoke; length = mean resultant length r), reference limb %1.")
           .arg(QString::fromStdString(report.limbs.label(report.referenceLimb))),
       [&report, style](QPainter& p, const QRectF& area) {
         figs::paintPhaseDial(p, area, report, style);
       },
       FigureSize{85, 85}});
  figures.push_back(
      {"stride_duty_factor", QStringLiteral("Duty factor per stride"),
       QStringLiteral("Duty factor of each limb in each reference stride (solid: left limbs, "
                      "dashed: right limbs)."),
       [&report, style](QPainter& p, const QRectF& area) {
         figs::paintStrideDutyPlot(p, area, report, style);
       },
       FigureSize{85, 60}});
  int rows = 0;
  for (const model::Limb& l : annotation.limbs.limbs()) rows = std::max(rows, l.segment + 1);
  figures.push_back(
      {"stride_stance_swing", QStringLiteral("Stance and swing per stride"),
       QStringLiteral("Stance (filled discs, solid line) and swing (hollow squares, dashed line) "
                      "time in s of each stride of each limb; one panel per limb, placed as the "
                      "animal is seen from above, same time scale in every panel."),
       [&report, style](QPainter& p, const QRectF& area) {
         figs::paintStrideTimePlots(p, area, report, style);
       },
       FigureSize{85, 8.0 + 30.0 * std::min(rows, 4)}});
  return figures;
}

}  // namespace stridemark::ui::exports

namespace stridemark::ui::exports {

std::string figureFileName(const NamedFigure& figure, FigureFormat format) {
  return figure.stem + "." + std::string(extensionOf(format));
}

void writeFigureFiles(const std::vector<NamedFigure>& figures,
                      const std::vector<FigureFormat>& formats, StagedOutput& out,
                      const std::filesystem::path& folder, const FigureProgress& progress) {
  const std::size_t total = figures.size() * formats.size();
  std::size_t done = 0;
  for (const NamedFigure& f : figures) {
    for (const FigureFormat format : formats) {
      if (progress) progress(done, total);
      const std::filesystem::path staged = out.stage(folder / figureFileName(f, format));
      writeFigure(f.paint, f.size, format, QString::fromStdString(staged.string()), f.title);
      ++done;
    }
  }
  if (progress) progress(done, total);
}

std::vector<std::filesystem::path> writeFigureFolder(const model::Annotation& annotation,
                                                     const analysis::Report& report,
                                                     const std::filesystem::path& folder) {
  StagedOutput out(folder);
  writeFigureFiles(exportFigures(annotation, report), kAllFigureFormats, out, {});
  return out.commit();
}

}  // namespace stridemark::ui::exports
