#include "ui/widgets/trial_card_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QPushButton>
#include <QTableWidget>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>

#include "common/error.h"

namespace stridemark::ui {

namespace {

QLineEdit* textField(const std::string& value, const QString& name) {
  auto* edit = new QLineEdit(QString::fromStdString(value));
  edit->setAccessibleName(name);
  return edit;
}

QString optionalText(const std::optional<double>& v) {
  return v ? QString::number(*v) : QString();
}

}  // namespace

QStringList limbSetChoices(const model::LimbSet& current) {
  QStringList names;
  for (const char* name : {"quadruped", "biped", "hexapod", "multi-pair-4", "multi-pair-5",
                           "multi-pair-6", "multi-pair-8", "multi-pair-10"})
    names << QString::fromLatin1(name);
  const QString own = QString::fromStdString(current.name());
  if (!names.contains(own)) names << own;
  return names;
}

TrialCardDialog::TrialCardDialog(const model::Project& project, bool limbSetLocked, QWidget* parent)
    : QDialog(parent), initialReference_(project.annotation.referenceLimb) {
  setWindowTitle(tr("Trial card"));
  const auto& t = project.trial;
  const auto& a = project.annotation;
  subject_ = textField(t.subject, tr("Subject"));
  species_ = textField(t.species, tr("Species"));
  condition_ = textField(t.condition, tr("Condition"));
  observer_ = textField(t.observer, tr("Scorer"));
  examDate_ = textField(t.examDate, tr("Exam date"));
  examDate_->setObjectName(QStringLiteral("examDate"));
  examDate_->setPlaceholderText(tr("YYYY-MM-DD"));
  examDate_->setToolTip(tr("The day the animal was filmed, e.g. 2026-03-14. The report names it."));
  notes_ = new QPlainTextEdit(QString::fromStdString(t.notes));
  notes_->setAccessibleName(tr("Notes"));
  notes_->setTabChangesFocus(true);
  notes_->setMaximumHeight(70);
  limbSet_ = new QComboBox;
  limbSet_->setAccessibleName(tr("Limb set"));
  limbSet_->addItems(limbSetChoices(a.limbs));
  limbSet_->setCurrentText(QString::fromStdString(a.limbs.name()));
  limbSet_->setEnabled(!limbSetLocked);
  if (limbSetLocked)
    limbSet_->setToolTip(
        tr("Delete all tags, hidden spans, foot seeds and proposals to change the limb set."));
  reference_ = new QComboBox;
  reference_->setAccessibleName(tr("Reference limb"));
  rate_ = textField(toString(a.captureRate), tr("Capture rate"));
  rate_->setToolTip(
      tr("Frames per second the camera recorded, e.g. 240 or 30000/1001. May "
         "differ from the file rate the container claims."));
  speed_ = new QLineEdit(optionalText(t.speedMs));
  speed_->setAccessibleName(tr("Speed from the start in metres per second"));
  speed_->setPlaceholderText(tr("unknown"));
  speedChanges_ = new QTableWidget(0, 2);
  speedChanges_->setObjectName(QStringLiteral("speedChanges"));
  speedChanges_->setAccessibleName(tr("Speed changes: from frame, metres per second"));
  speedChanges_->setHorizontalHeaderLabels({tr("From frame"), tr("Speed (m/s)")});
  speedChanges_->horizontalHeader()->setSectionResizeMode(QHeaderView::Stretch);
  speedChanges_->verticalHeader()->setVisible(false);
  speedChanges_->setSelectionBehavior(QAbstractItemView::SelectRows);
  speedChanges_->setMaximumHeight(speedChanges_->horizontalHeader()->sizeHint().height() +
                                  4 * speedChanges_->verticalHeader()->defaultSectionSize() + 4);
  speedChanges_->setToolTip(
      tr("A treadmill belt that changed speed: each row is the speed from that frame on."));
  fillSpeedChanges(t.speedChanges);
  auto* addChange = new QPushButton(tr("&Add change"));
  addChange->setObjectName(QStringLiteral("addSpeedChange"));
  auto* removeChange = new QPushButton(tr("Remo&ve"));
  removeChange->setObjectName(QStringLiteral("removeSpeedChange"));
  connect(addChange, &QPushButton::clicked, this, &TrialCardDialog::addSpeedChange);
  connect(removeChange, &QPushButton::clicked, this, [this] {
    if (speedChanges_->currentRow() >= 0) speedChanges_->removeRow(speedChanges_->currentRow());
  });
  auto* changeButtons = new QVBoxLayout;
  changeButtons->addWidget(addChange);
  changeButtons->addWidget(removeChange);
  changeButtons->addStretch();
  auto* changes = new QHBoxLayout;
  changes->addWidget(speedChanges_, 1);
  changes->addLayout(changeButtons);
  if (a.clip) lastFrame_ = a.clip->last;
  speedSource_ = new QComboBox;
  speedSource_->setAccessibleName(tr("Speed source"));
  speedSource_->addItems({QStringLiteral("belt"), QStringLiteral("ground")});
  speedSource_->setCurrentText(QString::fromStdString(t.speedSource));
  legLength_ = new QLineEdit(optionalText(t.legLengthM));
  legLength_->setAccessibleName(tr("Leg length in metres"));
  legLength_->setPlaceholderText(tr("unknown"));
  error_ = new QLabel;
  error_->setStyleSheet(QStringLiteral("color: #d55e00"));
  error_->setWordWrap(true);

  auto* form = new QFormLayout;
  form->addRow(tr("&Subject"), subject_);
  form->addRow(tr("S&pecies"), species_);
  form->addRow(tr("Con&dition"), condition_);
  form->addRow(tr("Sc&orer"), observer_);
  form->addRow(tr("E&xam date"), examDate_);
  form->addRow(tr("&Notes"), notes_);
  form->addRow(tr("&Limb set"), limbSet_);
  form->addRow(tr("&Reference limb"), reference_);
  form->addRow(tr("&Capture rate (fps)"), rate_);
  form->addRow(tr("Sp&eed from the start (m/s)"), speed_);
  form->addRow(tr("Speed changes"), changes);
  form->addRow(tr("Speed so&urce"), speedSource_);
  form->addRow(tr("Le&g length (m)"), legLength_);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  auto* layout = new QVBoxLayout(this);
  layout->addLayout(form);
  layout->addWidget(error_);
  layout->addWidget(buttons);
  connect(limbSet_, &QComboBox::currentTextChanged, this, [this] { fillReferences(); });
  fillReferences();
  reference_->setCurrentIndex(initialReference_);
}

void TrialCardDialog::fillSpeedChanges(const std::vector<model::SpeedStep>& steps) {
  speedChanges_->setRowCount(0);
  for (const auto& step : steps) {
    const int row = speedChanges_->rowCount();
    speedChanges_->insertRow(row);
    speedChanges_->setItem(row, 0, new QTableWidgetItem(QString::number(step.fromFrame)));
    speedChanges_->setItem(row, 1, new QTableWidgetItem(QString::number(step.ms)));
  }
}

void TrialCardDialog::addSpeedChange() {
  const int row = speedChanges_->rowCount();
  speedChanges_->insertRow(row);
  speedChanges_->setItem(
      row, 0, new QTableWidgetItem(QString::number(std::max<std::int64_t>(1, currentFrame_))));
  speedChanges_->setItem(row, 1, new QTableWidgetItem(speed_->text().trimmed()));
  speedChanges_->setCurrentCell(row, 1);
  speedChanges_->editItem(speedChanges_->item(row, 1));
}

bool TrialCardDialog::readSpeedChanges(std::vector<model::SpeedStep>* steps, QString* error) const {
  steps->clear();
  const auto cell = [this](int row, int column) {
    const QTableWidgetItem* item = speedChanges_->item(row, column);
    return item ? item->text().trimmed() : QString();
  };
  for (int row = 0; row < speedChanges_->rowCount(); ++row) {
    const QString frameText = cell(row, 0), speedText = cell(row, 1);
    if (frameText.isEmpty() && speedText.isEmpty()) continue;
    bool frameOk = false, speedOk = false;
    const qlonglong frame = frameText.toLongLong(&frameOk);
    const double ms = speedText.toDouble(&speedOk);
    if (!frameOk || frame < 1) {
      *error = tr("Speed change %1: the frame must be a whole number from 1 on (the speed at "
                  "frame 0 is the speed from the start).")
                   .arg(row + 1);
      return false;
    }
    if (lastFrame_ && frame > *lastFrame_) {
      *error = tr("Speed change %1: frame %2 is after the clip's last frame (%3).")
                   .arg(row + 1)
                   .arg(frame)
                   .arg(*lastFrame_);
      return false;
    }
    if (!speedOk || !(ms > 0) || !std::isfinite(ms)) {
      *error = tr("Speed change %1 (from frame %2): the speed must be a positive number of "
                  "metres per second.")
                   .arg(row + 1)
                   .arg(frame);
      return false;
    }
    steps->push_back({frame, ms});
  }
  std::sort(steps->begin(), steps->end(),
            [](const auto& a, const auto& b) { return a.fromFrame < b.fromFrame; });
  for (std::size_t i = 1; i < steps->size(); ++i)
    if ((*steps)[i].fromFrame == (*steps)[i - 1].fromFrame) {
      *error = tr("Two speed changes at frame %1: keep one.").arg((*steps)[i].fromFrame);
      return false;
    }
  if (!steps->empty() && speed_->text().trimmed().isEmpty()) {
    *error = tr("Speed changes need the speed from the start too.");
    return false;
  }
  return true;
}

void TrialCardDialog::fillReferences() {
  reference_->clear();
  const auto limbs = limbSet();
  for (const auto& limb : limbs.limbs()) reference_->addItem(QString::fromStdString(limb.label));
  reference_->setCurrentIndex(limbs.defaultReference());
}

model::LimbSet TrialCardDialog::limbSet() const {
  return model::LimbSet::fromName(limbSet_->currentText().toStdString());
}

Rational TrialCardDialog::captureRate() const {
  return parseRate(rate_->text().trimmed().toStdString(), "capture rate");
}

int TrialCardDialog::referenceLimb() const {
  return reference_->currentIndex();
}

std::optional<double> TrialCardDialog::optionalNumber(QLineEdit* edit, const QString& what,
                                                      bool* ok) const {
  const QString text = edit->text().trimmed();
  if (text.isEmpty()) return std::nullopt;
  bool parsed = false;
  const double v = text.toDouble(&parsed);
  if (!parsed || v <= 0) {
    error_->setText(tr("%1 must be a positive number (or empty when unknown).").arg(what));
    *ok = false;
    return std::nullopt;
  }
  return v;
}

model::TrialCard TrialCardDialog::trialCard() const {
  model::TrialCard t;
  t.subject = subject_->text().trimmed().toStdString();
  t.species = species_->text().trimmed().toStdString();
  t.condition = condition_->text().trimmed().toStdString();
  t.observer = observer_->text().trimmed().toStdString();
  t.examDate = examDate_->text().trimmed().toStdString();
  t.notes = notes_->toPlainText().toStdString();
  bool ok = true;
  t.speedMs = optionalNumber(speed_, tr("Speed"), &ok);
  QString ignored;
  readSpeedChanges(&t.speedChanges, &ignored);  // accept() refused a wrong schedule
  t.speedSource = speedSource_->currentText().toStdString();
  t.legLengthM = optionalNumber(legLength_, tr("Leg length"), &ok);
  return t;
}

void TrialCardDialog::accept() {
  error_->clear();
  try {
    const auto rate = captureRate();
    if (!rate.valid()) throw Error(ErrorCategory::format, "capture rate must be positive");
  } catch (const Error& e) {
    error_->setText(tr("Capture rate: %1").arg(QString::fromStdString(e.what())));
    rate_->setFocus();
    return;
  }
  const std::string date = examDate_->text().trimmed().toStdString();
  if (!date.empty() && !model::isCalendarDate(date)) {
    error_->setText(tr("Exam date: write it as YYYY-MM-DD (e.g. 2026-03-14), or leave it empty."));
    examDate_->setFocus();
    return;
  }
  bool ok = true;
  optionalNumber(speed_, tr("Speed"), &ok);
  optionalNumber(legLength_, tr("Leg length"), &ok);
  if (!ok) return;
  std::vector<model::SpeedStep> steps;
  QString problem;
  if (!readSpeedChanges(&steps, &problem)) {
    error_->setText(problem);
    speedChanges_->setFocus();
    return;
  }
  QDialog::accept();
}

}  // namespace stridemark::ui
