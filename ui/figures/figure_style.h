#pragma once
// Colours, fonts and limb cues shared by every figure painter. Painters draw in a logical
// pixel coordinate system with pixel-size fonts, so the same code is right on screen, PNG,
// SVG and PDF (Qt 6.4's QPdfWriter draws point-size fonts about 4x too large).
#include <array>

#include <QColor>
#include <QFont>
#include <QPalette>
#include <Qt>

#include "model/limb_set.h"

namespace stridemark::ui::figures {

struct FigureStyle {
  QColor background{Qt::white};
  QColor foreground{Qt::black};
  QColor grid{0xd0, 0xd0, 0xd0};
  QColor muted{0x70, 0x70, 0x70};
  QColor highlight{0x00, 0x72, 0xb2};
  int fontPx = 12;

  static FigureStyle fromPalette(const QPalette& palette);
  static FigureStyle print();  // light, for export
  QFont font(int deltaPx = 0, bool bold = false) const;
};

// The Okabe-Ito colour-blind-safe palette, in our own limb order; every figure colour that
// stands for a limb or a gait comes from it.
const std::array<QColor, 7>& okabeIto();
QColor limbColour(int limbIndex);
// Second cue beside colour: right-side limbs are hatched, left-side solid; the label is
// always drawn too.
Qt::BrushStyle limbPattern(const model::LimbSet& limbs, int limbIndex);
Qt::PenStyle limbDash(const model::LimbSet& limbs, int limbIndex);

}  // namespace stridemark::ui::figures
