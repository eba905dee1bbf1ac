// Fuzz target: aroma target specs ("floral=4,citrus=3") as given to --target.
#include <cmath>
#include <cstddef>
#include <cstdint>

#include "engine/aroma_profile.hpp"
#include "fuzz_support.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view spec(reinterpret_cast<const char*>(data), size);
  const auto& lexicon = bine::fuzz::shipped_lexicon();
  try {
    std::vector<bool> named;
    const Eigen::VectorXd target = bine::parse_aroma_spec(spec, lexicon, "--target", &named);
    bine::fuzz::require(static_cast<std::size_t>(target.size()) == lexicon.size() && named.size() == lexicon.size());
    bool any = false;
    for (Eigen::Index i = 0; i < target.size(); ++i) {
      bine::fuzz::require(std::isfinite(target[i]) && target[i] >= 0.0 && target[i] <= 5.0);
      any = any || named[static_cast<std::size_t>(i)];
    }
    bine::fuzz::require(any);
  } catch (const bine::InputError& error) {
    bine::fuzz::check_error_lines(error, "--target");
  }
  return 0;
}
