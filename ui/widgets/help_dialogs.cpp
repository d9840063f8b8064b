#include "ui/widgets/help_dialogs.h"

#include <QMessageBox>
#include <QObject>

#include "common/caution.h"
#include "stridemark/version.h"

namespace stridemark::ui {

void showAbout(QWidget* parent) {
  QMessageBox::about(
      parent, QObject::tr("About Stridemark"),
      QStringLiteral("<h3>Stridemark %1</h3><p>Step through video of a moving animal, tag each "
                     "limb's touchdown and lift-off, and see the gait as you go.</p>"
                     "<p><b>Caution:</b> %2</p>")
          .arg(QString::fromLatin1(kVersion),
               QString::fromUtf8(kCaution.data(), static_cast<qsizetype>(kCaution.size()))
                   .toHtmlEscaped()));
}

}  // namespace stridemark::ui
