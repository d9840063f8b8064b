#pragma once
// The two dialogs of proposal review (issue 18 item 3): what to propose (scene, whole clip or a
// range of frames) and accept-all-above-a-confidence, which shows how many proposals a
// threshold would accept before anything changes.
#include <QDialog>
#include <cstdint>
#include <functional>
#include <optional>

#include "model/annotation.h"
#include "vision/propose.h"

class QComboBox;
class QDoubleSpinBox;
class QLabel;
class QRadioButton;
class QSlider;
class QSpinBox;

namespace stridemark::ui {

struct ProposeSettings {
  vision::Scene scene = vision::Scene::treadmill;
  std::optional<model::FrameRange> range;  // empty: the whole clip
};

class ProposeDialog : public QDialog {
  Q_OBJECT
 public:
  // `suggested`: the selection's frames, offered as the range when there is one.
  ProposeDialog(const ProposeSettings& last, std::int64_t frameCount,
                std::optional<model::FrameRange> suggested, const QString& seedSummary,
                QWidget* parent = nullptr);
  ProposeSettings settings() const;

 private:
  QComboBox* scene_;
  QRadioButton* whole_;
  QRadioButton* part_;
  QSpinBox* first_;
  QSpinBox* last_;
};

class AcceptProposalsDialog : public QDialog {
  Q_OBJECT
 public:
  // `acceptedAt(c)`: how many proposals accepting at confidence >= c would turn into tags.
  AcceptProposalsDialog(double threshold, int total, std::function<int(double)> acceptedAt,
                        QWidget* parent = nullptr);
  double threshold() const;
  QString countText() const;

 private:
  void showThreshold(double threshold);
  QSlider* slider_;
  QDoubleSpinBox* spin_;
  QLabel* count_;
  int total_;
  std::function<int(double)> acceptedAt_;
};

}  // namespace stridemark::ui
