// Probe for the scipy cross-check: reads one phase set (cycles, whitespace separated) per line
// from stdin and prints our circular statistics for it as one JSON object per line.
#include <cmath>
#include <cstdio>
#include <iostream>
#include <sstream>
#include <string>
#include <vector>

#include "analysis/circular.h"

namespace {

void printNumber(const char* key, double value, bool last = false) {
  if (std::isfinite(value)) {
    std::printf("\"%s\":%.17g%s", key, value, last ? "" : ",");
  } else {
    std::printf("\"%s\":null%s", key, last ? "" : ",");
  }
}

}  // namespace

int main() {
  std::string line;
  while (std::getline(std::cin, line)) {
    std::istringstream in(line);
    std::vector<double> phases;
    for (double v; in >> v;) phases.push_back(v);
    const stridemark::analysis::CircularStats s = stridemark::analysis::circularStats(phases);
    std::printf("{\"n\":%d,\"defined\":%s,", s.n, s.defined ? "true" : "false");
    printNumber("mean", s.mean);
    printNumber("r", s.r);
    printNumber("circ_sd", s.circSd);
    printNumber("circ_var", s.circVar);
    printNumber("angular_dev", s.angularDev);
    printNumber("rayleigh_z", s.rayleighZ);
    printNumber("rayleigh_p", s.rayleighP, true);
    std::printf("}\n");
  }
  return 0;
}
