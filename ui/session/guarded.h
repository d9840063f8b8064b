#pragma once
// The one place in ui/ where core errors become messages: run an action, and if it throws
// stridemark::Error (or anything else), show the message and keep the application alive.
#include <QString>
#include <functional>

class QWidget;

namespace stridemark::ui {

// Returns true when `action` completed. `what` names the action in the dialog title.
bool runGuarded(QWidget* parent, const QString& what, const std::function<void()>& action);

// Where messages go. The default shows a QMessageBox; tests install a recorder so they can
// check the text without a modal dialog.
using ErrorSink = std::function<void(QWidget* parent, const QString& title, const QString& text)>;
void setErrorSink(ErrorSink sink);
void reportError(QWidget* parent, const QString& title, const QString& text);

}  // namespace stridemark::ui
