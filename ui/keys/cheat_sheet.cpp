#include "ui/keys/cheat_sheet.h"

#include <QCoreApplication>
#include <QDialog>
#include <QDialogButtonBox>
#include <QStringList>
#include <QTextBrowser>
#include <QVBoxLayout>

#include "ui/keys/action_table.h"
#include "ui/keys/key_bindings.h"
#include "ui/widgets/tag_keys.h"

namespace stridemark::ui {

namespace {

QString tr(const char* text) {
  return QCoreApplication::translate("CheatSheet", text);
}

QString keyCell(const QStringList& keys) {
  QStringList bold;
  for (const auto& key : keys) bold << QStringLiteral("<b>%1</b>").arg(key.toHtmlEscaped());
  return bold.join(tr(" or "));
}

QString row(const QString& keys, const QString& what) {
  return QStringLiteral("<tr><td>%1</td><td>%2</td></tr>").arg(keys, what);
}

QString heading(const QString& text) {
  return QStringLiteral("<tr><td colspan=2><br><b><u>%1</u></b></td></tr>")
      .arg(text.toHtmlEscaped());
}

QString menuPathHtml(ActionId id) {
  return QStringLiteral("<i>%1</i>").arg(menuPath(id).toHtmlEscaped());
}

QString actionRows(const KeyBindings& bindings, Menu menu) {
  QString rows;
  for (const auto& spec : actionTable()) {
    if (spec.menu != menu) continue;
    QStringList keys;
    for (const auto& seq : bindings.shortcutsFor(spec.id))
      keys << seq.toString(QKeySequence::NativeText);
    if (keys.isEmpty()) continue;
    QString what = menuPathHtml(spec.id);
    if (spec.note)
      what +=
          QStringLiteral(": ") + QCoreApplication::translate("Actions", spec.note).toHtmlEscaped();
    if (spec.hasSeeAlso) what += tr(" (set in %1)").arg(menuPathHtml(spec.seeAlso));
    rows += row(keyCell(keys), what);
  }
  return rows.isEmpty() ? rows : heading(withoutMnemonic(menuTitle(menu))) + rows;
}

QString tagKeyRows(const TagKeyMap& tagKeys) {
  QString rows = heading(tr("Tag keys"));
  for (const auto& use : tagKeyUses())
    rows += row(QStringLiteral("<b>%1</b>")
                    .arg((modifierText(use.modifiers) + tr("tag key")).toHtmlEscaped()),
                tagKeyEffect(use).toHtmlEscaped());
  for (int i = 0; i < tagKeys.limbs().size(); ++i)
    rows += row(keyCell({TagKeyMap::keyText(tagKeys.keyFor(i))}),
                tr("tag %1").arg(QString::fromStdString(tagKeys.limbs().label(i)).toHtmlEscaped()));
  return rows;
}

QString gestureRows() {
  QString rows;
  bool first = true;
  Place place = Place::lanes;
  for (const auto& g : gestureTable()) {
    if (first || g.place != place) rows += heading(placeName(g.place));
    first = false;
    place = g.place;
    rows += row(gestureText(g).toHtmlEscaped(), gestureEffect(g).toHtmlEscaped());
  }
  return rows;
}

}  // namespace

QString cheatSheetHtml(const KeyBindings& bindings, const TagKeyMap& tagKeys) {
  QString keyboard;
  for (const Menu menu : kMenus) keyboard += actionRows(bindings, menu);
  const QString rules =
      tr("Tag keys are laid out like the animal seen from above: front limbs on the upper row, "
         "left limbs on the left. They do nothing while a text field has focus. Rebind them in "
         "%1, and the other keys in %2.")
          .arg(menuPathHtml(ActionId::tagKeys), menuPathHtml(ActionId::keyBindings));
  return QStringLiteral(
             "<h3>%1</h3><table cellspacing=4>%2%3</table><p>%4</p>"
             "<h3>%5</h3><table cellspacing=4>%6</table>")
      .arg(tr("Keyboard"), keyboard, tagKeyRows(tagKeys), rules, tr("Mouse"), gestureRows());
}

void showCheatSheet(QWidget* parent, const QString& html) {
  QDialog dialog(parent);
  dialog.setObjectName(QStringLiteral("cheatSheet"));
  dialog.setWindowTitle(tr("Keyboard cheat sheet"));
  auto* text = new QTextBrowser;
  text->setAccessibleName(tr("Keyboard cheat sheet"));
  text->setHtml(html);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
  QObject::connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  auto* layout = new QVBoxLayout(&dialog);
  layout->addWidget(text);
  layout->addWidget(buttons);
  dialog.resize(640, 720);
  dialog.exec();
}

}  // namespace stridemark::ui
