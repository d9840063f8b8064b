#pragma once
// Trial card: subject, species, condition, observer, notes, limb set, capture rate, reference
// limb, belt or ground speed and leg length. Validates before accepting.
#include <QDialog>
#include <QStringList>

#include "model/annotation.h"

class QComboBox;
class QLineEdit;
class QPlainTextEdit;
class QLabel;

namespace stridemark::ui {

// The limb sets a person can choose, `current` among them.
QStringList limbSetChoices(const model::LimbSet& current);

class TrialCardDialog : public QDialog {
  Q_OBJECT
 public:
  // `limbSetLocked`: tags exist, so the limb set cannot change.
  TrialCardDialog(const model::Project& project, bool limbSetLocked, QWidget* parent = nullptr);

  model::TrialCard trialCard() const;
  model::LimbSet limbSet() const;
  Rational captureRate() const;
  int referenceLimb() const;

  void accept() override;

 private:
  void fillReferences();
  std::optional<double> optionalNumber(QLineEdit* edit, const QString& what, bool* ok) const;

  QLineEdit *subject_, *species_, *condition_, *observer_, *rate_, *speed_, *legLength_;
  QPlainTextEdit* notes_;
  QComboBox *limbSet_, *reference_, *speedSource_;
  QLabel* error_;
  int initialReference_;
};

}  // namespace stridemark::ui
