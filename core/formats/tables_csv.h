#pragma once
// Tidy CSV tables of one scored trial, ready for R (read.csv(comment.char = "#")) or pandas
// (read_csv(comment="#")). One observation per row, units in column names, empty cell = value
// undefined. Each file opens with '#' lines naming the software version, input and capture rate.
//
//   events.csv    limb, event, frame, time_s
//   strides.csv   one row per reference stride x limb: stride-level columns (gait, bout, band,
//                 quadrant, sequence, leads, symmetrical, steady, complete, aerial, DAP per
//                 diagonal, note) and the limb's duty_factor and phase_cycles in that stride
//   bouts.csv     one row per bout of same-gait strides, with its key figures
// Summary tables lead with scope, gait and bout (docs/methods.md §11): rows for the pooled
// trial, for each gait over all its bouts, and for each bout.
//   limbs.csv     one row per scope x limb x measure: n, mean, sd, cv
//   phases.csv    one row per scope x limb: circular statistics of its relative phase
//   support.csv   one row per scope x support pattern (k limbs down, or a named combination)
//   symmetry.csv  one row per scope x measure x limb pair: symmetry index and ratio
//   dap.csv       one row per scope x diagonal (and their mean and difference), quadrupeds
#include <filesystem>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "analysis/report.h"
#include "formats/output_set.h"
#include "model/annotation.h"

namespace stridemark::formats {

struct TableSource {
  std::string input;  // what was scored, as the user named it
};

std::string eventsTable(const model::Annotation& annotation, const TableSource& source);
std::string stridesTable(const analysis::Report& report, const TableSource& source);
std::string limbsTable(const analysis::Report& report, const TableSource& source);
std::string phasesTable(const analysis::Report& report, const TableSource& source);
std::string supportTable(const analysis::Report& report, const TableSource& source);
std::string boutsTable(const analysis::Report& report, const TableSource& source);
std::string symmetryTable(const analysis::Report& report, const TableSource& source);
std::string dapTable(const analysis::Report& report, const TableSource& source);

struct NamedTable {
  std::string fileName;  // "strides.csv"
  std::string text;
};

// Every table in file order (events, strides, limbs, phases, support, bouts, symmetry, dap):
// what `score --csv` writes, and `export` into its tables folder.
std::vector<NamedTable> allTables(const model::Annotation& annotation,
                                  const analysis::Report& report, const TableSource& source);

// The file names of allTables, in its order.
std::vector<std::string_view> allTableNames();

// True when `firstLine` opens a table we wrote ("# stridemark VERSION - TITLE", any version).
// Events CSVs saved by the desk or synth open differently and count as a user's files.
bool isStridemarkTable(std::string_view firstLine);

// The first file in `folder` with a table's name (events.csv, strides.csv, ...) that is not a
// table we wrote: a user's file that writing the tables would replace. nullopt when none.
std::optional<std::filesystem::path> firstForeignTable(const std::filesystem::path& folder);

// Creates `folder` when missing and adds every table to `outputs` (nothing is written yet).
// Throws Error(io) when the folder cannot be made or holds a file that is not one of our tables.
void addTables(OutputSet& outputs, const std::filesystem::path& folder,
               const model::Annotation& annotation, const analysis::Report& report,
               const TableSource& source);

// Writes every table into `folder` as one set (addTables, then OutputSet::commit): either all
// tables are replaced or none. Returns the files written.
std::vector<std::filesystem::path> writeTables(const std::filesystem::path& folder,
                                               const model::Annotation& annotation,
                                               const analysis::Report& report,
                                               const TableSource& source);

}  // namespace stridemark::formats
