#include "ui/session/palettes.h"

#include <QApplication>
#include <QStyleFactory>

namespace stridemark::ui {

QPalette themePalette(Theme theme) {
  if (theme == Theme::light) {
    QPalette p(QColor(0xef, 0xef, 0xef));
    p.setColor(QPalette::Base, Qt::white);
    p.setColor(QPalette::Highlight, QColor(0x00, 0x72, 0xb2));
    p.setColor(QPalette::HighlightedText, Qt::white);
    return p;
  }
  QPalette p;
  const QColor window(0x2b, 0x2d, 0x31), base(0x1e, 0x1f, 0x22), text(0xe6, 0xe6, 0xe6);
  p.setColor(QPalette::Window, window);
  p.setColor(QPalette::WindowText, text);
  p.setColor(QPalette::Base, base);
  p.setColor(QPalette::AlternateBase, QColor(0x26, 0x28, 0x2b));
  p.setColor(QPalette::ToolTipBase, base);
  p.setColor(QPalette::ToolTipText, text);
  p.setColor(QPalette::PlaceholderText, QColor(0x90, 0x90, 0x90));
  p.setColor(QPalette::Text, text);
  p.setColor(QPalette::Button, window);
  p.setColor(QPalette::ButtonText, text);
  p.setColor(QPalette::BrightText, QColor(0xff, 0x80, 0x60));
  p.setColor(QPalette::Light, QColor(0x45, 0x47, 0x4b));
  p.setColor(QPalette::Midlight, QColor(0x3a, 0x3c, 0x40));
  p.setColor(QPalette::Mid, QColor(0x30, 0x32, 0x36));
  p.setColor(QPalette::Dark, QColor(0x18, 0x19, 0x1b));
  p.setColor(QPalette::Shadow, Qt::black);
  p.setColor(QPalette::Highlight, QColor(0x56, 0xb4, 0xe9));
  p.setColor(QPalette::HighlightedText, Qt::black);
  p.setColor(QPalette::Link, QColor(0x56, 0xb4, 0xe9));
  p.setColor(QPalette::Disabled, QPalette::Text, QColor(0x80, 0x80, 0x80));
  p.setColor(QPalette::Disabled, QPalette::WindowText, QColor(0x80, 0x80, 0x80));
  p.setColor(QPalette::Disabled, QPalette::ButtonText, QColor(0x80, 0x80, 0x80));
  return p;
}

void applyTheme(Theme theme) {
  if (auto* style = QStyleFactory::create(QStringLiteral("Fusion"))) QApplication::setStyle(style);
  QApplication::setPalette(themePalette(theme));
}

Theme themeFromName(const QString& name) {
  return name == QLatin1String("dark") ? Theme::dark : Theme::light;
}

QString themeName(Theme theme) {
  return theme == Theme::dark ? QStringLiteral("dark") : QStringLiteral("light");
}

}  // namespace stridemark::ui
