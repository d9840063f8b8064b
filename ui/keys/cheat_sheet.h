#pragma once
// Help > Keyboard cheat sheet, made from the action table with the bindings in force, the tag
// keys of the limb set and the mouse gestures. Each key is written in <b>, each menu path in
// <i> (tests read them back).
#include <QString>

class QWidget;

namespace stridemark::ui {

class KeyBindings;
class TagKeyMap;

QString cheatSheetHtml(const KeyBindings& bindings, const TagKeyMap& tagKeys);
void showCheatSheet(QWidget* parent, const QString& html);

}  // namespace stridemark::ui
