#include "ui/widgets/proposal_dialogs.h"

#include <QComboBox>
#include <QDialogButtonBox>
#include <QDoubleSpinBox>
#include <QFormLayout>
#include <QHBoxLayout>
#include <QLabel>
#include <QPushButton>
#include <QRadioButton>
#include <QSlider>
#include <QSpinBox>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>

namespace stridemark::ui {

namespace {

QDialogButtonBox* okCancel(QDialog* dialog, const QString& okText) {
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  buttons->button(QDialogButtonBox::Ok)->setText(okText);
  QObject::connect(buttons, &QDialogButtonBox::accepted, dialog, &QDialog::accept);
  QObject::connect(buttons, &QDialogButtonBox::rejected, dialog, &QDialog::reject);
  return buttons;
}

}  // namespace

ProposeDialog::ProposeDialog(const ProposeSettings& last, std::int64_t frameCount,
                             std::optional<model::FrameRange> suggested, const QString& seedSummary,
                             QWidget* parent)
    : QDialog(parent) {
  setWindowTitle(tr("Propose events"));
  auto* form = new QFormLayout;
  scene_ = new QComboBox;
  scene_->addItem(tr("Treadmill (the belt moves under a still camera)"),
                  static_cast<int>(vision::Scene::treadmill));
  scene_->addItem(tr("Over ground, fixed camera"), static_cast<int>(vision::Scene::overground));
  scene_->addItem(tr("Panning camera"), static_cast<int>(vision::Scene::panning));
  scene_->setCurrentIndex(scene_->findData(static_cast<int>(last.scene)));
  form->addRow(tr("&Scene:"), scene_);
  const int lastFrame = static_cast<int>(std::max<std::int64_t>(0, frameCount - 1));
  whole_ = new QRadioButton(tr("&Whole clip (frames 0-%1)").arg(lastFrame));
  part_ = new QRadioButton(tr("&Frames"));
  first_ = new QSpinBox;
  last_ = new QSpinBox;
  for (auto* spin : {first_, last_}) spin->setRange(0, lastFrame);
  const auto range = suggested ? suggested : last.range;
  first_->setValue(static_cast<int>(range ? range->first : 0));
  last_->setValue(static_cast<int>(range ? range->last : lastFrame));
  (suggested ? part_ : whole_)->setChecked(true);
  auto* partRow = new QHBoxLayout;
  partRow->addWidget(part_);
  partRow->addWidget(first_);
  partRow->addWidget(new QLabel(tr("to")));
  partRow->addWidget(last_);
  partRow->addStretch();
  auto* rangeBox = new QVBoxLayout;
  rangeBox->addWidget(whole_);
  rangeBox->addLayout(partRow);
  form->addRow(tr("Range:"), rangeBox);
  auto* seeds = new QLabel(seedSummary);
  seeds->setWordWrap(true);
  form->addRow(tr("Seeds:"), seeds);
  auto* layout = new QVBoxLayout(this);
  layout->addLayout(form);
  layout->addWidget(okCancel(this, tr("Propose")));
}

ProposeSettings ProposeDialog::settings() const {
  ProposeSettings s;
  s.scene = static_cast<vision::Scene>(scene_->currentData().toInt());
  if (part_->isChecked())
    s.range = model::FrameRange{std::min(first_->value(), last_->value()),
                                std::max(first_->value(), last_->value())};
  return s;
}

AcceptProposalsDialog::AcceptProposalsDialog(double threshold, int total,
                                             std::function<int(double)> acceptedAt, QWidget* parent)
    : QDialog(parent), total_(total), acceptedAt_(std::move(acceptedAt)) {
  setWindowTitle(tr("Accept proposals above a confidence"));
  slider_ = new QSlider(Qt::Horizontal);
  slider_->setRange(0, 100);
  slider_->setAccessibleName(tr("Lowest confidence accepted"));
  spin_ = new QDoubleSpinBox;
  spin_->setRange(0.0, 1.0);
  spin_->setSingleStep(0.01);
  spin_->setDecimals(2);
  count_ = new QLabel;
  count_->setObjectName(QStringLiteral("acceptCount"));
  connect(slider_, &QSlider::valueChanged, this, [this](int v) { showThreshold(v / 100.0); });
  connect(spin_, &QDoubleSpinBox::valueChanged, this, [this](double v) { showThreshold(v); });
  auto* row = new QHBoxLayout;
  row->addWidget(new QLabel(tr("Confidence at least")));
  row->addWidget(slider_, 1);
  row->addWidget(spin_);
  auto* layout = new QVBoxLayout(this);
  layout->addLayout(row);
  layout->addWidget(count_);
  layout->addWidget(okCancel(this, tr("Accept")));
  showThreshold(threshold);
}

void AcceptProposalsDialog::showThreshold(double threshold) {
  const QSignalBlocker a(slider_), b(spin_);
  slider_->setValue(static_cast<int>(std::lround(threshold * 100)));
  spin_->setValue(threshold);
  count_->setText(
      tr("%1 of %2 proposals would be accepted as tags.").arg(acceptedAt_(threshold)).arg(total_));
}

double AcceptProposalsDialog::threshold() const {
  return spin_->value();
}

QString AcceptProposalsDialog::countText() const {
  return count_->text();
}

}  // namespace stridemark::ui
