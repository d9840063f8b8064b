#include "ui/widgets/stride_sheet.h"

#include <QHeaderView>
#include <QSortFilterProxyModel>
#include <cmath>

namespace stridemark::ui {

namespace {
// Fixed columns before the per-limb ones: start, end, duration, gait, band.
constexpr int kFixed = 5;

QVariant percent(const std::optional<double>& v) {
  if (!v || !std::isfinite(*v)) return {};
  return std::round(*v * 1000.0) / 10.0;  // one decimal; numeric so sorting is numeric
}
}  // namespace

void StrideTableModel::setReport(std::shared_ptr<const analysis::Report> report) {
  beginResetModel();
  report_ = std::move(report);
  endResetModel();
}

int StrideTableModel::limbCount() const {
  return report_ ? report_->limbs.size() : 0;
}

int StrideTableModel::rowCount(const QModelIndex& parent) const {
  return parent.isValid() || !report_ ? 0 : static_cast<int>(report_->strides.size());
}

int StrideTableModel::columnCount(const QModelIndex& parent) const {
  return parent.isValid() ? 0 : kFixed + 2 * limbCount();
}

QVariant StrideTableModel::headerData(int section, Qt::Orientation orientation, int role) const {
  if (role != Qt::DisplayRole) return {};
  if (orientation == Qt::Vertical) return section + 1;
  static const char* fixed[kFixed] = {"start frame", "end frame", "stride s", "gait", "band"};
  if (section < kFixed) return tr(fixed[section]);
  const int limb = (section - kFixed) / 2;
  const auto label = report_ ? QString::fromStdString(report_->limbs.label(limb)) : QString();
  return (section - kFixed) % 2 == 0 ? tr("%1 duty %").arg(label) : tr("%1 phase %").arg(label);
}

QVariant StrideTableModel::data(const QModelIndex& index, int role) const {
  if (!report_ || !index.isValid()) return {};
  const auto& s = report_->strides[static_cast<std::size_t>(index.row())];
  if (role == kFrameRole) return static_cast<qlonglong>(s.startFrame);
  if (role == Qt::TextAlignmentRole)
    return index.column() == 3 || index.column() == 4 ? QVariant()
                                                      : QVariant(Qt::AlignRight | Qt::AlignVCenter);
  if (role != Qt::DisplayRole) return {};
  switch (index.column()) {
    case 0:
      return static_cast<qlonglong>(s.startFrame);
    case 1:
      return static_cast<qlonglong>(s.endFrame);
    case 2:
      return std::round(s.durationS * 10000.0) / 10000.0;
    case 3:
      return QString::fromStdString(s.gait);
    case 4:
      return s.band ? QString::fromStdString(*s.band) : QString();
    default:
      break;
  }
  const auto limb = static_cast<std::size_t>((index.column() - kFixed) / 2);
  const auto& values = (index.column() - kFixed) % 2 == 0 ? s.dutyFactor : s.phase;
  return limb < values.size() ? percent(values[limb]) : QVariant();
}

StrideSheet::StrideSheet(QWidget* parent)
    : QTableView(parent),
      model_(new StrideTableModel(this)),
      proxy_(new QSortFilterProxyModel(this)) {
  setAccessibleName(tr("Stride sheet"));
  setAccessibleDescription(
      tr("One row per stride of the reference limb. Enter or click jumps "
         "to the stride."));
  proxy_->setSourceModel(model_);
  proxy_->setSortRole(Qt::DisplayRole);
  setModel(proxy_);
  setSortingEnabled(true);
  sortByColumn(0, Qt::AscendingOrder);
  setSelectionBehavior(QAbstractItemView::SelectRows);
  setSelectionMode(QAbstractItemView::SingleSelection);
  setEditTriggers(QAbstractItemView::NoEditTriggers);
  setAlternatingRowColors(true);
  horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
  verticalHeader()->setDefaultSectionSize(22);
  auto jump = [this](const QModelIndex& index) {
    if (index.isValid()) emit seekRequested(index.data(StrideTableModel::kFrameRole).toLongLong());
  };
  connect(this, &QTableView::clicked, this, jump);
  connect(this, &QTableView::activated, this, jump);
}

void StrideSheet::setReport(std::shared_ptr<const analysis::Report> report) {
  model_->setReport(std::move(report));
}

}  // namespace stridemark::ui
