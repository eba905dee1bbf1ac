// Fuzz target: catalog files. Any input must give a catalog or an InputError with clear lines;
// any other exception, crash, leak or undefined behaviour is a finding.
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const std::string file = "catalog.json";
  try {
    const bine::Catalog catalog = bine::parse_catalog(text, file, bine::fuzz::shipped_lexicon());
    bine::fuzz::require(!catalog.varieties.empty());
    for (const auto& variety : catalog.varieties) {
      bine::fuzz::require(!variety.name.empty());
      if (variety.alpha_acid)
        bine::fuzz::require(std::isfinite(variety.alpha_acid->min) &&
                            variety.alpha_acid->min <= variety.alpha_acid->max);
    }
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, file);
  }
  return 0;
}
