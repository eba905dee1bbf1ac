// Fuzz target: stock files (the lots in the cold store).
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  const std::string file = "stock.json";
  try {
    const bine::Stock stock = bine::parse_stock(text, file);
    for (const auto& lot : stock.lots) {
      if (lot.on_hand_g) bine::fuzz::require(std::isfinite(*lot.on_hand_g) && *lot.on_hand_g >= 0.0);
      if (lot.alpha_acid) bine::fuzz::require(std::isfinite(*lot.alpha_acid));
    }
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, file);
  }
  return 0;
}
