#pragma once
// Trial card: subject, species, condition, scorer, exam date, notes, limb set, capture rate,
// reference limb, belt or ground speed (from the start, and the frames where the belt changed
// speed) and leg length. Validates before accepting.
#include <QDialog>
#include <QStringList>
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"

class QComboBox;
class QLineEdit;
class QPlainTextEdit;
class QLabel;
class QTableWidget;

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
  // Where "Add change" starts a new speed change (the playhead).
  void setCurrentFrame(std::int64_t frame) { currentFrame_ = frame; }
  QTableWidget* speedChangesTable() const { return speedChanges_; }
  void addSpeedChange();  // a row at the current frame with the speed from the start

  void accept() override;

 private:
  void fillReferences();
  void fillSpeedChanges(const std::vector<model::SpeedStep>& steps);
  std::optional<double> optionalNumber(QLineEdit* edit, const QString& what, bool* ok) const;
  // The table's rows in frame order (empty rows skipped); false with a message when a row or
  // the schedule is wrong.
  bool readSpeedChanges(std::vector<model::SpeedStep>* steps, QString* error) const;

  QLineEdit *subject_, *species_, *condition_, *observer_, *examDate_, *rate_, *speed_, *legLength_;
  QPlainTextEdit* notes_;
  QComboBox *limbSet_, *reference_, *speedSource_;
  QTableWidget* speedChanges_;
  QLabel* error_;
  int initialReference_;
  std::optional<std::int64_t> lastFrame_;  // the clip's, when known
  std::int64_t currentFrame_ = 0;
};

}  // namespace stridemark::ui
