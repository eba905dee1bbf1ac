#pragma once
// Shared by the fuzz targets: the shipped lexicon (loaded once) and the checks every target makes
// on an InputError: at least one line, each naming the file first, none empty or multi-line.
#include <cstdlib>
#include <string>
#include <string_view>

#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace bine::fuzz {

/// The shipped lexicon, the one every real run checks aroma axes against.
inline const Lexicon& shipped_lexicon() {
  static const Lexicon lexicon = load_lexicon(std::string(BINE_SOURCE_DATA_DIR) + "/lexicon.json");
  return lexicon;
}

/// Aborts (a finding for libFuzzer) when a condition that must hold does not.
inline void require(bool condition) {
  if (!condition) std::abort();
}

/// An error must be one clear line per problem, each starting with the file it is about.
inline void check_error_lines(const InputError& error, std::string_view file) {
  require(!error.lines().empty());
  for (const auto& line : error.lines()) {
    require(line.rfind(std::string(file) + ": ", 0) == 0);
    require(line.find('\n') == std::string::npos);
    require(line.size() > file.size() + 2);
  }
}

}  // namespace bine::fuzz
