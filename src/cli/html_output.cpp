#include "cli/html_output.hpp"

#include "cli/commands.hpp"
#include "cli/option_values.hpp"
#include "io/file_io.hpp"

namespace bine::cli {

void add_html_option(CLI::App* command, std::string& file) {
  command
      ->add_option("--html", file,
                   "also write a printable HTML sheet (tables, charts, cautions; one file, no script) to FILE")
      ->check(output_file_name());
}

html::PageMeta page_meta(const DataSet* data, const std::string& recipe, const std::string& stock,
                         const std::string& given) {
  html::PageMeta meta;
  meta.written_on = format_date(today());
  meta.version = BINE_VERSION;
  if (data)
    for (const CatalogSource& source : data->sources)
      meta.sources.push_back({"catalog", source.name + " (" + source.file + ")", source.demo});
  if (!recipe.empty()) meta.sources.push_back({"recipe", recipe, false});
  if (!stock.empty()) meta.sources.push_back({"stock", stock, false});
  if (!given.empty()) meta.sources.push_back({"command line", given, false});
  return meta;
}

void write_html(const std::string& file, const std::function<std::string()>& render) {
  if (!file.empty()) write_file_atomically(file, render());
}

}  // namespace bine::cli
