#include "ui/export/export_dialog.h"

#include <QCheckBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QProgressBar>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>
#include <cmath>

#include "common/error.h"
#include "ui/export/clip_compositor.h"

namespace stridemark::ui::exports {

namespace {

QString stageName(const QString& stage) {
  if (stage == QLatin1String("tables")) return ExportDialog::tr("Writing tables");
  if (stage == QLatin1String("figures")) return ExportDialog::tr("Drawing figures");
  if (stage == QLatin1String("report")) return ExportDialog::tr("Writing the PDF report");
  if (stage == QLatin1String("clip")) return ExportDialog::tr("Rendering the marked clip");
  return stage;
}

}  // namespace

ExportDialog::ExportDialog(const QString& projectPath, std::int64_t frameCount,
                           Rational captureRate, QWidget* parent)
    : QDialog(parent), projectPath_(projectPath) {
  setWindowTitle(tr("Export"));
  const QFileInfo info(projectPath);
  folder_ =
      new QLineEdit(info.dir().filePath(info.completeBaseName() + QStringLiteral("-export")), this);
  folder_->setAccessibleName(tr("Output folder"));
  auto* browseButton = new QPushButton(tr("Choose…"), this);
  connect(browseButton, &QPushButton::clicked, this, &ExportDialog::browse);
  auto* folderRow = new QHBoxLayout;
  folderRow->addWidget(folder_, 1);
  folderRow->addWidget(browseButton);

  svg_ = new QCheckBox(tr("SVG"), this);
  png_ = new QCheckBox(tr("PNG (300 dpi)"), this);
  pdf_ = new QCheckBox(tr("PDF"), this);
  for (QCheckBox* box : {svg_, png_, pdf_}) box->setChecked(true);
  auto* figureRow = new QHBoxLayout;
  figureRow->addWidget(svg_);
  figureRow->addWidget(png_);
  figureRow->addWidget(pdf_);
  figureRow->addStretch();

  report_ = new QCheckBox(tr("PDF report (trial card, summary tables, figures, checks)"), this);
  report_->setChecked(true);
  clip_ = new QCheckBox(tr("Marked clip (H.264 MP4)"), this);
  clip_->setEnabled(frameCount > 0);
  clip_->setChecked(frameCount > 0);
  if (frameCount == 0) clip_->setToolTip(tr("The project links no video."));
  sideBySide_ = new QCheckBox(tr("Footfall diagram beside the frame"), this);
  const int lastFrame = static_cast<int>(std::max<std::int64_t>(frameCount - 1, 0));
  from_ = new QSpinBox(this);
  to_ = new QSpinBox(this);
  for (QSpinBox* box : {from_, to_}) box->setRange(0, lastFrame);
  to_->setValue(lastFrame);
  from_->setAccessibleName(tr("First frame of the clip"));
  to_->setAccessibleName(tr("Last frame of the clip"));
  playback_ = new QSpinBox(this);
  playback_->setRange(1, 1000);
  playback_->setSuffix(tr(" fps"));
  playback_->setValue(static_cast<int>(std::lround(defaultPlaybackRate(captureRate).toDouble())));
  playback_->setAccessibleName(tr("Playback rate of the clip"));
  auto* rangeRow = new QHBoxLayout;
  rangeRow->addWidget(from_);
  rangeRow->addWidget(new QLabel(tr("to"), this));
  rangeRow->addWidget(to_);
  rangeRow->addStretch();
  for (QWidget* w : std::initializer_list<QWidget*>{sideBySide_, from_, to_, playback_}) {
    w->setEnabled(clip_->isChecked());
    connect(clip_, &QCheckBox::toggled, w, &QWidget::setEnabled);
  }

  auto* form = new QFormLayout;
  form->addRow(tr("Folder"), folderRow);
  form->addRow(tr("Figures"), figureRow);
  form->addRow(QString(), report_);
  form->addRow(QString(), clip_);
  form->addRow(tr("Frames"), rangeRow);
  form->addRow(tr("Plays at"), playback_);
  form->addRow(QString(), sideBySide_);

  progress_ = new QProgressBar(this);
  progress_->setRange(0, 1000);
  progress_->setValue(0);
  status_ = new QLabel(tr("Tables (CSV and report JSON) are always written."), this);
  status_->setWordWrap(true);
  exportButton_ = new QPushButton(tr("Export"), this);
  exportButton_->setDefault(true);
  cancelButton_ = new QPushButton(tr("Close"), this);
  connect(exportButton_, &QPushButton::clicked, this, &ExportDialog::start);
  connect(cancelButton_, &QPushButton::clicked, this, &ExportDialog::cancelOrClose);
  auto* buttons = new QHBoxLayout;
  buttons->addStretch();
  buttons->addWidget(exportButton_);
  buttons->addWidget(cancelButton_);

  auto* layout = new QVBoxLayout(this);
  layout->addLayout(form);
  layout->addWidget(progress_);
  layout->addWidget(status_);
  layout->addLayout(buttons);

  // Worker-thread signals arrive queued on the dialog's thread.
  connect(this, &ExportDialog::exportProgressed, this, &ExportDialog::showProgress,
          Qt::QueuedConnection);
  connect(this, &ExportDialog::exportFinished, this, &ExportDialog::showFinished,
          Qt::QueuedConnection);
}

ExportDialog::~ExportDialog() {
  cancel_ = true;
  joinWorker();
}

ExportOptions ExportDialog::options() const {
  ExportOptions o;
  o.projectPath = projectPath_.toStdString();
  o.outDir = folder_->text().toStdString();
  o.figureFormats.clear();
  if (svg_->isChecked()) o.figureFormats.push_back(FigureFormat::svg);
  if (png_->isChecked()) o.figureFormats.push_back(FigureFormat::png);
  if (pdf_->isChecked()) o.figureFormats.push_back(FigureFormat::pdf);
  o.report = report_->isChecked();
  o.clip = clip_->isChecked();
  if (o.clip) {
    o.from = from_->value();
    o.to = to_->value();
    o.playback = Rational{playback_->value(), 1};
    o.sideBySide = sideBySide_->isChecked();
  }
  return o;
}

void ExportDialog::browse() {
  const QString dir =
      QFileDialog::getExistingDirectory(this, tr("Export into folder"), folder_->text());
  if (!dir.isEmpty()) folder_->setText(dir);
}

void ExportDialog::setRunning(bool running) {
  running_ = running;
  exportButton_->setEnabled(!running);
  cancelButton_->setText(running ? tr("Cancel") : tr("Close"));
}

void ExportDialog::joinWorker() {
  if (worker_.joinable()) worker_.join();
}

void ExportDialog::start() {
  if (running_) return;
  joinWorker();
  if (options().from && options().to && *options().from > *options().to) {
    status_->setText(tr("The first frame is after the last frame; swap them."));
    return;
  }
  cancel_ = false;
  progress_->setValue(0);
  setRunning(true);
  worker_ = std::thread([this, o = options()] {
    try {
      const ExportOutcome outcome = runExport(
          o,
          [this](const std::string& stage, double fraction) {
            emit exportProgressed(QString::fromStdString(stage), fraction);
          },
          cancel_);
      QString message = tr("Wrote %1 files to %2.")
                            .arg(outcome.written.size())
                            .arg(QString::fromStdString(o.outDir.string()));
      if (outcome.clipProblem) {
        message += QLatin1Char(' ') +
                   tr("No marked clip: %1").arg(QString::fromStdString(*outcome.clipProblem));
      }
      emit exportFinished(true, message);
    } catch (const Error& e) {
      emit exportFinished(false, QString::fromStdString(e.what()));
    } catch (const std::exception& e) {
      emit exportFinished(false, tr("Internal error: %1").arg(QString::fromUtf8(e.what())));
    }
  });
}

void ExportDialog::cancelOrClose() {
  if (running_) {
    cancel_ = true;
    status_->setText(tr("Cancelling… no partial file will be left behind."));
    return;
  }
  reject();
}

void ExportDialog::showProgress(const QString& stage, double fraction) {
  status_->setText(stageName(stage));
  progress_->setValue(static_cast<int>(std::lround(fraction * 1000)));
}

void ExportDialog::showFinished(bool ok, const QString& message) {
  joinWorker();
  setRunning(false);
  progress_->setValue(ok ? 1000 : 0);
  status_->setText(message);
}

}  // namespace stridemark::ui::exports
