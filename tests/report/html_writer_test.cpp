// The shared HTML writer (page frame, tables, charts) on hand-built content: names escaped, the
// caution box and the sources on every page (demo data marked), no script and no reference to
// anything outside the file, cells tied to their JSON values, each chart with a title and a text
// alternative, ticks at 1, 2 or 5 times a power of ten.
#include <doctest/doctest.h>

#include <string>

#include "report/html_cells.hpp"
#include "report/html_page.hpp"
#include "report/html_table.hpp"
#include "report/svg_chart.hpp"

namespace {

using namespace bine;

bool has(const std::string& text, const std::string& needle) { return text.find(needle) != std::string::npos; }

html::PageMeta meta() {
  return {"2026-12-01", "9.9.9", {{"catalogs", "Cat <A>", true}, {"stock", "cold & store.json", false}}};
}

}  // namespace

TEST_CASE("html page: title, sections, notes, cautions box, sources with demo mark, date and version") {
  html::PageContent content;
  content.title = "Sheet <One> & \"Two\"";
  content.summary = "20 L at OG 1.050";
  content.sections.push_back({"Part <1>", html::paragraph("a < b")});
  content.notes = {"note & more"};
  content.cautions = {"hot wort scalds"};
  const std::string page = html::page(content, meta());
  CHECK(page.starts_with("<!DOCTYPE html>\n<html lang=\"en\">"));
  CHECK(has(page, "<title>Sheet &lt;One&gt; &amp; &quot;Two&quot;</title>"));
  CHECK(has(page, "<h2>Part &lt;1&gt;</h2>\n<p>a &lt; b</p>"));
  CHECK(has(page, "<li>note &amp; more</li>"));
  // The caution box holds the command's cautions and the standing one on local rules.
  const auto box = page.find("<section class=\"caution\">");
  REQUIRE(box != std::string::npos);
  CHECK(page.find("hot wort scalds", box) != std::string::npos);
  CHECK(page.find("local rules", box) != std::string::npos);
  CHECK(has(page, "catalogs: Cat &lt;A&gt; <span class=\"demo\">(includes invented demo data"));
  CHECK(has(page, "<li>stock: cold &amp; store.json</li>"));
  CHECK(has(page, "Written 2026-12-01 by bine 9.9.9."));
  CHECK(has(page, "<meta name=\"viewport\""));
  CHECK(has(page, "@media print"));
  CHECK_FALSE(has(page, "<script"));
  CHECK_FALSE(has(page, "http:"));
  CHECK_FALSE(has(page, "https:"));
  CHECK_FALSE(has(page, "@import"));
  CHECK_FALSE(has(page, "url(http"));
}

TEST_CASE("html table: headings, escaped cells with their column label, JSON pointers and a total row") {
  html::Table table("Cap & tion", {{"variety"}, {"weigh", true}});
  table.add_row({"A<b>", html::mass_cell(1360.0, UnitSystem::metric, "/x/0/grams")});
  table.set_total({"total", html::number_cell(0.256, 1, " %", "/share", 100.0)});
  const std::string out = table.str();
  CHECK(has(out, "<caption>Cap &amp; tion</caption>"));
  CHECK(has(out, "<th scope=\"col\" class=\"num\">weigh</th>"));
  CHECK(has(out, "<td data-label=\"variety\">A&lt;b&gt;</td>"));
  // 1360 g is written in kg (format_mass from 1000 g up): the factor from the JSON's grams is 0.001.
  CHECK(has(out, "<td data-label=\"weigh\" class=\"num\" data-json=\"/x/0/grams\" data-scale=\"0.001\">1.36 kg</td>"));
  // A share of 0.256 shown in % (x 100, one decimal: 25.6).
  CHECK(has(out, "<tfoot>\n<tr><td data-label=\"variety\">total</td>"));
  CHECK(has(out, "data-json=\"/share\" data-scale=\"100\">25.6 %</td>"));
}

TEST_CASE("html cells: US masses carry the exact ounce and pound factors, Fahrenheit is not tied to JSON") {
  // 1 oz = 28.349523125 g and 1 lb = 453.59237 g exactly (NIST Handbook 44): 56.7 g = 2.00 oz.
  const html::Cell oz = html::mass_cell(56.699046, UnitSystem::us, "/g");
  CHECK(oz.text == "2.00 oz");
  CHECK(oz.scale == doctest::Approx(1.0 / 28.349523125));
  const html::Cell lb = html::mass_cell(907.18474, UnitSystem::us, "/g");
  CHECK(lb.text == "2.00 lb");
  CHECK(lb.scale == doctest::Approx(1.0 / 453.59237));
  CHECK(html::temperature_cell(80.0, UnitSystem::us, "/t").json.empty());
  CHECK(html::temperature_cell(80.0, UnitSystem::metric, "/t").json == "/t");
  CHECK(html::temperature_cell(std::nullopt, UnitSystem::metric, "/t").text == "-");
}

TEST_CASE("svg chart: title and desc, labelled value axis, one bar per value with its JSON pointer") {
  html::BarChart chart;
  chart.id = "c1";
  chart.title = "IBU <per> addition";
  chart.description = "two bars";
  chart.axis_label = "bitterness (IBU)";
  chart.series = {"target", "result"};
  chart.rows.push_back({"1. Hop & Co", {30.0, 12.5}, {"30.0 IBU", "12.5 IBU"}, {"/a/0", "/a/1"}});
  const std::string svg = html::bar_chart(chart);
  CHECK(has(svg, "role=\"img\" aria-labelledby=\"c1-t c1-d\""));
  CHECK(has(svg, "<title id=\"c1-t\">IBU &lt;per&gt; addition</title>"));
  CHECK(has(svg, "<desc id=\"c1-d\">two bars</desc>"));
  CHECK(has(svg, ">bitterness (IBU)</text>"));
  CHECK(has(svg, ">1. Hop &amp; Co</text>"));
  CHECK(has(svg, "data-json=\"/a/0\">30.0 IBU</text>"));
  CHECK(has(svg, "data-json=\"/a/1\">12.5 IBU</text>"));
  // The second series is a pattern (hatched), not a second hue alone.
  CHECK(has(svg, "fill=\"url(#c1-p1)\""));
  CHECK(has(svg, "<pattern id=\"c1-p1\""));
  // Both series are named in the legend.
  CHECK(has(svg, ">target</text>"));
  CHECK(has(svg, ">result</text>"));
}

TEST_CASE("svg chart: ticks step by 1, 2 or 5 times a power of ten") {
  // Hand arithmetic: 47/5 = 9.4 -> 10; 4.8/5 = 0.96 -> 1; 5/5 = 1 -> 1; 120/5 = 24 -> 50; 0.3/5 = 0.06 -> 0.1.
  CHECK(html::tick_step(47.0, 5) == doctest::Approx(10.0));
  CHECK(html::tick_step(4.8, 5) == doctest::Approx(1.0));
  CHECK(html::tick_step(5.0, 5) == doctest::Approx(1.0));
  CHECK(html::tick_step(120.0, 5) == doctest::Approx(50.0));
  CHECK(html::tick_step(0.3, 5) == doctest::Approx(0.1));
}
