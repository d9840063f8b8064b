// Saving the project (which also retires its autosave journal), the unsaved-changes question,
// and what closing or dropping a file on the window does.
#include <QCloseEvent>
#include <QFileDialog>
#include <QFileInfo>
#include <QMessageBox>
#include <QMimeData>
#include <QSettings>
#include <QStatusBar>

#include "ui/document/project_lock.h"
#include "ui/main_window.h"
#include "ui/main_window_files.h"
#include "ui/session/guarded.h"

namespace stridemark::ui {

bool MainWindow::saveProjectAs(const QString& path) {
  QString target = path;
  if (!isProjectFile(target)) target += projectExtension();
  std::unique_ptr<ProjectLock> lock;  // never save over a project another desk has open
  if (!lockFor(target, &lock)) return false;
  const bool ok = runGuarded(this, tr("Save project"), [&] { doc_.saveAs(target); });
  if (ok) {
    keepLock(std::move(lock));
    addRecent(target);
    statusBar()->showMessage(tr("Saved %1").arg(target), 4000);
  }
  return ok;
}

bool MainWindow::save() {
  if (doc_.projectPath().isEmpty()) return saveAsDialog();
  return saveProjectAs(doc_.projectPath());
}

bool MainWindow::saveAsDialog() {
  QString suggestion = doc_.projectPath();
  if (suggestion.isEmpty() && !doc_.videoPath().isEmpty()) {
    const QFileInfo v(doc_.videoPath());
    suggestion = v.absolutePath() + QLatin1Char('/') + v.completeBaseName() + projectExtension();
  }
  const QString path = QFileDialog::getSaveFileName(this, tr("Save project"), suggestion,
                                                    tr("Stridemark projects (*.stridemark)"));
  return !path.isEmpty() && saveProjectAs(path);
}

bool MainWindow::maybeSave() {
  if (!doc_.isModified() || !askBeforeDiscard_) return true;
  const auto answer = QMessageBox::warning(
      this, tr("Unsaved changes"), tr("The project has unsaved changes. Save them?"),
      QMessageBox::Save | QMessageBox::Discard | QMessageBox::Cancel, QMessageBox::Save);
  if (answer == QMessageBox::Cancel) return false;
  if (answer == QMessageBox::Save) return save();
  doc_.removeJournal();  // the user chose to drop these edits
  return true;
}

void MainWindow::closeEvent(QCloseEvent* event) {
  if (!maybeSave()) {
    event->ignore();
    return;
  }
  stopPlayback();
  QSettings settings;
  settings.setValue(QStringLiteral("mainWindow/geometry"), saveGeometry());
  settings.setValue(QStringLiteral("mainWindow/state"), saveState());
  event->accept();
}

void MainWindow::dragEnterEvent(QDragEnterEvent* event) {
  if (event->mimeData()->hasUrls()) event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent* event) {
  const auto urls = event->mimeData()->urls();
  if (urls.isEmpty() || !urls.front().isLocalFile()) return;
  if (maybeSave()) openPath(urls.front().toLocalFile());
}

}  // namespace stridemark::ui
