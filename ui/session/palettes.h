#pragma once
// Light and dark application palettes (Qt 6.4 has no colour-scheme API).
#include <QPalette>
#include <QString>

namespace stridemark::ui {

enum class Theme { light, dark };

QPalette themePalette(Theme theme);
void applyTheme(Theme theme);              // sets the palette on the application (Fusion style)
Theme themeFromName(const QString& name);  // "dark" -> dark, anything else light
QString themeName(Theme theme);

}  // namespace stridemark::ui
