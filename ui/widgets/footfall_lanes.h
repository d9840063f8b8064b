#pragma once
// Footfall lanes: one editable lane per limb (stance bars, event ticks), the playhead and the
// Support strip. Click or drag on a lane to seek, drag a tick to move it, Ctrl+click to select
// several, wheel to scroll, Ctrl+wheel to zoom. A click inside a hidden span selects it (Delete
// removes it). Proposals (issue 18) are drawn hollow under the tags; a click on one makes it the
// current proposal. Edits go through the document's commands.
#include <QWidget>

class QPainter;
#include <cstdint>
#include <optional>
#include <vector>

#include "model/annotation.h"
#include "ui/figures/footfall_diagram.h"

namespace stridemark::ui {

class ProjectDocument;

class FootfallLanes : public QWidget {
  Q_OBJECT
 public:
  explicit FootfallLanes(ProjectDocument* doc, QWidget* parent = nullptr);

  void setPlayhead(std::int64_t frame);
  void setFrameCount(std::int64_t count);
  void setVisibleSpan(std::int64_t frames);  // zoom: how many frames the lanes show
  std::int64_t visibleSpan() const { return span_; }
  std::int64_t viewFirst() const { return first_; }

  const std::vector<model::Event>& selection() const { return selection_; }
  void setSelection(std::vector<model::Event> events);
  int selectedLimb() const { return selectedLimb_; }
  void setSelectedLimb(int limb);

  // A hidden span chosen by clicking inside it (exclusive with the event selection).
  const std::optional<model::HiddenSpan>& selectedHiddenSpan() const { return selectedHidden_; }
  void setSelectedHiddenSpan(std::optional<model::HiddenSpan> span);

  // The proposal under review, drawn highlighted (proposals are drawn hollow, under the tags).
  void setCurrentProposal(std::optional<model::Event> proposal);
  const std::optional<model::Event>& currentProposal() const { return currentProposal_; }

  // Keyboard edits of the selection (bound to actions by the main window). Delete removes the
  // selected events, or else the selected hidden span.
  bool nudgeSelection(std::int64_t delta);
  void deleteSelection();

  // Where frame `frame` of a limb's lane is drawn (middle of the lane), in widget pixels.
  QPointF pointFor(int limb, std::int64_t frame) const;

  QSize sizeHint() const override;

 signals:
  void seekRequested(qint64 frame);
  void limbSelected(int limb);
  void selectionChanged();
  // A click on a proposal's tick (where no tag of a person is hit).
  void proposalClicked(const model::Event& proposal);

 protected:
  void paintEvent(QPaintEvent* event) override;
  void changeEvent(QEvent* event) override;
  void mousePressEvent(QMouseEvent* event) override;
  void mouseMoveEvent(QMouseEvent* event) override;
  void mouseReleaseEvent(QMouseEvent* event) override;
  void wheelEvent(QWheelEvent* event) override;

 private:
  void updateMetrics();
  QRectF lanesArea() const;
  QRectF stripArea() const;
  figures::FootfallOptions options() const;
  figures::FrameAxis axis() const;
  std::optional<model::Event> eventAt(QPointF pos) const;
  std::optional<model::HiddenSpan> hiddenSpanAt(QPointF pos) const;
  std::optional<model::Event> proposalAt(QPointF pos) const;
  void paintHiddenSelection(QPainter& p, const figures::FigureStyle& style) const;
  int laneAt(QPointF pos) const;
  std::int64_t frameAt(QPointF pos) const;
  void keepPlayheadVisible();
  void clampView();

  ProjectDocument* doc_;
  double labelWidth_ = 44;   // from the label font (updateMetrics)
  double stripHeight_ = 22;  // from the strip font
  std::int64_t first_ = 0;
  std::int64_t span_ = 480;
  std::int64_t frameCount_ = 0;
  std::int64_t playhead_ = 0;
  int selectedLimb_ = 0;
  std::vector<model::Event> selection_;
  std::optional<model::HiddenSpan> selectedHidden_;
  std::optional<model::Event> currentProposal_;
  enum class Drag { none, scrub, events } drag_ = Drag::none;
  std::int64_t dragOrigin_ = 0;
  std::int64_t dragDelta_ = 0;
};

}  // namespace stridemark::ui
