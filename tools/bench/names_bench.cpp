// Did-you-mean benchmark: closest_names for an unknown name against many invented names (syllables
// and a number, 8-30 characters, like a large user catalog). Per case: the median and the slowest of
// several runs, on one thread, and how many names were suggested. Run it from a Release build
// (tools/bench/run names); not a unit test.
//   names_bench [COUNT [RUNS]]   (default 124000 names, 7 runs)
// The "hostile catalog" cases add 1,000 names of 10,000 characters (a 32 MB catalog holds about
// 3,000 such names), so the band of the edit distance is exercised, not only the length filter.
#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <random>
#include <string>
#include <vector>

#include "model/names.hpp"

namespace {

using Clock = std::chrono::steady_clock;

std::vector<std::string> invented_names(std::size_t count, std::uint32_t seed) {
  static const char* const syllables[] = {"ka",  "ro",  "mi",  "tel", "well", "sea",  "wick", "ford", "an", "bel",
                                          "dor", "ish", "ver", "lo",  "ta",   "quin", "mar",  "sh",   "ey", "on"};
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> pieces(2, 5);
  std::uniform_int_distribution<int> pick(0, 19);
  std::vector<std::string> names;
  names.reserve(count);
  for (std::size_t i = 0; i < count; ++i) {
    std::string name;
    for (int k = pieces(random); k > 0; --k) name += syllables[pick(random)];
    name[0] = static_cast<char>(name[0] - 'a' + 'A');
    name += ' ';  // appended piecewise: GCC 12 warns falsely (-Wrestrict) on name + " " + ...
    name += std::to_string(i);
    names.push_back(name);
  }
  return names;
}

std::string long_name(std::size_t length, std::uint32_t seed) {
  std::mt19937 random(seed);
  std::uniform_int_distribution<int> letter('a', 'z');
  std::string name;
  for (std::size_t i = 0; i < length; ++i) name += static_cast<char>(letter(random));
  return name;
}

void run_case(const char* label, const std::string& wanted, const std::vector<std::string>& known, int runs) {
  std::vector<double> ms;
  std::size_t found = 0;
  for (int r = 0; r < runs; ++r) {
    const auto start = Clock::now();
    found = bine::closest_names(wanted, known).size();
    ms.push_back(std::chrono::duration<double, std::milli>(Clock::now() - start).count());
  }
  std::sort(ms.begin(), ms.end());
  std::printf("%-44s %9zu %9.2f %9.2f %6zu\n", label, known.size(), ms[ms.size() / 2], ms.back(), found);
  std::fflush(stdout);
}

}  // namespace

int main(int argc, char** argv) {
  const std::size_t count = argc > 1 ? static_cast<std::size_t>(std::strtoull(argv[1], nullptr, 10)) : 124000;
  const int runs = argc > 2 ? std::atoi(argv[2]) : 7;
  const std::vector<std::string> known = invented_names(count, 42);
  std::vector<std::string> hostile = known;
  for (std::uint32_t i = 0; i < 1000; ++i) hostile.push_back(long_name(10000, 1000 + i));

  std::printf("%-44s %9s %9s %9s %6s\n", "case", "names", "p50 ms", "max ms", "found");
  run_case("10,000 x 'q'", std::string(10000, 'q'), known, runs);
  run_case("10,000 random letters", long_name(10000, 7), known, runs);
  run_case("typo of a known name", "Kamirowel 14200", known, runs);
  run_case("unknown short name", "Nosuch", known, runs);
  run_case("hostile catalog: 10,000 x 'q'", std::string(10000, 'q'), hostile, runs);
  run_case("hostile catalog: 10,000 random letters", long_name(10000, 7), hostile, runs);
  run_case("hostile catalog: typo of a long name", hostile.back().substr(1), hostile, runs);
  // The most work a name can cost: a wanted name at the length cap against names of that length
  // that are all near misses (every candidate passes the length filter and keeps the band busy).
  std::vector<std::string> at_cap;
  for (std::uint32_t i = 0; i < count; ++i) at_cap.push_back(long_name(bine::kMaxSuggestedLength, 5000 + i));
  run_case("64 random letters vs 64-letter names", long_name(bine::kMaxSuggestedLength, 3), at_cap, runs);
  return 0;
}
