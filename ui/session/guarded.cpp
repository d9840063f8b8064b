#include "ui/session/guarded.h"

#include <QMessageBox>
#include <cstdio>
#include <exception>

#include "common/error.h"

namespace stridemark::ui {

namespace {

ErrorSink& sink() {
  static ErrorSink current;
  return current;
}

}  // namespace

void setErrorSink(ErrorSink s) {
  sink() = std::move(s);
}

void reportError(QWidget* parent, const QString& title, const QString& text) {
  if (sink()) {
    sink()(parent, title, text);
    return;
  }
  // Also on stderr: seen when the desk runs from a terminal or a script, and kept in its log.
  std::fprintf(stderr, "stridemark-desk: %s: %s\n", title.toLocal8Bit().constData(),
               text.toLocal8Bit().constData());
  std::fflush(stderr);
  QMessageBox::warning(parent, title, text);
}

bool runGuarded(QWidget* parent, const QString& what, const std::function<void()>& action) {
  try {
    action();
    return true;
  } catch (const Error& e) {
    reportError(parent, what, QString::fromStdString(e.what()));
  } catch (const std::exception& e) {
    reportError(parent, what,
                QStringLiteral("Internal error: %1\nYour tags are kept in the autosave journal. "
                               "Please report this with the steps that led to it.")
                    .arg(QString::fromStdString(e.what())));
  }
  return false;
}

}  // namespace stridemark::ui
