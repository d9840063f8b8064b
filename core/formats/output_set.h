#pragma once
// Several output files that replace their previous versions together (a report and its tables):
// a reader of the folder never finds this run's tables beside the previous run's. Every file is
// first written whole under a temporary name beside its target (file_io.h); only when all of
// them are complete are they renamed into place, one rename each. A failure while writing (a
// full disk) removes every temporary file and leaves every target as it was.
#include <filesystem>
#include <string>
#include <vector>

#include "formats/file_io.h"

namespace stridemark::formats {

class OutputSet {
 public:
  explicit OutputSet(Durability durability = Durability::regenerable) : durability_(durability) {}

  void add(std::filesystem::path target, std::string content);

  // Writes every file, then replaces the targets; returns them in the order added. Throws
  // Error(io) saying which file failed and what state the outputs are in. Outputs written
  // directly (a device, pipe or /dev/stdout, see AtomicFile) are written after every regular
  // file is staged and before any is replaced.
  std::vector<std::filesystem::path> commit();

 private:
  struct Entry {
    std::filesystem::path target;
    std::string content;
  };
  Durability durability_;
  std::vector<Entry> entries_;
};

}  // namespace stridemark::formats
