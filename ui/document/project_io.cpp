#include "ui/document/project_io.h"

#include "formats/project_file.h"

namespace stridemark::ui {

model::Project loadProjectFile(const QString& path) {
  return formats::readProjectFile(path.toStdString());
}

void saveProjectFile(const QString& path, const model::Project& project) {
  formats::writeProjectFile(path.toStdString(), project);
}

}  // namespace stridemark::ui
