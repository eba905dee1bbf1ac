#include "cli/console.hpp"

#include "model/errors.hpp"

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

std::string csv_conflict(bool json, bool csv, const std::string& html) {
  if (!csv || (!json && html.empty())) return {};
  return std::string("--csv: not with ") + (json ? "--json" : "--html") +
         " (expected one of them: --csv prints a spreadsheet table as the whole output)";
}

Printed printed_as(bool json, bool csv, const std::string& html) {
  if (const std::string conflict = csv_conflict(json, csv, html); !conflict.empty()) throw InputError(conflict);
  return csv ? Printed::csv : json ? Printed::json : Printed::text;
}

void print_result(const Console& console, Printed printed, const DataSet& data,
                  const std::function<nlohmann::json()>& document, const std::function<std::string()>& table,
                  const std::function<void(std::ostream&)>& text) {
  if (printed == Printed::csv) {
    console.out << table();
    print_notes(console, {catalogs_used_line(data)});  // stdout stays one table
  } else {
    print_result(console, printed == Printed::json, data, document, text);
  }
}

void print_notes(const Console& console, const std::vector<std::string>& notes) {
  for (const auto& note : notes) console.err << "bine: note: " << note << '\n';
}

}  // namespace bine::cli
