#include "ui/widgets/hidden_span_dialog.h"

#include <QCheckBox>
#include <QDialogButtonBox>
#include <QFormLayout>
#include <QLabel>
#include <QListWidget>
#include <QPushButton>
#include <QSpinBox>
#include <QVBoxLayout>
#include <algorithm>
#include <limits>

namespace stridemark::ui {

namespace {

QString limbText(const model::Limb& limb) {
  const QString side = limb.side == model::Side::left ? QObject::tr("left") : QObject::tr("right");
  return QStringLiteral("%1 (%2)").arg(QString::fromStdString(limb.label), side);
}

int clampToInt(std::int64_t v) {
  return static_cast<int>(std::clamp<std::int64_t>(v, 0, std::numeric_limits<int>::max()));
}

}  // namespace

HiddenSpanDialog::HiddenSpanDialog(const model::LimbSet& limbs, std::int64_t first,
                                   std::int64_t last, std::int64_t frameCount, int preselected,
                                   QWidget* parent)
    : QDialog(parent) {
  setWindowTitle(tr("Mark hidden span"));
  auto* layout = new QVBoxLayout(this);
  layout->addWidget(new QLabel(
      tr("Limbs that cannot be seen in these frames (analysis treats them as unknown there):")));

  all_ = new QCheckBox(tr("&All limbs"));
  all_->setAccessibleName(tr("All limbs"));
  layout->addWidget(all_);
  list_ = new QListWidget;
  list_->setAccessibleName(tr("Hidden limbs"));
  for (int i = 0; i < limbs.size(); ++i) {
    auto* item = new QListWidgetItem(limbText(limbs.limb(i)), list_);
    item->setFlags(Qt::ItemIsEnabled | Qt::ItemIsSelectable | Qt::ItemIsUserCheckable);
    item->setCheckState(i == preselected ? Qt::Checked : Qt::Unchecked);
  }
  list_->setCurrentRow(std::clamp(preselected, 0, std::max(0, limbs.size() - 1)));
  layout->addWidget(list_);

  auto* form = new QFormLayout;
  const int maxFrame = clampToInt(std::max<std::int64_t>(0, frameCount - 1));
  first_ = new QSpinBox;
  last_ = new QSpinBox;
  for (auto* box : {first_, last_}) box->setRange(0, std::max(maxFrame, clampToInt(last)));
  first_->setAccessibleName(tr("First hidden frame"));
  last_->setAccessibleName(tr("Last hidden frame"));
  form->addRow(tr("&First frame:"), first_);
  form->addRow(tr("&Last frame:"), last_);
  layout->addLayout(form);
  setRange(first, last);

  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Ok | QDialogButtonBox::Cancel);
  ok_ = buttons->button(QDialogButtonBox::Ok);
  layout->addWidget(buttons);
  connect(buttons, &QDialogButtonBox::accepted, this, &QDialog::accept);
  connect(buttons, &QDialogButtonBox::rejected, this, &QDialog::reject);
  connect(all_, &QCheckBox::toggled, this, &HiddenSpanDialog::setAllLimbs);
  connect(list_, &QListWidget::itemChanged, this, [this] {
    syncAllBox();
    updateOk();
  });
  syncAllBox();
  updateOk();
}

std::vector<model::HiddenSpan> HiddenSpanDialog::spans() const {
  std::vector<model::HiddenSpan> out;
  const auto a = static_cast<std::int64_t>(first_->value());
  const auto b = static_cast<std::int64_t>(last_->value());
  for (int i = 0; i < list_->count(); ++i)
    if (list_->item(i)->checkState() == Qt::Checked)
      out.push_back({i, std::min(a, b), std::max(a, b)});
  return out;
}

void HiddenSpanDialog::setChosenLimbs(const std::vector<int>& limbs) {
  for (int i = 0; i < list_->count(); ++i)
    list_->item(i)->setCheckState(
        std::find(limbs.begin(), limbs.end(), i) != limbs.end() ? Qt::Checked : Qt::Unchecked);
}

void HiddenSpanDialog::setAllLimbs(bool all) {
  // Ticking "All limbs" ticks every limb; unticking it clears the list.
  const QSignalBlocker block(list_);
  for (int i = 0; i < list_->count(); ++i)
    list_->item(i)->setCheckState(all ? Qt::Checked : Qt::Unchecked);
  list_->viewport()->update();
  syncAllBox();
  updateOk();
}

void HiddenSpanDialog::setRange(std::int64_t first, std::int64_t last) {
  first_->setValue(clampToInt(std::min(first, last)));
  last_->setValue(clampToInt(std::max(first, last)));
}

void HiddenSpanDialog::syncAllBox() {
  bool every = list_->count() > 0;
  for (int i = 0; i < list_->count(); ++i)
    every = every && list_->item(i)->checkState() == Qt::Checked;
  const QSignalBlocker block(all_);
  all_->setChecked(every);
}

void HiddenSpanDialog::updateOk() {
  ok_->setEnabled(!spans().empty());
}

}  // namespace stridemark::ui
