// Fuzz target: quantity strings ("28 g", "5.5 gal", "12.4 P"). The first byte picks the dimension.
// parse_quantity must never throw; a value it returns must be finite, and an error must say so.
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "fuzz_support.hpp"
#include "model/quantity.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const auto dimension = static_cast<bine::Dimension>(data[0] % 7);
  const std::string_view text(reinterpret_cast<const char*>(data + 1), size - 1);
  const bine::ParsedQuantity parsed = bine::parse_quantity(text, dimension);
  if (parsed.value) {
    bine::fuzz::require(std::isfinite(*parsed.value));
    bine::fuzz::require(parsed.error.empty());
  } else {
    bine::fuzz::require(!parsed.error.empty());
  }
  return 0;
}
