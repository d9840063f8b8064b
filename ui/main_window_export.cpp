// File > Export… (the Export dialog on the saved project) and File > Export figures….
#include <QFileDialog>
#include <QPainter>
#include <QStatusBar>

#include "ui/export/export_dialog.h"
#include "ui/export/figure_output.h"
#include "ui/figures/analysis_figures.h"
#include "ui/figures/footfall_diagram.h"
#include "ui/main_window.h"
#include "ui/session/guarded.h"

namespace stridemark::ui {

bool MainWindow::saveBeforeExport() {
  // The export reads the project file, so it must hold what the user sees.
  if (!doc_.projectPath().isEmpty() && !doc_.isModified()) return true;
  return save();  // Save As prompt when never saved; cancel returns false
}

void MainWindow::openExport() {
  if (!saveBeforeExport()) return;
  const std::int64_t frames = video_ ? video_->frameCount() : 0;
  exports::ExportDialog dialog(doc_.projectPath(), frames, doc_.annotation().captureRate, this);
  dialog.exec();
}

void MainWindow::exportFigures() {
  if (!report_) {
    reportError(this, tr("Export figures"), tr("Nothing to export yet: tag some strides first."));
    return;
  }
  const QString dir = QFileDialog::getExistingDirectory(this, tr("Export figures to folder"));
  if (!dir.isEmpty()) exportFiguresTo(dir);
}

bool MainWindow::exportFiguresTo(const QString& dir) {
  if (!report_) return false;
  // The same painters as the docks, written as SVG, PNG and PDF by ui/export.
  const auto report = report_;
  const auto annotation = doc_.annotation();
  const auto style = figures::FigureStyle::print();
  const std::vector<std::pair<QString, exports::FigurePaint>> figs{
      {QStringLiteral("gait_map"),
       [=](QPainter& p, const QRectF& r) { figures::paintGaitMap(p, r, *report, style); }},
      {QStringLiteral("phase_dial"),
       [=](QPainter& p, const QRectF& r) { figures::paintPhaseDial(p, r, *report, style); }},
      {QStringLiteral("duty_per_stride"),
       [=](QPainter& p, const QRectF& r) { figures::paintStrideDutyPlot(p, r, *report, style); }},
      {QStringLiteral("footfall_diagram"), [=](QPainter& p, const QRectF& r) {
         figures::FootfallOptions o;
         o.viewLast = annotation.clip
                          ? annotation.clip->last
                          : (annotation.events.empty() ? 100 : annotation.events.back().frame);
         figures::paintFootfallDiagram(p, r, annotation, o, style);
       }}};
  return runGuarded(this, tr("Export figures"), [&] {
    for (const auto& [stem, paint] : figs)
      for (auto format :
           {exports::FigureFormat::svg, exports::FigureFormat::png, exports::FigureFormat::pdf})
        exports::writeFigure(
            paint, exports::FigureSize{170, 110}, format,
            dir + QLatin1Char('/') + stem + QLatin1Char('.') +
                QString::fromLatin1(exports::extensionOf(format).data(),
                                    static_cast<int>(exports::extensionOf(format).size())),
            stem);
    statusBar()->showMessage(tr("Figures written to %1").arg(dir), 5000);
  });
}

}  // namespace stridemark::ui
