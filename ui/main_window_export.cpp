// File > Export… (the Export dialog on the saved project) and File > Export figures….
#include <QFileDialog>
#include <QPainter>
#include <QStatusBar>

#include "ui/export/export_dialog.h"
#include "ui/export/figure_set.h"
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
  // The export's figure set: same painters, sizes and file names as `stridemark export`.
  return runGuarded(this, tr("Export figures"), [&] {
    exports::writeFigureFolder(doc_.annotation(), *report_, dir.toStdString());
    statusBar()->showMessage(tr("Figures written to %1").arg(dir), 5000);
  });
}

}  // namespace stridemark::ui
