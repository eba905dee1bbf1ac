#include "report/html_page.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "report/html_text.hpp"
#include "report/output_format.hpp"

namespace bine::html {
namespace {

// Our own sheet: dark ink on white, one slate accent for headings and rules, an amber box for the
// cautions. Tables are real tables; under 40rem (phones) a table too wide for the screen (class
// "cards") becomes one card per row whose cells carry their column heading (data-label), so nothing
// scrolls sideways; a figure or a code is never broken across lines (.nb spans in running text).
// Charts stretch their bars to the column; their text keeps its size in px.
constexpr std::string_view kStyle = R"css(
*{box-sizing:border-box}
html{-webkit-text-size-adjust:100%;text-size-adjust:100%}
body{margin:0 auto;padding:1rem .75rem 2rem;max-width:52rem;font:16px/1.45 system-ui,"DejaVu Sans",sans-serif;
color:#1b1b1b;background:#fff;overflow-wrap:break-word}
h1{font-size:1.45rem;line-height:1.2;margin:.2rem 0 .3rem;color:#1d3b53}
h2{font-size:1.12rem;margin:1.6rem 0 .5rem;padding-bottom:.15rem;border-bottom:2px solid #1d3b53;color:#1d3b53}
p{margin:.4rem 0}
.summary{font-size:1.02rem;color:#333}
table{border-collapse:collapse;width:100%;margin:.4rem 0 .8rem;font-size:.92rem}
caption{text-align:left;font-weight:600;padding:.2rem 0 .35rem;color:#333}
th,td{padding:.3rem .45rem;border-bottom:1px solid #c9cfd4;vertical-align:top;text-align:left}
thead th{border-bottom:2px solid #1d3b53;font-weight:600;background:#eef2f5}
.num{text-align:right;font-variant-numeric:tabular-nums}
td.num,td.code,.nb{white-space:nowrap}
td.words{white-space:normal}
tfoot td{font-weight:700;border-top:2px solid #1d3b53;border-bottom:none}
figure{margin:.6rem 0 1rem}
figure>svg{display:block;width:100%;max-width:36rem}
svg svg{overflow:visible}
figcaption{font-weight:600;color:#333;margin-bottom:.2rem}
.chart-note{font-size:.9rem;color:#333;margin:.3rem 0 0}
.caution{margin:1.4rem 0;padding:.6rem .9rem;border:2px solid #8a5a00;border-left-width:.5rem;background:#fff6e0}
.caution h2{margin-top:.1rem;border:none;color:#5c3b00}
.caution ul,.notes ul,.sources ul{margin:.2rem 0;padding-left:1.2rem}
.caution li{margin:.25rem 0}
.demo{font-weight:700}
footer{margin-top:1.6rem;padding-top:.4rem;border-top:1px solid #c9cfd4;font-size:.85rem;color:#333}
svg text{font-family:system-ui,"DejaVu Sans",sans-serif;fill:#1b1b1b}
svg .label{paint-order:stroke;stroke:#fff;stroke-width:3px;stroke-linejoin:round}
.grid{stroke:#c9cfd4;stroke-width:1}
.axis{stroke:#1b1b1b;stroke-width:1}
.s0{fill:#1d3b53}
.s1{fill:#e2a03f}
.s2{fill:#8fb8d6}
@media (max-width:40rem){
body{font-size:15px}
table.cards,table.cards caption,table.cards tbody,table.cards tfoot,table.cards tr,table.cards td{display:block;
width:100%}
table.cards thead{position:absolute;width:1px;height:1px;overflow:hidden;clip:rect(0 0 0 0)}
table.cards tr{display:grid;grid-template-columns:repeat(2,minmax(0,1fr));column-gap:.9rem;
border-top:2px solid #1d3b53;padding:.2rem 0}
table.cards td{display:flex;justify-content:space-between;gap:.5rem;padding:.25rem .1rem;
border-bottom:1px dotted #c9cfd4;text-align:right}
table.cards td.words,table.cards td.long,table.cards td:not(.num):not(.code){white-space:normal}
table.cards td::before{content:attr(data-label);font-weight:600;text-align:left;color:#333;
white-space:normal;overflow-wrap:normal;flex:0 1 auto}
table.cards tfoot td{border-top:none}
table.cards td:empty{display:none}
table.cards td:first-child:not(.num),table.cards td.long{grid-column:1/-1}
table.cards td[data-label=""]{justify-content:flex-start}
table.cards td[data-label=""]::before{display:none}
}
@media print{
@page{margin:14mm}
body{max-width:none;padding:0;font-size:10pt}
h2{break-after:avoid}
tr,figure,.caution{break-inside:avoid}
figure>svg{max-width:12cm}
thead th{background:none}
table{font-size:9pt}
}
)css";

constexpr std::string_view kLocalRules =
    "Where local rules or your brewery's safety practice say otherwise, follow them: these are estimates.";

std::string sources_html(const PageMeta& meta) {
  if (meta.sources.empty()) return "";
  std::string out = "<div class=\"sources\"><p>Numbers from:</p><ul>\n";
  for (const auto& source : meta.sources) {
    out += fmt::format(
        "<li>{}: {}{}</li>\n", html_escape(source.what), text_html(source.name),
        source.demo ? " <span class=\"demo\">(includes invented demo data: load your own for brewing)</span>" : "");
  }
  return out + "</ul></div>\n";
}

std::string list_html(std::string_view css_class, std::string_view heading, const std::vector<std::string>& items) {
  if (items.empty()) return "";
  std::string out = fmt::format("<section class=\"{}\"><h2>{}</h2><ul>\n", css_class, heading);
  for (const auto& item : items) out += "<li>" + text_html(item) + "</li>\n";
  return out + "</ul></section>\n";
}

}  // namespace

std::string_view stylesheet() { return kStyle; }

std::string paragraph(std::string_view text) { return "<p>" + text_html(text) + "</p>\n"; }

std::string page(const PageContent& content, const PageMeta& meta) {
  std::string out = fmt::format(
      "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
      "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n"
      "<meta name=\"generator\" content=\"bine {}\"/>\n<title>{}</title>\n<style>{}</style>\n</head>\n<body>\n"
      "<header><h1>{}</h1>\n",
      html_escape(meta.version), html_escape(content.title), kStyle, text_html(content.title));
  if (!content.summary.empty()) out += "<p class=\"summary\">" + text_html(content.summary) + "</p>\n";
  out += "</header>\n<main>\n";
  for (const auto& section : content.sections)
    out += "<section>\n<h2>" + text_html(section.heading) + "</h2>\n" + section.body + "</section>\n";
  out += list_html("notes", "Notes", content.notes);
  std::vector<std::string> cautions = content.cautions;
  const bool said = std::any_of(cautions.begin(), cautions.end(),
                                [](const std::string& c) { return c.find("local rules") != std::string::npos; });
  if (!said) cautions.emplace_back(kLocalRules);
  out += list_html("caution", "Cautions", cautions);
  out += "</main>\n<footer>\n" + sources_html(meta);
  out += fmt::format("<p>Written {} by bine {}. Estimates from published models: weigh, taste and adjust.</p>\n",
                     html_escape(meta.written_on), html_escape(meta.version));
  out += "</footer>\n</body>\n</html>\n";
  return out;
}

}  // namespace bine::html
