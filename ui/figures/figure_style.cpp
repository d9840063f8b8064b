#include "ui/figures/figure_style.h"

#include <algorithm>
#include <array>

namespace stridemark::ui::figures {

FigureStyle FigureStyle::fromPalette(const QPalette& palette) {
  FigureStyle s;
  s.background = palette.color(QPalette::Base);
  s.foreground = palette.color(QPalette::Text);
  const bool dark = s.background.lightness() < 128;
  s.grid = dark ? QColor(0x4a, 0x4a, 0x4a) : QColor(0xd6, 0xd6, 0xd6);
  s.muted = dark ? QColor(0xa0, 0xa0, 0xa0) : QColor(0x66, 0x66, 0x66);
  s.highlight = palette.color(QPalette::Highlight);
  return s;
}

FigureStyle FigureStyle::print() {
  return FigureStyle{};
}

QFont FigureStyle::font(int deltaPx, bool bold) const {
  QFont f;
  f.setPixelSize(std::max(6, fontPx + deltaPx));
  f.setBold(bold);
  return f;
}

const std::array<QColor, 7>& okabeIto() {
  // Okabe & Ito (2008), ordered so that the first four limbs differ most.
  static const std::array<QColor, 7> colours{
      QColor(0xe6, 0x9f, 0x00),  // orange
      QColor(0x00, 0x72, 0xb2),  // blue
      QColor(0x00, 0x9e, 0x73),  // bluish green
      QColor(0xcc, 0x79, 0xa7),  // reddish purple
      QColor(0xd5, 0x5e, 0x00),  // vermillion
      QColor(0x56, 0xb4, 0xe9),  // sky blue
      QColor(0xb8, 0xa9, 0x00),  // yellow, darkened to read on white
  };
  return colours;
}

QColor limbColour(int limbIndex) {
  const auto& colours = okabeIto();
  return colours[static_cast<std::size_t>(std::max(limbIndex, 0)) % colours.size()];
}

Qt::BrushStyle limbPattern(const model::LimbSet& limbs, int limbIndex) {
  return limbs.limb(limbIndex).side == model::Side::right ? Qt::BDiagPattern : Qt::SolidPattern;
}

Qt::PenStyle limbDash(const model::LimbSet& limbs, int limbIndex) {
  return limbs.limb(limbIndex).side == model::Side::right ? Qt::DashLine : Qt::SolidLine;
}

}  // namespace stridemark::ui::figures
