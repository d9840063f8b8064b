#include "ui/widgets/footfall_lanes.h"

#include <QEvent>
#include <QFontMetricsF>
#include <QMouseEvent>
#include <QPainter>
#include <QStringList>
#include <QWheelEvent>
#include <algorithm>
#include <cmath>

#include "ui/document/project_document.h"
#include "ui/keys/action_table.h"

namespace stridemark::ui {

namespace {
constexpr double kMinStripHeight = 22;
constexpr double kMinLabelWidth = 44;
constexpr double kHitPixels = 5;
constexpr double kAxisAllowance = 30;  // the time axis under the lanes (figures::laneRect)
}  // namespace

FootfallLanes::FootfallLanes(ProjectDocument* doc, QWidget* parent) : QWidget(parent), doc_(doc) {
  setAccessibleName(tr("Footfall lanes"));
  // The gestures as the cheat sheet lists them (ui/keys/action_table.cpp).
  QStringList gestures;
  for (const auto& g : gestureTable())
    if (g.place == Place::lanes)
      gestures << gestureText(g) + QStringLiteral(": ") + gestureEffect(g);
  setAccessibleDescription(tr("One lane per limb: stance bars and event ticks. %1.")
                               .arg(gestures.join(QStringLiteral("; "))));
  setFocusPolicy(Qt::StrongFocus);
  updateMetrics();
  setMouseTracking(false);
  connect(doc_, &ProjectDocument::annotationChanged, this, [this] {
    // Drop selected events that no longer exist (undo, delete).
    std::erase_if(selection_, [this](const model::Event& e) { return !doc_->contains(e); });
    const auto& hidden = doc_->annotation().hidden;
    if (selectedHidden_ &&
        std::find(hidden.begin(), hidden.end(), *selectedHidden_) == hidden.end())
      selectedHidden_.reset();
    update();
  });
  connect(doc_, &ProjectDocument::projectReset, this, [this] {
    updateMetrics();  // another limb set: other labels and lane count
    selection_.clear();
    selectedHidden_.reset();
    first_ = 0;
    update();
  });
}

void FootfallLanes::setPlayhead(std::int64_t frame) {
  const std::int64_t before = playhead_;
  const std::int64_t firstBefore = first_;
  playhead_ = frame;
  keepPlayheadVisible();
  if (first_ != firstBefore) {
    update();  // the view scrolled: everything moved
    return;
  }
  // Only the playhead line moved: repaint the two columns it crosses (a step is a key press;
  // repainting every lane each time would cost more than showing the frame).
  const auto ax = axis();
  for (const std::int64_t f : {before, frame}) {
    const auto x = static_cast<int>(std::lround(ax.x(static_cast<double>(f) + 0.5)));
    update(QRect(x - 4, 0, 9, height()));
  }
}

void FootfallLanes::setFrameCount(std::int64_t count) {
  frameCount_ = count;
  // A short clip fits whole: never show frames past its end.
  if (count > 0) span_ = std::clamp<std::int64_t>(count, 20, 480);
  clampView();
  update();
}

void FootfallLanes::setVisibleSpan(std::int64_t frames) {
  span_ = std::clamp<std::int64_t>(frames, 20, 1'000'000);
  clampView();
  keepPlayheadVisible();
  update();
}

void FootfallLanes::setSelection(std::vector<model::Event> events) {
  selection_ = std::move(events);
  std::sort(selection_.begin(), selection_.end());
  if (!selection_.empty()) selectedHidden_.reset();
  emit selectionChanged();
  update();
}

void FootfallLanes::setSelectedHiddenSpan(std::optional<model::HiddenSpan> span) {
  selectedHidden_ = span;
  if (span) selection_.clear();
  emit selectionChanged();
  update();
}

void FootfallLanes::setCurrentProposal(std::optional<model::Event> proposal) {
  if (proposal == currentProposal_) return;
  currentProposal_ = proposal;
  update();
}

void FootfallLanes::setSelectedLimb(int limb) {
  selectedLimb_ = limb;
  update();
}

bool FootfallLanes::nudgeSelection(std::int64_t delta) {
  if (selection_.empty()) return false;
  const auto moved = selection_;
  if (!doc_->moveEvents(moved, delta, true)) return false;
  auto next = moved;
  for (auto& e : next) e.frame += delta;
  setSelection(std::move(next));
  return true;
}

void FootfallLanes::deleteSelection() {
  if (!selection_.empty()) {
    doc_->removeEvents(selection_);
    setSelection({});
  } else if (selectedHidden_) {
    const auto span = *selectedHidden_;
    setSelectedHiddenSpan(std::nullopt);
    doc_->removeHiddenSpan(span);  // one undo step: "Unhide …"
  }
}

void FootfallLanes::updateMetrics() {
  // Sizes follow the label font (user font size, high-DPI), not pixel constants.
  const auto style = figures::FigureStyle::fromPalette(palette());
  const QFontMetricsF labels(style.font(0, true));
  const QFontMetricsF strip(style.font(-1, true));
  const auto& limbs = doc_->annotation().limbs;
  double widest = 0;
  for (int i = 0; i < limbs.size(); ++i)
    widest = std::max(widest, labels.horizontalAdvance(QString::fromStdString(limbs.label(i))));
  labelWidth_ = std::max(kMinLabelWidth, std::ceil(widest + 14));
  stripHeight_ = std::max(kMinStripHeight, std::ceil(strip.height() + 8));
  const double laneHeight = std::ceil(labels.height() * 1.4);  // room above and below the label
  setMinimumHeight(
      static_cast<int>(laneHeight * std::max(1, limbs.size()) + kAxisAllowance + stripHeight_));
  updateGeometry();
}

void FootfallLanes::changeEvent(QEvent* event) {
  if (event->type() == QEvent::FontChange || event->type() == QEvent::PaletteChange)
    updateMetrics();
  QWidget::changeEvent(event);
}

QSize FootfallLanes::sizeHint() const {
  return {800, std::max(170, minimumHeight() + 20)};
}

QRectF FootfallLanes::lanesArea() const {
  return QRectF(0, 0, width(), height() - stripHeight_);
}

QRectF FootfallLanes::stripArea() const {
  return QRectF(0, height() - stripHeight_, width(), stripHeight_);
}

figures::FootfallOptions FootfallLanes::options() const {
  figures::FootfallOptions o;
  o.viewFirst = first_;
  o.viewLast = first_ + span_ - 1;
  o.labelWidth = labelWidth_;
  o.playhead = playhead_;
  o.selected = selection_;
  o.proposals = &doc_->project().proposals;
  o.currentProposal = currentProposal_;
  return o;
}

figures::FrameAxis FootfallLanes::axis() const {
  return figures::frameAxis(lanesArea(), options());
}

void FootfallLanes::paintEvent(QPaintEvent*) {
  QPainter p(this);
  const auto style = figures::FigureStyle::fromPalette(palette());
  const auto& a = doc_->annotation();
  figures::paintFootfallDiagram(p, lanesArea(), a, options(), style);
  // The selected limb's label is underlined so the keyboard target is visible: just under the
  // (vertically centred) text, from font metrics, so it never crosses the glyphs.
  const QRectF lane = figures::laneRect(lanesArea(), a.limbs.size(), selectedLimb_, true);
  const QFontMetricsF fm(style.font(0, true));
  const double underline = std::min(lane.center().y() + fm.height() / 2 + 1, lane.bottom() - 1);
  QPen mark(style.highlight, 2);
  mark.setCapStyle(Qt::FlatCap);
  p.setPen(mark);
  p.drawLine(QPointF(lane.left() + 4, underline),
             QPointF(lane.left() + labelWidth_ - 6, underline));
  if (drag_ == Drag::events && dragDelta_ != 0) {
    const auto ax = axis();
    p.setPen(QPen(style.highlight, 2, Qt::DashLine));
    for (const auto& e : selection_) {
      const QRectF l = figures::laneRect(lanesArea(), a.limbs.size(), e.limb, true);
      const double x = ax.x(static_cast<double>(e.frame + dragDelta_));
      p.drawLine(QPointF(x, l.top()), QPointF(x, l.bottom()));
    }
  }
  paintHiddenSelection(p, style);
  figures::paintSupportStrip(p, stripArea(), a, axis(), style, labelWidth_);
  if (hasFocus()) {
    p.setPen(QPen(style.highlight, 1, Qt::DotLine));
    p.setBrush(Qt::NoBrush);
    p.drawRect(rect().adjusted(0, 0, -1, -1));
  }
}

void FootfallLanes::paintHiddenSelection(QPainter& p, const figures::FigureStyle& style) const {
  if (!selectedHidden_) return;
  const auto& a = doc_->annotation();
  if (selectedHidden_->limb >= a.limbs.size()) return;
  const auto ax = axis();
  const QRectF lane = figures::laneRect(lanesArea(), a.limbs.size(), selectedHidden_->limb, true);
  const double left = std::max(ax.x(static_cast<double>(selectedHidden_->first)), labelWidth_);
  const double right = std::min(ax.x(static_cast<double>(selectedHidden_->last + 1)), lane.right());
  if (right <= left) return;
  QPen pen(style.highlight, 2, Qt::DashLine);
  pen.setCosmetic(true);
  p.setPen(pen);
  p.setBrush(Qt::NoBrush);
  p.drawRect(QRectF(left, lane.top() + 1, right - left, lane.height() - 2));
}

QPointF FootfallLanes::pointFor(int limb, std::int64_t frame) const {
  const QRectF lane = figures::laneRect(lanesArea(), doc_->annotation().limbs.size(), limb, true);
  return {axis().x(static_cast<double>(frame) + 0.5), lane.center().y()};
}

std::int64_t FootfallLanes::frameAt(QPointF pos) const {
  const auto f = static_cast<std::int64_t>(std::floor(axis().frameAt(pos.x())));
  const auto last = frameCount_ > 0 ? frameCount_ - 1 : f;
  return std::clamp<std::int64_t>(f, 0, std::max<std::int64_t>(0, last));
}

int FootfallLanes::laneAt(QPointF pos) const {
  const int n = doc_->annotation().limbs.size();
  for (int i = 0; i < n; ++i)
    if (figures::laneRect(lanesArea(), n, i, true).contains(pos)) return i;
  return -1;
}

std::optional<model::Event> FootfallLanes::eventAt(QPointF pos) const {
  const int limb = laneAt(pos);
  if (limb < 0) return std::nullopt;
  const auto ax = axis();
  std::optional<model::Event> best;
  double bestDist = kHitPixels;
  for (const auto& e : doc_->annotation().eventsOf(limb)) {
    const double d = std::abs(ax.x(static_cast<double>(e.frame)) - pos.x());
    if (d <= bestDist) {
      bestDist = d;
      best = e;
    }
  }
  return best;
}

std::optional<model::Event> FootfallLanes::proposalAt(QPointF pos) const {
  const int limb = laneAt(pos);
  if (limb < 0) return std::nullopt;
  const auto ax = axis();
  std::optional<model::Event> best;
  double bestDist = kHitPixels;
  for (const auto& p : doc_->project().proposals.events) {
    if (p.event.limb != limb) continue;
    const double d = std::abs(ax.x(static_cast<double>(p.event.frame)) - pos.x());
    if (d <= bestDist) {
      bestDist = d;
      best = p.event;
    }
  }
  return best;
}

std::optional<model::HiddenSpan> FootfallLanes::hiddenSpanAt(QPointF pos) const {
  const int limb = laneAt(pos);
  if (limb < 0) return std::nullopt;
  const auto frame = frameAt(pos);
  for (const auto& span : doc_->annotation().hidden)
    if (span.limb == limb && frame >= span.first && frame <= span.last) return span;
  return std::nullopt;
}

void FootfallLanes::mousePressEvent(QMouseEvent* event) {
  if (event->button() != Qt::LeftButton) return;
  const QPointF pos = event->position();
  if (pos.x() < labelWidth_) {
    const int limb = laneAt(pos);
    if (limb >= 0) {
      setSelectedLimb(limb);
      emit limbSelected(limb);
    }
    return;
  }
  const bool additive = event->modifiers() & Qt::ControlModifier;
  if (auto hit = eventAt(pos)) {
    auto sel = selection_;
    const auto it = std::find(sel.begin(), sel.end(), *hit);
    if (additive) {
      if (it != sel.end()) {
        sel.erase(it);
      } else {
        sel.push_back(*hit);
      }
    } else if (it == sel.end()) {
      sel = {*hit};
    }
    setSelection(std::move(sel));
    setSelectedLimb(hit->limb);
    emit limbSelected(hit->limb);
    drag_ = Drag::events;
    dragOrigin_ = frameAt(pos);
    dragDelta_ = 0;
    return;
  }
  if (auto proposal = proposalAt(pos); proposal && !additive) {
    setSelection({});
    setSelectedLimb(proposal->limb);
    emit limbSelected(proposal->limb);
    emit proposalClicked(*proposal);
    return;
  }
  if (!additive) setSelection({});
  // Inside a hidden span: select it (Delete removes it); the click still seeks.
  if (auto span = hiddenSpanAt(pos)) {
    setSelectedHiddenSpan(span);
  } else if (!additive && selectedHidden_) {
    setSelectedHiddenSpan(std::nullopt);
  }
  const int limb = laneAt(pos);
  if (limb >= 0) {
    setSelectedLimb(limb);
    emit limbSelected(limb);
  }
  drag_ = Drag::scrub;
  emit seekRequested(frameAt(pos));
}

void FootfallLanes::mouseMoveEvent(QMouseEvent* event) {
  if (drag_ == Drag::scrub) {
    emit seekRequested(frameAt(event->position()));
  } else if (drag_ == Drag::events) {
    dragDelta_ = frameAt(event->position()) - dragOrigin_;
    update();
  }
}

void FootfallLanes::mouseReleaseEvent(QMouseEvent*) {
  if (drag_ == Drag::events && dragDelta_ != 0) {
    const auto moved = selection_;
    if (doc_->moveEvents(moved, dragDelta_, false)) {
      auto next = moved;
      for (auto& e : next) e.frame += dragDelta_;
      setSelection(std::move(next));
    }
  }
  drag_ = Drag::none;
  dragDelta_ = 0;
  update();
}

void FootfallLanes::wheelEvent(QWheelEvent* event) {
  const double steps = event->angleDelta().y() / 120.0;
  if (event->modifiers() & Qt::ControlModifier) {
    // Zoom around the frame under the cursor.
    const double anchor = axis().frameAt(event->position().x());
    const double ratio = (anchor - static_cast<double>(first_)) / static_cast<double>(span_);
    span_ = std::clamp<std::int64_t>(
        static_cast<std::int64_t>(std::llround(static_cast<double>(span_) * std::pow(0.8, steps))),
        20, std::max<std::int64_t>(20, frameCount_ > 0 ? frameCount_ : 1'000'000));
    first_ = static_cast<std::int64_t>(std::llround(anchor - ratio * static_cast<double>(span_)));
  } else {
    first_ -= static_cast<std::int64_t>(std::llround(steps * static_cast<double>(span_) / 8.0));
  }
  clampView();
  update();
  event->accept();
}

void FootfallLanes::keepPlayheadVisible() {
  const auto margin = span_ / 10;
  if (playhead_ < first_ + margin || playhead_ > first_ + span_ - 1 - margin) {
    if (playhead_ < first_ || playhead_ > first_ + span_ - 1) {
      first_ = playhead_ - span_ / 2;  // a jump: centre it
    } else if (playhead_ < first_ + margin) {
      first_ = playhead_ - margin;
    } else {
      first_ = playhead_ - span_ + 1 + margin;
    }
    clampView();
  }
}

void FootfallLanes::clampView() {
  const auto maxFirst = frameCount_ > 0 ? std::max<std::int64_t>(0, frameCount_ - span_) : first_;
  first_ = std::clamp<std::int64_t>(first_, 0, std::max<std::int64_t>(0, maxFirst));
}

}  // namespace stridemark::ui
