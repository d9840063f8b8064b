#include "ui/widgets/trial_card_dialog.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPlainTextEdit>
#include <QVBoxLayout>

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
  observer_ = textField(t.observer, tr("Observer"));
  notes_ = new QPlainTextEdit(QString::fromStdString(t.notes));
  notes_->setAccessibleName(tr("Notes"));
  notes_->setTabChangesFocus(true);
  notes_->setMaximumHeight(70);
  limbSet_ = new QComboBox;
  limbSet_->setAccessibleName(tr("Limb set"));
  limbSet_->addItems(limbSetChoices(a.limbs));
  limbSet_->setCurrentText(QString::fromStdString(a.limbs.name()));
  limbSet_->setEnabled(!limbSetLocked);
  if (limbSetLocked) limbSet_->setToolTip(tr("Delete all tags to change the limb set."));
  reference_ = new QComboBox;
  reference_->setAccessibleName(tr("Reference limb"));
  rate_ = textField(toString(a.captureRate), tr("Capture rate"));
  rate_->setToolTip(
      tr("Frames per second the camera recorded, e.g. 240 or 30000/1001. May "
         "differ from the file rate the container claims."));
  speed_ = new QLineEdit(optionalText(t.speedMs));
  speed_->setAccessibleName(tr("Speed in metres per second"));
  speed_->setPlaceholderText(tr("unknown"));
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
  form->addRow(tr("&Observer"), observer_);
  form->addRow(tr("&Notes"), notes_);
  form->addRow(tr("&Limb set"), limbSet_);
  form->addRow(tr("&Reference limb"), reference_);
  form->addRow(tr("&Capture rate (fps)"), rate_);
  form->addRow(tr("Sp&eed (m/s)"), speed_);
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
  t.notes = notes_->toPlainText().toStdString();
  bool ok = true;
  t.speedMs = optionalNumber(speed_, tr("Speed"), &ok);
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
  bool ok = true;
  optionalNumber(speed_, tr("Speed"), &ok);
  optionalNumber(legLength_, tr("Leg length"), &ok);
  if (!ok) return;
  QDialog::accept();
}

}  // namespace stridemark::ui
