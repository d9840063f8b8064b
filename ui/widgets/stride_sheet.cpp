#include "ui/widgets/stride_sheet.h"

#include <QFont>
#include <QFontMetrics>
#include <QGuiApplication>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLineEdit>
#include <QPalette>
#include <QPushButton>
#include <QSortFilterProxyModel>
#include <QVBoxLayout>
#include <algorithm>
#include <cmath>

namespace stridemark::ui {

namespace {

using Model = StrideTableModel;

QVariant percent(const std::optional<double>& v) {
  if (!v || !std::isfinite(*v)) return {};
  return std::round(*v * 1000.0) / 10.0;  // one decimal; numeric so sorting is numeric
}

// The widest text each fixed column shows (a frame number of a long clip, the longest gait and
// band names, a reason of a few words, elided beyond it with the whole reason in the tooltip).
const char* const kWidest[Model::kFixedColumns] = {"9999999",
                                                   "9999999",
                                                   "99.9999",
                                                   "999",
                                                   "transverse gallop",
                                                   "diagonal-sequence diagonal couplets",
                                                   "reason of a few words"};

}  // namespace

void StrideTableModel::setReport(std::shared_ptr<const analysis::Report> report,
                                 std::optional<std::vector<int>> rows) {
  beginResetModel();
  report_ = std::move(report);
  rows_ = std::move(rows);
  endResetModel();
}

int StrideTableModel::limbCount() const {
  return report_ ? report_->limbs.size() : 0;
}

const analysis::StrideRecord& StrideTableModel::strideAt(int row) const {
  const auto at = rows_ ? (*rows_)[static_cast<std::size_t>(row)] : row;
  return report_->strides[static_cast<std::size_t>(at)];
}

int StrideTableModel::rowCount(const QModelIndex& parent) const {
  if (parent.isValid() || !report_) return 0;
  return static_cast<int>(rows_ ? rows_->size() : report_->strides.size());
}

int StrideTableModel::columnCount(const QModelIndex& parent) const {
  return parent.isValid() ? 0 : kFixedColumns + 2 * limbCount();
}

QVariant StrideTableModel::headerData(int section, Qt::Orientation orientation, int role) const {
  if (role != Qt::DisplayRole) return {};
  // Row headers number strides in the whole trial, so a scope's rows keep their numbers.
  if (orientation == Qt::Vertical)
    return rows_ && section < static_cast<int>(rows_->size())
               ? (*rows_)[static_cast<std::size_t>(section)] + 1
               : section + 1;
  static const char* fixed[kFixedColumns] = {"start frame", "end frame", "stride s",        "bout",
                                             "gait",        "band",      "excluded because"};
  if (section < kFixedColumns) return tr(fixed[section]);
  const int limb = (section - kFixedColumns) / 2;
  const auto label = report_ ? QString::fromStdString(report_->limbs.label(limb)) : QString();
  return (section - kFixedColumns) % 2 == 0 ? tr("%1 duty %").arg(label)
                                            : tr("%1 phase %").arg(label);
}

QVariant StrideTableModel::data(const QModelIndex& index, int role) const {
  if (!report_ || !index.isValid()) return {};
  const auto& s = strideAt(index.row());
  const int column = index.column();
  switch (role) {
    case kFrameRole:
      return static_cast<qlonglong>(s.startFrame);
    case kExcludedRole:
      return s.excluded.has_value();
    case Qt::TextAlignmentRole:
      return column == kGaitColumn || column == 5 || column == kExcludedColumn
                 ? QVariant()
                 : QVariant(Qt::AlignRight | Qt::AlignVCenter);
    case Qt::ForegroundRole:
      if (!s.excluded) return {};
      return QGuiApplication::palette().color(QPalette::Disabled, QPalette::Text);
    case Qt::FontRole: {
      if (!s.excluded) return {};
      QFont italic;
      italic.setItalic(true);
      return italic;
    }
    case Qt::ToolTipRole:
      return s.excluded
                 ? tr("Excluded from the statistics: %1").arg(QString::fromStdString(*s.excluded))
                 : QVariant();
    case Qt::DisplayRole:
      break;
    default:
      return {};
  }
  switch (column) {
    case 0:
      return static_cast<qlonglong>(s.startFrame);
    case 1:
      return static_cast<qlonglong>(s.endFrame);
    case 2:
      return std::round(s.durationS * 10000.0) / 10000.0;
    case kBoutColumn:
      return s.bout >= 0 ? QVariant(s.bout + 1) : QVariant();
    case kGaitColumn:
      return QString::fromStdString(s.gait);
    case 5:
      return s.band ? QString::fromStdString(*s.band) : QString();
    case kExcludedColumn:
      return s.excluded ? QString::fromStdString(*s.excluded) : QString();
    default:
      break;
  }
  const auto limb = static_cast<std::size_t>((column - kFixedColumns) / 2);
  const auto& values = (column - kFixedColumns) % 2 == 0 ? s.dutyFactor : s.phase;
  return limb < values.size() ? percent(values[limb]) : QVariant();
}

StrideSheet::StrideSheet(QWidget* parent)
    : QTableView(parent),
      model_(new StrideTableModel(this)),
      proxy_(new QSortFilterProxyModel(this)) {
  setAccessibleName(tr("Stride sheet"));
  setAccessibleDescription(
      tr("One row per stride of the reference limb in the scope shown. Enter or click jumps "
         "to the stride; excluded strides are greyed, with the reason."));
  proxy_->setSourceModel(model_);
  proxy_->setSortRole(Qt::DisplayRole);
  setModel(proxy_);
  setSortingEnabled(true);
  sortByColumn(0, Qt::AscendingOrder);
  setSelectionBehavior(QAbstractItemView::SelectRows);
  setSelectionMode(QAbstractItemView::SingleSelection);
  setEditTriggers(QAbstractItemView::NoEditTriggers);
  setAlternatingRowColors(true);
  // Widths from the font once per column set, not measured from the rows: sizing to contents
  // reads every cell of a 2,500-stride trial after each edit (docs/performance.md).
  horizontalHeader()->setSectionResizeMode(QHeaderView::Interactive);
  verticalHeader()->setSectionResizeMode(QHeaderView::Fixed);
  verticalHeader()->setDefaultSectionSize(22);
  auto jump = [this](const QModelIndex& index) {
    if (index.isValid()) emit seekRequested(index.data(StrideTableModel::kFrameRole).toLongLong());
  };
  connect(this, &QTableView::clicked, this, jump);
  connect(this, &QTableView::activated, this, jump);
  connect(selectionModel(), &QItemSelectionModel::selectionChanged, this,
          &StrideSheet::selectedStrideChanged);
}

void StrideSheet::fixColumnWidths() {
  const int columns = model_->columnCount();
  if (columns == widthsForColumns_) return;
  widthsForColumns_ = columns;
  const QFontMetrics cell(font());
  const QFontMetrics head(horizontalHeader()->font());
  const int pad = 2 * cell.horizontalAdvance(QLatin1Char('M'));  // margins and the sort arrow
  for (int c = 0; c < columns; ++c) {
    const QString widest =
        c < Model::kFixedColumns ? QString::fromLatin1(kWidest[c]) : QStringLiteral("100.0");
    const int text = std::max(
        cell.horizontalAdvance(widest),
        head.horizontalAdvance(model_->headerData(c, Qt::Horizontal, Qt::DisplayRole).toString()));
    horizontalHeader()->resizeSection(c, text + pad);
  }
}

std::optional<qint64> StrideSheet::selectedStart() const {
  const QModelIndexList rows = selectionModel()->selectedRows();
  if (rows.isEmpty()) return std::nullopt;
  return rows.front().data(StrideTableModel::kFrameRole).toLongLong();
}

bool StrideSheet::selectedExcluded() const {
  const QModelIndexList rows = selectionModel()->selectedRows();
  return !rows.isEmpty() && rows.front().data(StrideTableModel::kExcludedRole).toBool();
}

bool StrideSheet::selectStride(qint64 frame) {
  const QModelIndexList hits =
      proxy_->match(proxy_->index(0, 0), StrideTableModel::kFrameRole, frame, 1, Qt::MatchExactly);
  if (hits.isEmpty()) return false;
  selectRow(hits.front().row());
  return true;
}

void StrideSheet::setReport(std::shared_ptr<const analysis::Report> report,
                            std::optional<std::vector<int>> rows) {
  // The selected stride stays selected across a re-score (exclude, then include again).
  const std::optional<qint64> selected = selectedStart();
  model_->setReport(std::move(report), std::move(rows));
  fixColumnWidths();
  if (selected) selectStride(*selected);
  emit selectedStrideChanged();
}

StrideSheetPanel::StrideSheetPanel(QWidget* parent)
    : QWidget(parent),
      sheet_(new StrideSheet),
      reason_(new QLineEdit),
      exclude_(new QPushButton(tr("Exclude stride"))),
      include_(new QPushButton(tr("Include stride"))) {
  reason_->setObjectName(QStringLiteral("strideExcludeReason"));
  reason_->setPlaceholderText(tr("Why the selected stride is left out (needed to exclude it)"));
  reason_->setAccessibleName(tr("Exclusion reason"));
  exclude_->setObjectName(QStringLiteral("strideExcludeButton"));
  exclude_->setToolTip(
      tr("Leave the selected stride out of every summary, with the reason typed beside it (one "
         "undo step; saved in the project and shown in the report)."));
  include_->setObjectName(QStringLiteral("strideIncludeButton"));
  include_->setToolTip(tr("Take the selected excluded stride back into the summaries."));
  auto* layout = new QVBoxLayout(this);
  layout->setContentsMargins(0, 0, 0, 0);
  layout->setSpacing(2);
  layout->addWidget(sheet_);
  auto* row = new QHBoxLayout;
  row->setContentsMargins(4, 0, 4, 2);
  row->addWidget(reason_, 1);
  row->addWidget(exclude_);
  row->addWidget(include_);
  layout->addLayout(row);
  connect(sheet_, &StrideSheet::selectedStrideChanged, this, &StrideSheetPanel::updateButtons);
  connect(reason_, &QLineEdit::textChanged, this, &StrideSheetPanel::updateButtons);
  auto excludeSelected = [this] {
    const auto start = sheet_->selectedStart();
    const QString reason = reason_->text().trimmed();
    if (!start || sheet_->selectedExcluded() || reason.isEmpty()) return;
    reason_->clear();
    emit excludeRequested(*start, reason);
  };
  connect(exclude_, &QPushButton::clicked, this, excludeSelected);
  connect(reason_, &QLineEdit::returnPressed, this, excludeSelected);
  connect(include_, &QPushButton::clicked, this, [this] {
    const auto start = sheet_->selectedStart();
    if (start && sheet_->selectedExcluded()) emit includeRequested(*start);
  });
  updateButtons();
}

void StrideSheetPanel::updateButtons() {
  const bool selected = sheet_->selectedStart().has_value();
  const bool excluded = sheet_->selectedExcluded();
  exclude_->setEnabled(selected && !excluded && !reason_->text().trimmed().isEmpty());
  include_->setEnabled(selected && excluded);
}

}  // namespace stridemark::ui
