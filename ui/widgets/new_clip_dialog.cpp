#include "ui/widgets/new_clip_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QVBoxLayout>
#include <algorithm>

#include "common/error.h"
#include "formats/events_csv.h"
#include "ui/widgets/trial_card_dialog.h"

namespace stridemark::ui {

namespace {

QString rateText(Rational rate) {
  return QString::fromStdString(toString(rate));
}

QLabel* wrappedLabel(const QString& text = {}) {
  auto* label = new QLabel(text);
  label->setWordWrap(true);
  return label;
}

// Rates of common high-speed and video cameras, offered after the file's own.
constexpr int kCommonRates[] = {25, 30, 50, 60, 100, 120, 200, 240, 250, 300, 500, 1000};

}  // namespace

ClipSetup NewClipDialog::defaults(const video::VideoInfo& info, const model::LimbSet& limbs) {
  ClipSetup setup;
  setup.captureRate = info.captureRate.valid() ? info.captureRate
                      : info.fileRate.valid()  ? info.fileRate
                                               : Rational{30, 1};
  setup.limbs = limbs;
  setup.referenceLimb = limbs.defaultReference();
  return setup;
}

NewClipDialog::NewClipDialog(const QString& videoPath, const video::VideoInfo& info,
                             const model::LimbSet& limbs, QWidget* parent)
    : QDialog(parent), videoDir_(QFileInfo(videoPath).absolutePath()), info_(info) {
  setWindowTitle(tr("New trial from a clip"));
  const ClipSetup start = defaults(info, limbs);
  auto* clip = wrappedLabel(tr("<b>%1</b> — %2 frames, %3×%4, file rate %5 fps")
                                .arg(QFileInfo(videoPath).fileName().toHtmlEscaped())
                                .arg(info.frameCount)
                                .arg(info.width)
                                .arg(info.height)
                                .arg(rateText(info.fileRate)));
  note_ = wrappedLabel();
  note_->setVisible(false);

  rate_ = new QComboBox;
  rate_->setEditable(true);
  rate_->setObjectName(QStringLiteral("captureRate"));
  rate_->setAccessibleName(tr("Capture rate"));
  rate_->addItem(rateText(start.captureRate));
  if (info.fileRate.valid() && info.fileRate != start.captureRate)
    rate_->addItem(rateText(info.fileRate));
  for (const int r : kCommonRates)
    if (rate_->findText(QString::number(r)) < 0) rate_->addItem(QString::number(r));
  rate_->setCurrentIndex(0);
  auto* rateHelp = wrappedLabel(
      tr("The frames per second the camera recorded. High-speed footage is often stored at a "
         "lower file rate (filmed at 240 fps, saved to play at 30 fps): enter the camera's rate, "
         "or every time comes out too long by the same factor."));
  if (info.captureRateFromMetadata)
    rateHelp->setText(
        rateHelp->text() + QLatin1Char(' ') +
        tr("This file's metadata says it was recorded at %1 fps.").arg(rateText(info.captureRate)));
  duration_ = wrappedLabel();

  limbSet_ = new QComboBox;
  limbSet_->setObjectName(QStringLiteral("limbSet"));
  limbSet_->setAccessibleName(tr("Limb set"));
  limbSet_->addItems(limbSetChoices(limbs));
  limbSet_->setCurrentText(QString::fromStdString(limbs.name()));
  reference_ = new QComboBox;
  reference_->setObjectName(QStringLiteral("referenceLimb"));
  reference_->setAccessibleName(tr("Reference limb"));

  eventsPath_ = new QLineEdit;
  eventsPath_->setReadOnly(true);
  eventsPath_->setAccessibleName(tr("Events CSV"));
  eventsPath_->setPlaceholderText(tr("none"));
  auto* importButton = new QPushButton(tr("&Import events CSV…"));
  importButton->setObjectName(QStringLiteral("importEvents"));
  auto* clearButton = new QPushButton(tr("Clea&r"));
  auto* eventsRow = new QHBoxLayout;
  eventsRow->addWidget(eventsPath_, 1);
  eventsRow->addWidget(importButton);
  eventsRow->addWidget(clearButton);
  eventsStatus_ = wrappedLabel(tr("Tags made elsewhere (limb,event,frame rows) can be the start."));
  error_ = wrappedLabel();
  error_->setObjectName(QStringLiteral("error"));
  error_->setStyleSheet(QStringLiteral("color: #d55e00"));

  // One column: each question on a line with its label, its explanation under it (wrapped
  // labels get their height right in a box layout, not inside a form's rows).
  const auto labelled = [](const QString& text, QWidget* buddy) {
    auto* label = new QLabel(text);
    label->setBuddy(buddy);
    return label;
  };
  auto* rateRow = new QHBoxLayout;
  rateRow->addWidget(labelled(tr("&Capture rate (fps)"), rate_));
  rateRow->addWidget(rate_, 1);
  auto* limbRow = new QHBoxLayout;
  limbRow->addWidget(labelled(tr("&Limb set"), limbSet_));
  limbRow->addWidget(limbSet_, 1);
  limbRow->addSpacing(fontMetrics().averageCharWidth() * 2);
  limbRow->addWidget(labelled(tr("R&eference limb"), reference_));
  limbRow->addWidget(reference_, 1);
  eventsRow->insertWidget(0, labelled(tr("Events CSV"), importButton));
  const auto indented = [this](QLabel* label) {
    label->setContentsMargins(fontMetrics().averageCharWidth() * 2, 0, 0, 0);
    return label;
  };
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons->button(QDialogButtonBox::Ok)->setText(tr("Start &tagging"));
  auto* layout = new QVBoxLayout(this);
  layout->addWidget(clip);
  layout->addWidget(note_);
  layout->addSpacing(6);
  layout->addLayout(rateRow);
  layout->addWidget(indented(rateHelp));
  layout->addWidget(indented(duration_));
  layout->addSpacing(6);
  layout->addLayout(limbRow);
  layout->addSpacing(6);
  layout->addLayout(eventsRow);
  layout->addWidget(indented(eventsStatus_));
  layout->addStretch();
  layout->addWidget(error_);
  layout->addWidget(buttons);
  setMinimumWidth(fontMetrics().averageCharWidth() * 96);

  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(importButton, &QPushButton::clicked, this, &NewClipDialog::chooseEventsFile);
  connect(clearButton, &QPushButton::clicked, this, &NewClipDialog::clearEvents);
  connect(rate_, &QComboBox::currentTextChanged, this, &NewClipDialog::showDuration);
  connect(limbSet_, &QComboBox::currentTextChanged, this, [this] { fillReferences(-1); });
  fillReferences(start.referenceLimb);
  showDuration();
}

void NewClipDialog::setNote(const QString& note) {
  note_->setText(note);
  note_->setVisible(!note.isEmpty());
}

void NewClipDialog::fillReferences(int reference) {
  reference_->clear();
  const auto limbs = model::LimbSet::fromName(limbSet_->currentText().toStdString());
  for (const auto& limb : limbs.limbs()) reference_->addItem(QString::fromStdString(limb.label));
  reference_->setCurrentIndex(
      reference >= 0 && reference < limbs.size() ? reference : limbs.defaultReference());
}

Rational NewClipDialog::enteredRate() const {
  const Rational rate = parseRate(rate_->currentText().trimmed().toStdString(), "capture rate");
  if (!rate.valid()) throw Error(ErrorCategory::format, "capture rate must be positive");
  return rate;
}

// The clip's length at the entered rate: 5.7 s for three strides says the rate is wrong.
void NewClipDialog::showDuration() {
  try {
    const Rational rate = enteredRate();
    QString text = tr("At %1 fps the clip lasts %2 s.")
                       .arg(rateText(rate))
                       .arg(static_cast<double>(info_.frameCount) / rate.toDouble(), 0, 'f', 2);
    if (rate != info_.fileRate)
      text += QLatin1Char(' ') +
              tr("It plays for %1 s at its file rate.").arg(info_.durationSeconds, 0, 'f', 2);
    duration_->setText(text);
  } catch (const Error&) {
    duration_->setText(tr("Enter frames per second, e.g. 240 or 30000/1001."));
  }
}

void NewClipDialog::chooseEventsFile() {
  const QString path = QFileDialog::getOpenFileName(this, tr("Import events CSV"), videoDir_,
                                                    tr("Events CSV (*.csv);;All files (*)"));
  if (!path.isEmpty()) importEvents(path);
}

bool NewClipDialog::importEvents(const QString& path) {
  error_->clear();
  formats::EventsCsv csv;
  try {
    csv = formats::readEventsCsv(path.toStdString());
  } catch (const Error& first) {
    // A file without a "# limbs:" line may still fit the limb set chosen here.
    try {
      formats::EventsCsvOptions options;
      options.limbs = model::LimbSet::fromName(limbSet_->currentText().toStdString());
      csv = formats::readEventsCsv(path.toStdString(), options);
    } catch (const Error&) {
      error_->setText(tr("Events CSV: %1").arg(QString::fromStdString(first.what())));
      return false;
    }
  }
  eventsFile_ = path;
  eventsPath_->setText(QDir::toNativeSeparators(path));
  const QString limbs = QString::fromStdString(csv.limbs.name());
  if (limbSet_->findText(limbs) < 0) limbSet_->addItem(limbs);
  limbSet_->setCurrentText(limbs);
  fillReferences(csv.referenceLimb.value_or(-1));
  if (csv.captureRate) rate_->setCurrentText(rateText(*csv.captureRate));
  const auto count = static_cast<int>(csv.events.size());
  const QString what = count == 1 ? tr("1 event") : tr("%1 events").arg(count);
  eventsStatus_->setText(
      tr("%1 read for the %2 limb set%3; checked against the clip when tagging starts.")
          .arg(what, limbs,
               csv.captureRate ? tr(" (the file says %1 fps)").arg(rateText(*csv.captureRate))
                               : QString()));
  return true;
}

void NewClipDialog::clearEvents() {
  eventsFile_.clear();
  eventsPath_->clear();
  eventsStatus_->setText(tr("Nothing imported: tagging starts from scratch."));
  error_->clear();
}

std::vector<model::Event> NewClipDialog::readChosenEvents() const {
  if (eventsFile_.isEmpty()) return {};
  formats::EventsCsvOptions options;
  options.limbs = model::LimbSet::fromName(limbSet_->currentText().toStdString());
  options.captureRate = enteredRate();
  model::Annotation read =
      formats::toAnnotation(formats::readEventsCsv(eventsFile_.toStdString(), options));
  const std::int64_t last = info_.frameCount - 1;
  const auto outside = std::find_if(read.events.begin(), read.events.end(),
                                    [&](const model::Event& e) { return e.frame > last; });
  if (outside != read.events.end())
    throw Error(ErrorCategory::format,
                eventsFile_.toStdString() + ": " + read.limbs.label(outside->limb) + " " +
                    std::string(model::eventWord(outside->kind)) + " at frame " +
                    std::to_string(outside->frame) + " is after the clip's last frame (" +
                    std::to_string(last) +
                    ") — is it the CSV of another clip, or were its times read at another "
                    "capture rate?");
  return read.events;
}

void NewClipDialog::accept() {
  error_->clear();
  ClipSetup setup;
  try {
    setup.captureRate = enteredRate();
  } catch (const Error& e) {
    error_->setText(tr("Capture rate: %1").arg(QString::fromStdString(e.what())));
    rate_->setFocus();
    return;
  }
  setup.limbs = model::LimbSet::fromName(limbSet_->currentText().toStdString());
  setup.referenceLimb = reference_->currentIndex();
  try {
    setup.events = readChosenEvents();
  } catch (const Error& e) {
    error_->setText(tr("Events CSV: %1").arg(QString::fromStdString(e.what())));
    return;
  }
  setup.eventsFile = eventsFile_;
  setup_ = std::move(setup);
  QDialog::accept();
}

}  // namespace stridemark::ui
