#include "ui/export/pdf_document.h"

#include <QFile>
#include <QFontMetricsF>
#include <QPageSize>
#include <algorithm>
#include <numeric>

#include "common/caution.h"
#include "common/error.h"

namespace stridemark::ui::exports {

namespace {
constexpr double kMargin = 60;        // ~16 mm
constexpr double kFooterHeight = 46;  // two lines of small text + rule
constexpr double kBodyPx = 10.5;      // ~7.9 pt
constexpr double kSmallPx = 8.5;
constexpr double kHeadingPx = 14;
constexpr double kTitlePx = 20;
constexpr double kCellPad = 3;
}  // namespace

PdfDocument::PdfDocument(const QString& path, const QString& title, const QString& footerLeft)
    : path_(path), footerLeft_(footerLeft), writer_(std::make_unique<QPdfWriter>(path)) {
  writer_->setTitle(title);
  writer_->setCreator(QStringLiteral("Stridemark"));
  writer_->setResolution(600);
  writer_->setPageSize(QPageSize(QPageSize::A4));
  writer_->setPageMargins(QMarginsF(0, 0, 0, 0));
  if (!painter_.begin(writer_.get())) {
    throw Error(ErrorCategory::export_, "cannot write PDF '" + path.toStdString() +
                                            "'. Check that the folder is writable.");
  }
  const QSizeF mm = QPageSize(QPageSize::A4).size(QPageSize::Millimeter);
  page_ = QRectF(0, 0, mm.width() / 25.4 * kLogicalDpi, mm.height() / 25.4 * kLogicalDpi);
  body_ = page_.adjusted(kMargin, kMargin, -kMargin, -(kMargin * 0.6 + kFooterHeight));
  startPage();
}

PdfDocument::~PdfDocument() {
  if (painter_.isActive()) painter_.end();
}

QFont PdfDocument::font(double pixelSize, bool bold, bool italic) const {
  QFont f(QStringLiteral("DejaVu Sans"));
  f.setPixelSize(std::max(1, static_cast<int>(pixelSize)));
  // setPixelSize takes ints; fractional sizes come from the painter scale instead.
  f.setBold(bold);
  f.setItalic(italic);
  return f;
}

void PdfDocument::startPage() {
  ++pages_;
  painter_.resetTransform();
  const double scale = writer_->resolution() / kLogicalDpi;
  painter_.scale(scale, scale);
  painter_.setRenderHint(QPainter::Antialiasing);
  painter_.setRenderHint(QPainter::TextAntialiasing);
  y_ = body_.top();
  drawFooter();
}

void PdfDocument::drawFooter() {
  const double top = body_.bottom() + kMargin * 0.3;
  painter_.save();
  painter_.setPen(QPen(QColor(120, 120, 120), 0.6));
  painter_.drawLine(QPointF(body_.left(), top), QPointF(body_.right(), top));
  painter_.setPen(QColor(40, 40, 40));
  const QFont small = font(kSmallPx, false, true);
  painter_.setFont(small);
  const QRectF caution(body_.left(), top + 3, body_.width(), kFooterHeight * 0.55);
  painter_.drawText(caution, Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap,
                    QString::fromUtf8(kCaution.data(), static_cast<qsizetype>(kCaution.size())));
  painter_.setFont(font(kSmallPx));
  const QRectF line(body_.left(), top + 3 + kFooterHeight * 0.55, body_.width(), kSmallPx * 1.6);
  painter_.drawText(line, Qt::AlignLeft | Qt::AlignVCenter, footerLeft_);
  painter_.drawText(line, Qt::AlignRight | Qt::AlignVCenter, QStringLiteral("page %1").arg(pages_));
  painter_.restore();
}

void PdfDocument::pageBreak() {
  writer_->newPage();
  startPage();
}

void PdfDocument::ensureSpace(double height) {
  if (y_ + height > body_.bottom() && y_ > body_.top()) pageBreak();
}

double PdfDocument::wrappedHeight(const QString& text, const QFont& f, double width) const {
  const QFontMetricsF fm(f);
  return fm.boundingRect(QRectF(0, 0, width, 1e6), Qt::TextWordWrap, text).height();
}

void PdfDocument::title(const QString& text, const QString& subtitle) {
  const QFont big = font(kTitlePx, true);
  ensureSpace(kTitlePx * 3);
  painter_.setFont(big);
  painter_.setPen(Qt::black);
  painter_.drawText(QRectF(body_.left(), y_, body_.width(), kTitlePx * 1.5),
                    Qt::AlignLeft | Qt::AlignVCenter, text);
  y_ += kTitlePx * 1.6;
  if (!subtitle.isEmpty()) paragraph(subtitle, true);
  y_ += 4;
}

void PdfDocument::heading(const QString& text) {
  ensureSpace(kHeadingPx * 1.8 + kBodyPx * 4);  // keep a heading with its first lines
  y_ += kHeadingPx * 0.5;
  painter_.setFont(font(kHeadingPx, true));
  painter_.setPen(QColor(20, 40, 80));
  painter_.drawText(QRectF(body_.left(), y_, body_.width(), kHeadingPx * 1.4),
                    Qt::AlignLeft | Qt::AlignVCenter, text);
  y_ += kHeadingPx * 1.5;
  painter_.setPen(QPen(QColor(20, 40, 80), 0.8));
  painter_.drawLine(QPointF(body_.left(), y_), QPointF(body_.right(), y_));
  y_ += 5;
}

void PdfDocument::paragraph(const QString& text, bool italic) {
  const QFont f = font(kBodyPx, false, italic);
  const double h = wrappedHeight(text, f, body_.width());
  ensureSpace(h);
  painter_.setFont(f);
  painter_.setPen(Qt::black);
  painter_.drawText(QRectF(body_.left(), y_, body_.width(), h + 2),
                    Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, text);
  y_ += h + kBodyPx * 0.5;
}

void PdfDocument::keyValues(const std::vector<std::pair<QString, QString>>& rows) {
  const QFont key = font(kBodyPx, true);
  const QFont value = font(kBodyPx);
  const double keyWidth = body_.width() * 0.28;
  const double valueWidth = body_.width() - keyWidth;
  for (const auto& [k, v] : rows) {
    const double h = std::max(wrappedHeight(v, value, valueWidth), kBodyPx * 1.3) + 2;
    ensureSpace(h);
    painter_.setPen(Qt::black);
    painter_.setFont(key);
    painter_.drawText(QRectF(body_.left(), y_, keyWidth, h), Qt::AlignLeft | Qt::AlignTop, k);
    painter_.setFont(value);
    painter_.drawText(QRectF(body_.left() + keyWidth, y_, valueWidth, h),
                      Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, v);
    y_ += h;
  }
  y_ += kBodyPx * 0.5;
}

void PdfDocument::table(const std::vector<TableColumn>& columns,
                        const std::vector<QStringList>& rows) {
  const double totalWeight =
      std::accumulate(columns.begin(), columns.end(), 0.0,
                      [](double sum, const TableColumn& c) { return sum + c.weight; });
  std::vector<double> widths;
  for (const TableColumn& c : columns) widths.push_back(body_.width() * c.weight / totalWeight);
  const QFont head = font(kBodyPx, true);
  const QFont cell = font(kBodyPx);

  auto rowHeight = [&](const QStringList& texts, const QFont& f) {
    double h = kBodyPx * 1.3;
    for (int i = 0; i < texts.size() && i < static_cast<int>(widths.size()); ++i) {
      h = std::max(h,
                   wrappedHeight(texts[i], f, widths[static_cast<std::size_t>(i)] - 2 * kCellPad));
    }
    return h + 2 * kCellPad;
  };
  auto drawRow = [&](const QStringList& texts, const QFont& f, double h, bool shaded) {
    if (shaded)
      painter_.fillRect(QRectF(body_.left(), y_, body_.width(), h), QColor(238, 241, 246));
    painter_.setFont(f);
    painter_.setPen(Qt::black);
    double x = body_.left();
    for (std::size_t i = 0; i < widths.size(); ++i) {
      const QString text =
          static_cast<int>(i) < texts.size() ? texts[static_cast<int>(i)] : QString();
      painter_.drawText(
          QRectF(x + kCellPad, y_ + kCellPad, widths[i] - 2 * kCellPad, h - 2 * kCellPad),
          static_cast<int>(columns[i].align | Qt::AlignTop) | Qt::TextWordWrap, text);
      x += widths[i];
    }
    y_ += h;
  };
  QStringList titles;
  for (const TableColumn& c : columns) titles << c.title;
  const double headHeight = rowHeight(titles, head);
  auto drawHeader = [&] {
    drawRow(titles, head, headHeight, false);
    painter_.setPen(QPen(Qt::black, 0.8));
    painter_.drawLine(QPointF(body_.left(), y_), QPointF(body_.right(), y_));
  };
  ensureSpace(headHeight + (rows.empty() ? 0 : rowHeight(rows.front(), cell)));
  drawHeader();
  for (std::size_t r = 0; r < rows.size(); ++r) {
    const double h = rowHeight(rows[r], cell);
    if (y_ + h > body_.bottom()) {
      pageBreak();
      drawHeader();  // repeat the header on the continuation page
    }
    drawRow(rows[r], cell, h, r % 2 == 1);
  }
  painter_.setPen(QPen(Qt::black, 0.8));
  painter_.drawLine(QPointF(body_.left(), y_), QPointF(body_.right(), y_));
  y_ += kBodyPx;
}

void PdfDocument::figure(const FigurePaint& paint, FigureSize size, double scale,
                         const QString& caption) {
  const QFont f = font(kBodyPx, false, true);
  const double captionHeight = wrappedHeight(caption, f, body_.width());
  const QRectF natural = logicalArea(size);
  scale = std::min(scale, body_.width() / natural.width());
  const double height = natural.height() * scale;
  ensureSpace(height + captionHeight + 6);
  painter_.save();
  painter_.translate(body_.left() + (body_.width() - natural.width() * scale) / 2, y_);
  painter_.scale(scale, scale);
  painter_.setClipRect(natural);
  paint(painter_, natural);
  painter_.restore();
  y_ += height + 4;
  painter_.setFont(f);
  painter_.setPen(QColor(40, 40, 40));
  painter_.drawText(QRectF(body_.left(), y_, body_.width(), captionHeight + 2),
                    Qt::AlignLeft | Qt::AlignTop | Qt::TextWordWrap, caption);
  y_ += captionHeight + kBodyPx;
}

void PdfDocument::finish() {
  if (finished_) return;
  finished_ = true;
  if (!painter_.end() || !QFile::exists(path_)) {
    throw Error(ErrorCategory::export_,
                "PDF '" + path_.toStdString() + "' could not be completed. Check free disk space.");
  }
}

}  // namespace stridemark::ui::exports
