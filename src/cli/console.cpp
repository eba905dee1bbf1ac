#include "cli/console.hpp"

namespace bine::cli {

void print_result(const Console& console, bool json, const std::function<nlohmann::json()>& document,
                  const std::function<void(std::ostream&)>& text) {
  if (json)
    console.out << document().dump(2) << '\n';
  else
    text(console.out);
}

void print_result(const Console& console, bool json, const DataSet& data,
                  const std::function<nlohmann::json()>& document, const std::function<void(std::ostream&)>& text) {
  print_result(
      console, json,
      [&] {
        nlohmann::json out = document();
        nlohmann::json used = nlohmann::json::array();
        for (const auto& source : data.sources)
          used.push_back({{"name", source.name}, {"file", source.file}, {"demo", source.demo}});
        if (out.is_object()) out["catalogs_used"] = std::move(used);
        return out;
      },
      [&](std::ostream& out) {
        text(out);
        out << '\n' << catalogs_used_line(data) << '\n';
      });
}

}  // namespace bine::cli
