#pragma once
// Stride sheet: one row per reference stride (frames, duration, duty factor and phase per
// limb, gait). Sortable; activating a row asks to jump to the stride's first frame.
#include <QAbstractTableModel>
#include <QTableView>
#include <memory>

#include "analysis/report.h"

class QSortFilterProxyModel;

namespace stridemark::ui {

class StrideTableModel : public QAbstractTableModel {
  Q_OBJECT
 public:
  using QAbstractTableModel::QAbstractTableModel;
  void setReport(std::shared_ptr<const analysis::Report> report);
  int rowCount(const QModelIndex& parent = {}) const override;
  int columnCount(const QModelIndex& parent = {}) const override;
  QVariant data(const QModelIndex& index, int role) const override;
  QVariant headerData(int section, Qt::Orientation orientation, int role) const override;
  static constexpr int kFrameRole = Qt::UserRole + 1;

 private:
  int limbCount() const;
  std::shared_ptr<const analysis::Report> report_;
};

class StrideSheet : public QTableView {
  Q_OBJECT
 public:
  explicit StrideSheet(QWidget* parent = nullptr);
  void setReport(std::shared_ptr<const analysis::Report> report);
  StrideTableModel* strideModel() { return model_; }

 signals:
  void seekRequested(qint64 frame);

 private:
  StrideTableModel* model_;
  QSortFilterProxyModel* proxy_;
};

}  // namespace stridemark::ui
