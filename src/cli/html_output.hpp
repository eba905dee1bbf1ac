#pragma once
// --html FILE for every command that writes a page: the option with its help line, what the page
// says about itself (date, version, where its numbers came from) and the atomic write.
#include <CLI/CLI.hpp>
#include <functional>
#include <string>

#include "io/data_dir.hpp"
#include "report/html_page.hpp"

namespace bine::cli {

/// Binds --html FILE to `file` on `command`.
void add_html_option(CLI::App* command, std::string& file);

/// Today's date, the bine version, the catalogs (demo data marked; none when `data` is null),
/// the recipe and stock files (empty: not used) and what was given on the command line, in words.
html::PageMeta page_meta(const DataSet* data, const std::string& recipe = "", const std::string& stock = "",
                         const std::string& given = "");

/// Writes the page `render` builds to `file`, atomically; nothing when `file` is empty.
void write_html(const std::string& file, const std::function<std::string()>& render);

}  // namespace bine::cli
