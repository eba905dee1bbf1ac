#pragma once
// The one page frame every HTML report shares: a self-contained document (inline CSS and SVG, no
// script, no external request) laid out for a phone (360 px), a laptop (800 px and up) and paper
// (A4 or Letter, print stylesheet). The page is well-formed XML as well as HTML (void elements
// closed, attributes quoted), so a strict parser can check it. What goes on every page besides the
// command's sections: where the numbers came from (demo data marked), cautions in their own box,
// the date it was written and the bine version.
#include <string>
#include <string_view>
#include <vector>

namespace bine::html {

/// Where a page's numbers came from: a catalog, a stock file, a recipe.
struct Source {
  std::string what;   // "catalog", "stock", "recipe"
  std::string name;   // its name or file
  bool demo = false;  // invented demo data: the page says so beside it
};

/// What every page carries besides its sections; filled by the command (src/cli/html_output).
struct PageMeta {
  std::string written_on;  // YYYY-MM-DD, the day the page was written
  std::string version;     // bine version
  std::vector<Source> sources;
};

/// One titled part of a page; `body` is HTML (tables, charts, paragraphs) built by html_table,
/// svg_chart and paragraph().
struct Section {
  std::string heading;
  std::string body;
};

/// The page's own content.
struct PageContent {
  std::string title;    // <title> and the page heading
  std::string summary;  // one line under the heading (plain text, escaped here)
  std::vector<Section> sections;
  std::vector<std::string> notes;     // assumptions made, plain text
  std::vector<std::string> cautions;  // plain text, shown in the caution box
};

/// The complete document.
std::string page(const PageContent& content, const PageMeta& meta);

/// A paragraph of plain text (escaped).
std::string paragraph(std::string_view text);

/// The stylesheet every page inlines (screen and print), exposed for the page-size test.
std::string_view stylesheet();

}  // namespace bine::html
