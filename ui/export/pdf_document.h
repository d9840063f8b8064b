#pragma once
// A small flowing layout on top of QPdfWriter for multi-page A4 reports: headings, paragraphs,
// tables and figures flow down the page and break onto new pages; every page gets the same
// footer (the clinical caution, the software version, the page number).
// Coordinates are logical CSS pixels (96 per inch) with pixel-size fonts: Qt 6.4's QPdfWriter
// draws point-size fonts ~4x too large under a scaled painter.
#include <QFont>
#include <QPainter>
#include <QPdfWriter>
#include <QString>
#include <QStringList>
#include <memory>
#include <vector>

#include "ui/export/figure_output.h"

namespace stridemark::ui::exports {

struct TableColumn {
  QString title;
  double weight = 1;  // share of the text width
  Qt::Alignment align = Qt::AlignLeft;
};

class PdfDocument {
 public:
  // Opens `path` for writing; throws stridemark::Error(export_) when it cannot.
  PdfDocument(const QString& path, const QString& title, const QString& footerLeft);
  ~PdfDocument();
  PdfDocument(const PdfDocument&) = delete;
  PdfDocument& operator=(const PdfDocument&) = delete;

  void title(const QString& text, const QString& subtitle);
  void heading(const QString& text);
  void paragraph(const QString& text, bool italic = false);
  // Label/value pairs in two columns.
  void keyValues(const std::vector<std::pair<QString, QString>>& rows);
  void table(const std::vector<TableColumn>& columns, const std::vector<QStringList>& rows);
  // A figure drawn at its own logical size (as in its standalone file), scaled to `scale` x
  // and centred, with a caption below.
  void figure(const FigurePaint& paint, FigureSize size, double scale, const QString& caption);
  void pageBreak();
  void finish();  // ends the last page; throws if the writer failed

  double textWidth() const { return body_.width(); }
  int pageCount() const { return pages_; }

 private:
  void ensureSpace(double height);
  void startPage();
  void drawFooter();
  QFont font(double pixelSize, bool bold = false, bool italic = false) const;
  double wrappedHeight(const QString& text, const QFont& f, double width) const;

  QString path_;
  QString footerLeft_;
  std::unique_ptr<QPdfWriter> writer_;
  QPainter painter_;
  QRectF page_;  // whole page, logical px
  QRectF body_;  // text area above the footer
  double y_ = 0;
  int pages_ = 0;
  bool finished_ = false;
};

}  // namespace stridemark::ui::exports
