#pragma once
// What the window's open and save code share about file names.
#include <QString>

#include "formats/project_file.h"

namespace stridemark::ui {

inline QString projectExtension() {
  return QString::fromLatin1(formats::kProjectExtension.data(),
                             static_cast<int>(formats::kProjectExtension.size()));
}

inline bool isProjectFile(const QString& path) {
  return path.endsWith(projectExtension(), Qt::CaseInsensitive);
}

}  // namespace stridemark::ui
