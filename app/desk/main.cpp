// stridemark-desk: the workstation. Thin: set up the application, open what the command line
// names, run the window.
#include <QApplication>
#include <QCommandLineParser>
#include <QSettings>

#include "common/caution.h"
#include "stridemark/version.h"
#include "ui/main_window.h"
#include "ui/session/palettes.h"

int main(int argc, char** argv) {
  QApplication app(argc, argv);
  QApplication::setOrganizationName(QStringLiteral("Stridemark"));
  QApplication::setApplicationName(QStringLiteral("stridemark-desk"));
  QApplication::setApplicationVersion(QString::fromLatin1(stridemark::kVersion));
  QCommandLineParser parser;
  parser.setApplicationDescription(
      QStringLiteral("Stridemark workstation: step through video, tag footfalls, see the gait "
                     "live.\n") +
      QString::fromUtf8(stridemark::kCaution.data(),
                        static_cast<qsizetype>(stridemark::kCaution.size())));
  parser.addHelpOption();
  parser.addVersionOption();
  parser.addPositionalArgument(QStringLiteral("file"),
                               QStringLiteral("Video or .stridemark project to open."));
  QCommandLineOption recover(QStringLiteral("recover"),
                             QStringLiteral("Recover an autosave journal without asking."));
  parser.addOption(recover);
  parser.process(app);

  const QString theme = QSettings().value(QStringLiteral("theme")).toString();
  stridemark::ui::applyTheme(stridemark::ui::themeFromName(theme));
  stridemark::ui::MainWindow window;
  if (parser.isSet(recover)) window.setRecoveryPolicy(stridemark::ui::RecoveryPolicy::recover);
  window.show();
  if (!parser.positionalArguments().isEmpty())
    window.openPath(parser.positionalArguments().front());
  return QApplication::exec();
}
