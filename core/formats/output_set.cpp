#include "formats/output_set.h"

#include <memory>

#include "common/error.h"

namespace stridemark::formats {
namespace fs = std::filesystem;
namespace {

std::string nameList(const std::vector<fs::path>& paths) {
  std::string text;
  for (const auto& path : paths) text += (text.empty() ? "" : ", ") + path.string();
  return text.empty() ? "none" : text;
}

}  // namespace

void OutputSet::add(fs::path target, std::string content) {
  entries_.push_back({std::move(target), std::move(content)});
}

std::vector<fs::path> OutputSet::commit() {
  std::vector<std::unique_ptr<AtomicFile>> files;
  try {
    for (const Entry& entry : entries_)
      files.push_back(std::make_unique<AtomicFile>(entry.target, durability_));
    // Regular files first: a failure there must come before anything is written for good.
    for (const bool direct : {false, true}) {
      for (std::size_t i = 0; i < files.size(); ++i) {
        if (files[i]->replacesByRename() == direct) continue;
        files[i]->write(entries_[i].content);
        files[i]->finish();
      }
    }
  } catch (const Error& e) {
    // Direct outputs are written last, so every regular file is still as it was.
    std::size_t regular = 0;
    for (const auto& file : files) regular += file->replacesByRename() ? 1 : 0;
    if (files.size() < entries_.size()) regular = entries_.size();  // failed while opening
    if (regular <= 1) throw;
    throw Error(e.category(), std::string(e.what()) + ". None of the " + std::to_string(regular) +
                                  " output files was replaced: each keeps its previous content");
  }
  std::vector<fs::path> replaced;
  for (std::size_t i = 0; i < files.size(); ++i) {
    try {
      files[i]->commit();
    } catch (const Error& e) {
      std::vector<fs::path> kept;
      for (std::size_t k = i; k < files.size(); ++k) kept.push_back(entries_[k].target);
      throw Error(e.category(), std::string(e.what()) + ". Replaced already: " +
                                    nameList(replaced) + "; not replaced: " + nameList(kept) +
                                    " — the outputs now mix two runs; run the command again");
    }
    replaced.push_back(entries_[i].target);
  }
  return replaced;
}

}  // namespace stridemark::formats
