#include "cli/console.hpp"

namespace bine::cli {

void print_result(const Console& console, bool json, const std::function<nlohmann::json()>& document,
                  const std::function<void(std::ostream&)>& text) {
  if (json)
    console.out << document().dump(2) << '\n';
  else
    text(console.out);
}

}  // namespace bine::cli
