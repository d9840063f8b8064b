#pragma once
// The workstation's Export dialog: choose a folder and what to write (tables always; figures
// as SVG/PNG/PDF, the PDF report, the marked clip with its frame range, playback rate and
// side-by-side layout), then watch the progress and cancel at any time. The export runs on a
// worker thread through runExport(), so a cancelled or failed export leaves no file behind.
// Hook-up: open it on the saved project file, e.g.
//   ExportDialog dialog(projectPath, frameCount, captureRate, this); dialog.exec();
#include <QDialog>
#include <QString>
#include <atomic>
#include <cstdint>
#include <memory>
#include <thread>

#include "common/rational.h"
#include "ui/export/export_job.h"

class QCheckBox;
class QDialogButtonBox;
class QLabel;
class QLineEdit;
class QProgressBar;
class QPushButton;
class QSpinBox;

namespace stridemark::ui::exports {

class ExportDialog : public QDialog {
  Q_OBJECT

 public:
  // `frameCount` bounds the clip range (0 when no video is linked).
  ExportDialog(const QString& projectPath, std::int64_t frameCount, Rational captureRate,
               QWidget* parent = nullptr);
  ~ExportDialog() override;

  // Options as currently set in the dialog (exposed for tests).
  ExportOptions options() const;

 signals:
  void exportProgressed(const QString& stage, double fraction);
  void exportFinished(bool ok, const QString& message);

 private slots:
  void start();
  void cancelOrClose();
  void showProgress(const QString& stage, double fraction);
  void showFinished(bool ok, const QString& message);
  void browse();

 private:
  void setRunning(bool running);
  void joinWorker();

  QString projectPath_;
  QLineEdit* folder_ = nullptr;
  QCheckBox* svg_ = nullptr;
  QCheckBox* png_ = nullptr;
  QCheckBox* pdf_ = nullptr;
  QCheckBox* report_ = nullptr;
  QCheckBox* clip_ = nullptr;
  QCheckBox* sideBySide_ = nullptr;
  QSpinBox* from_ = nullptr;
  QSpinBox* to_ = nullptr;
  QSpinBox* playback_ = nullptr;
  QProgressBar* progress_ = nullptr;
  QLabel* status_ = nullptr;
  QPushButton* exportButton_ = nullptr;
  QPushButton* cancelButton_ = nullptr;
  std::atomic<bool> cancel_{false};
  std::thread worker_;
  bool running_ = false;
};

}  // namespace stridemark::ui::exports
