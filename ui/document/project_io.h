#pragma once
// Project files on disk, through core/formats (atomic write). Kept apart from the document so
// the document's tests and the journal do not depend on the file format's details.
#include <QString>

#include "model/annotation.h"

namespace stridemark::ui {

// Throw stridemark::Error with a message naming the file.
model::Project loadProjectFile(const QString& path);
void saveProjectFile(const QString& path, const model::Project& project);

}  // namespace stridemark::ui
