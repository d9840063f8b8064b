#pragma once
// Writes one figure, drawn by a ui/figures painter, as SVG, PNG (300 dpi) or PDF.
// Painters draw in a logical coordinate system of CSS pixels (96 per inch) and use pixel-size
// fonts; each output scales that system to its own resolution, so text keeps its size in
// millimetres everywhere (Qt 6.4's QPdfWriter blows point-size fonts up ~4x).
#include <QRectF>
#include <QString>
#include <functional>
#include <string_view>

class QPainter;

namespace stridemark::ui::exports {

enum class FigureFormat { svg, png, pdf };

std::string_view extensionOf(FigureFormat format);      // "svg", "png", "pdf"
FigureFormat parseFigureFormat(std::string_view text);  // throws Error(format) on unknown

// Paints the whole figure into `area` (logical CSS pixels).
using FigurePaint = std::function<void(QPainter&, const QRectF& area)>;

struct FigureSize {
  double widthMm = 85;  // a journal column
  double heightMm = 60;
};

inline constexpr double kLogicalDpi = 96.0;
inline constexpr double kPngDpi = 300.0;

// Logical size of the figure area for a physical size.
QRectF logicalArea(FigureSize size);

// Throws stridemark::Error(export_) naming `path` when the file cannot be written.
void writeFigure(const FigurePaint& paint, FigureSize size, FigureFormat format,
                 const QString& path, const QString& title);

}  // namespace stridemark::ui::exports
