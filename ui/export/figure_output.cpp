#include "ui/export/figure_output.h"

#include <QFile>
#include <QImage>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QSvgGenerator>
#include <cmath>

#include "common/error.h"

namespace stridemark::ui::exports {

namespace {

constexpr double kMmPerInch = 25.4;

Error cannotWrite(const QString& path, const char* what) {
  return Error(ErrorCategory::export_, "cannot write figure '" + path.toStdString() + "' (" + what +
                                           "). Check that the folder is writable.");
}

void paintOnWhite(QPainter& painter, const FigurePaint& paint, const QRectF& area) {
  painter.setRenderHint(QPainter::Antialiasing);
  painter.setRenderHint(QPainter::TextAntialiasing);
  painter.fillRect(area, Qt::white);
  paint(painter, area);
}

void writeSvg(const FigurePaint& paint, const QRectF& area, const QString& path,
              const QString& title) {
  QSvgGenerator svg;
  svg.setFileName(path);
  svg.setTitle(title);
  svg.setDescription(QStringLiteral("Made by Stridemark"));
  svg.setResolution(static_cast<int>(kLogicalDpi));
  svg.setSize(area.size().toSize());
  svg.setViewBox(area);
  QPainter painter;
  if (!painter.begin(&svg)) throw cannotWrite(path, "SVG generator did not start");
  paintOnWhite(painter, paint, area);
  painter.end();
  if (!QFile::exists(path)) throw cannotWrite(path, "SVG file missing after painting");
}

void writePng(const FigurePaint& paint, const QRectF& area, const QString& path) {
  const double scale = kPngDpi / kLogicalDpi;
  QImage image(static_cast<int>(std::lround(area.width() * scale)),
               static_cast<int>(std::lround(area.height() * scale)), QImage::Format_ARGB32);
  const int dotsPerMeter = static_cast<int>(std::lround(kPngDpi / kMmPerInch * 1000.0));
  image.setDotsPerMeterX(dotsPerMeter);
  image.setDotsPerMeterY(dotsPerMeter);
  image.fill(Qt::white);
  {
    QPainter painter(&image);
    painter.scale(scale, scale);
    paintOnWhite(painter, paint, area);
  }
  if (!image.save(path, "PNG")) throw cannotWrite(path, "PNG encoder failed");
}

void writePdf(const FigurePaint& paint, FigureSize size, const QRectF& area, const QString& path,
              const QString& title) {
  QPdfWriter pdf(path);
  pdf.setTitle(title);
  pdf.setCreator(QStringLiteral("Stridemark"));
  pdf.setResolution(1200);
  pdf.setPageSize(QPageSize(QSizeF(size.widthMm, size.heightMm), QPageSize::Millimeter, QString(),
                            QPageSize::ExactMatch));
  pdf.setPageMargins(QMarginsF(0, 0, 0, 0));
  QPainter painter;
  if (!painter.begin(&pdf)) throw cannotWrite(path, "PDF writer did not start");
  const double scale = pdf.resolution() / kLogicalDpi;
  painter.scale(scale, scale);
  paintOnWhite(painter, paint, area);
  painter.end();
  if (!QFile::exists(path)) throw cannotWrite(path, "PDF file missing after painting");
}

}  // namespace

std::string_view extensionOf(FigureFormat format) {
  switch (format) {
    case FigureFormat::svg:
      return "svg";
    case FigureFormat::png:
      return "png";
    case FigureFormat::pdf:
      return "pdf";
  }
  return "bin";
}

FigureFormat parseFigureFormat(std::string_view text) {
  if (text == "svg") return FigureFormat::svg;
  if (text == "png") return FigureFormat::png;
  if (text == "pdf") return FigureFormat::pdf;
  throw Error(ErrorCategory::format, "unknown figure format '" + std::string(text) +
                                         "'. Use a comma-separated list of svg, png, pdf.");
}

QRectF logicalArea(FigureSize size) {
  return QRectF(0, 0, size.widthMm / kMmPerInch * kLogicalDpi,
                size.heightMm / kMmPerInch * kLogicalDpi);
}

void writeFigure(const FigurePaint& paint, FigureSize size, FigureFormat format,
                 const QString& path, const QString& title) {
  const QRectF area = logicalArea(size);
  switch (format) {
    case FigureFormat::svg:
      writeSvg(paint, area, path, title);
      break;
    case FigureFormat::png:
      writePng(paint, area, path);
      break;
    case FigureFormat::pdf:
      writePdf(paint, size, area, path, title);
      break;
  }
}

}  // namespace stridemark::ui::exports
