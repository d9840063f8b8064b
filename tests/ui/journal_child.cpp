// Test helper for the crash-recovery test: opens a project in a ProjectDocument (the same class
// the workstation uses), tags N events one by one, reports each on stdout and then waits to be
// killed. Usage: desk_journal_child PROJECT N
#include <QCoreApplication>
#include <QThread>
#include <cstdio>
#include <cstdlib>

#include "ui/document/project_document.h"
#include "ui/document/project_io.h"

int main(int argc, char** argv) {
  QCoreApplication app(argc, argv);
  if (argc != 3) {
    std::fprintf(stderr, "usage: desk_journal_child PROJECT N\n");
    return 2;
  }
  const QString path = QString::fromLocal8Bit(argv[1]);
  const int edits = std::atoi(argv[2]);
  stridemark::ui::ProjectDocument doc;
  doc.reset(stridemark::ui::loadProjectFile(path), path);
  for (int i = 0; i < edits; ++i) {
    doc.tag(i % 4, 10 + 3 * i);
    std::printf("edit %d\n", i);
    std::fflush(stdout);
  }
  std::printf("done\n");
  std::fflush(stdout);
  for (;;) QThread::sleep(1);  // never exits by itself: the test kills it with SIGKILL
}
