#pragma once
// Stride sheet: one row per reference stride of the scope shown (frames, duration, bout, gait,
// band, why it was excluded, duty factor and phase per limb). Sortable; activating a row asks
// to jump to the stride's first frame. Excluded strides stay listed, greyed, with the reason.
// The panel under it excludes the selected stride with a reason, or includes it again; the
// window turns those requests into the document's undo commands.
#include <QAbstractTableModel>
#include <QTableView>
#include <memory>
#include <optional>
#include <vector>

#include "analysis/report.h"

class QLineEdit;
class QPushButton;
class QSortFilterProxyModel;

namespace stridemark::ui {

class StrideTableModel : public QAbstractTableModel {
  Q_OBJECT
 public:
  using QAbstractTableModel::QAbstractTableModel;
  // `rows`: indices into report->strides to list, in order; empty lists none, nullopt all.
  void setReport(std::shared_ptr<const analysis::Report> report,
                 std::optional<std::vector<int>> rows = std::nullopt);
  int rowCount(const QModelIndex& parent = {}) const override;
  int columnCount(const QModelIndex& parent = {}) const override;
  QVariant data(const QModelIndex& index, int role) const override;
  QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
  static constexpr int kFrameRole = Qt::UserRole + 1;     // the stride's start frame
  static constexpr int kExcludedRole = Qt::UserRole + 2;  // true when excluded by hand
  static constexpr int kFixedColumns = 7;  // before the per-limb duty and phase columns
  static constexpr int kBoutColumn = 3;
  static constexpr int kGaitColumn = 4;
  static constexpr int kExcludedColumn = 6;

 private:
  int limbCount() const;
  const analysis::StrideRecord& strideAt(int row) const;
  std::shared_ptr<const analysis::Report> report_;
  std::optional<std::vector<int>> rows_;
};

class StrideSheet : public QTableView {
  Q_OBJECT
 public:
  explicit StrideSheet(QWidget* parent = nullptr);
  void setReport(std::shared_ptr<const analysis::Report> report,
                 std::optional<std::vector<int>> rows = std::nullopt);
  StrideTableModel* strideModel() { return model_; }
  // The selected stride's start frame and whether it is excluded; nullopt without a selection.
  std::optional<qint64> selectedStart() const;
  bool selectedExcluded() const;
  // Selects the row of the stride starting at `frame`; false when it is not listed.
  bool selectStride(qint64 frame);

 signals:
  void seekRequested(qint64 frame);
  void selectedStrideChanged();

 private:
  void fixColumnWidths();
  StrideTableModel* model_;
  QSortFilterProxyModel* proxy_;
  int widthsForColumns_ = -1;  // column count the widths were set for
};

// The sheet with its exclude/include controls under it.
class StrideSheetPanel : public QWidget {
  Q_OBJECT
 public:
  explicit StrideSheetPanel(QWidget* parent = nullptr);
  StrideSheet* sheet() const { return sheet_; }
  QLineEdit* reasonEdit() const { return reason_; }
  QPushButton* excludeButton() const { return exclude_; }
  QPushButton* includeButton() const { return include_; }

 signals:
  void excludeRequested(qint64 startFrame, const QString& reason);
  void includeRequested(qint64 startFrame);

 private:
  void updateButtons();
  StrideSheet* sheet_;
  QLineEdit* reason_;
  QPushButton* exclude_;
  QPushButton* include_;
};

}  // namespace stridemark::ui
