#include "ui/widgets/help_dialogs.h"

#include <QDialog>
#include <QDialogButtonBox>
#include <QMessageBox>
#include <QTextBrowser>
#include <QVBoxLayout>

#include "stridemark/version.h"
#include "ui/widgets/tag_keys.h"

namespace stridemark::ui {

const char* const kClinicalCautionText =
    "Gait measurements support, and never replace, examination by a licensed veterinarian. "
    "Defer to local practice and regulations for animal handling, including on treadmills.";

void showCheatSheet(QWidget* parent, const TagKeyMap& keys) {
  QString tags;
  for (int i = 0; i < keys.limbs().size(); ++i)
    tags += QStringLiteral(
                "<tr><td><b>%1</b></td><td>tag %2 (touchdown in swing, lift-off in "
                "stance)</td></tr>")
                .arg(TagKeyMap::keyText(keys.keyFor(i)).toHtmlEscaped(),
                     QString::fromStdString(keys.limbs().label(i)));
  const QString html =
      QStringLiteral(
          "<h3>Keyboard</h3><table cellspacing=6>"
          "<tr><td><b>← / →</b></td><td>step one frame back / forward</td></tr>"
          "<tr><td><b>Shift+← / Shift+→</b></td><td>step N frames (Transport ▸ Big step)</td></tr>"
          "<tr><td><b>Home / End</b></td><td>first / last frame</td></tr>"
          "<tr><td><b>Space</b></td><td>play / pause forwards</td></tr>"
          "<tr><td><b>Shift+Space</b></td><td>play backwards</td></tr>"
          "<tr><td><b>+ / −</b></td><td>faster / slower playback (1/32 … 1× of capture "
          "rate)</td></tr>"
          "<tr><td><b>[ / ]</b></td><td>previous / next event of the selected limb</td></tr>"
          "<tr><td><b>Ctrl+G</b></td><td>go to frame or time</td></tr>"
          "<tr><td><b>, / .</b></td><td>nudge selected events one frame earlier / later</td></tr>"
          "<tr><td><b>Delete</b></td><td>delete selected events, or the hidden span selected by "
          "clicking inside it in the lanes</td></tr>"
          "<tr><td><b>Ctrl+H</b></td><td>start / end a hidden span of the selected limb</td></tr>"
          "<tr><td><b>Ctrl+Shift+H</b></td><td>mark a hidden span for chosen limbs or all limbs "
          "(ends a span started with Ctrl+H)</td></tr>"
          "<tr><td><b>Ctrl+Z / Ctrl+Shift+Z</b></td><td>undo / redo</td></tr>"
          "<tr><td><b>Ctrl+S</b></td><td>save</td></tr>"
          "<tr><td><b>Ctrl+T</b></td><td>Trial card</td></tr>%1</table>"
          "<p>Tag keys are laid out like the animal seen from above: front limbs on the upper "
          "row, left limbs on the left. Shift+tag key marks the other kind (e.g. a first lift-off "
          "when the clip starts in stance). They do nothing while a text field has focus. Rebind "
          "them under Settings ▸ Tag keys.</p>")
          .arg(tags);
  QDialog dialog(parent);
  dialog.setWindowTitle(QObject::tr("Keyboard cheat sheet"));
  auto* text = new QTextBrowser;
  text->setAccessibleName(QObject::tr("Keyboard cheat sheet"));
  text->setHtml(html);
  auto* buttons = new QDialogButtonBox(QDialogButtonBox::Close);
  QObject::connect(buttons, &QDialogButtonBox::rejected, &dialog, &QDialog::reject);
  auto* layout = new QVBoxLayout(&dialog);
  layout->addWidget(text);
  layout->addWidget(buttons);
  dialog.resize(560, 560);
  dialog.exec();
}

void showAbout(QWidget* parent) {
  QMessageBox::about(
      parent, QObject::tr("About Stridemark"),
      QStringLiteral("<h3>Stridemark %1</h3><p>Step through video of a moving animal, tag each "
                     "limb's touchdown and lift-off, and see the gait as you go.</p>"
                     "<p><b>Caution:</b> %2</p>")
          .arg(QString::fromLatin1(kVersion), QString::fromLatin1(kClinicalCautionText)));
}

}  // namespace stridemark::ui
