// The shared HTML writer (page frame, tables, charts) on hand-built content: names escaped, the
// caution box and the sources on every page (demo data marked), no script and no reference to
// anything outside the file, cells tied to their JSON values, each chart with a title and a text
// alternative, ticks at 1, 2 or 5 times a power of ten.
#include <doctest/doctest.h>

#include <string>

#include "report/html_cells.hpp"
#include "report/html_page.hpp"
#include "report/html_table.hpp"
#include "report/html_text.hpp"
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
  // The totals row's own label needs no column heading beside it on a phone's card.
  CHECK(has(out, "<tfoot>\n<tr><td data-label=\"\">total</td>"));
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

TEST_CASE("svg chart: text in CSS px (no viewBox), bars in percent of the plot, a note under the chart") {
  html::BarChart chart;
  chart.id = "c2";
  chart.title = "IBU per addition";
  chart.axis_label = "bitterness (IBU)";
  chart.axis_max = 40.0;
  chart.note = "Alpha of lot KS-25-007.";
  chart.rows.push_back({"1. Hop", {30.0}, {"30.0 IBU"}, {"/a/0"}});
  const std::string svg = html::bar_chart(chart);
  CHECK_FALSE(has(svg, "viewBox"));
  CHECK(has(svg, "width=\"100%\""));
  // Hand arithmetic: 30 IBU on an axis ending at 40 is 75 % of the plot; the value is written 4 px after it.
  CHECK(has(svg, "<rect x=\"0\" y=\""));
  CHECK(has(svg, "width=\"75.00%\""));
  CHECK(has(svg, "x=\"75.00%\" dx=\"4\""));
  CHECK(has(svg, "font-size=\"14\" font-weight=\"600\""));
  CHECK(has(svg, "<p class=\"chart-note\">Alpha of lot <span class=\"nb\">KS-25-007.</span></p>"));
}

TEST_CASE("svg chart: an axis ends at the first tick at or above the largest value") {
  // Hand arithmetic: 30.5 -> step 10 (30.5 / 5 = 6.1 -> 10) -> 40; 5 -> step 1 -> 5; nothing above 0 -> 1.
  CHECK(html::axis_end(30.5) == doctest::Approx(40.0));
  CHECK(html::axis_end(5.0) == doctest::Approx(5.0));
  CHECK(html::axis_end(0.0) == doctest::Approx(1.0));
}

TEST_CASE("svg chart: ticks step by 1, 2 or 5 times a power of ten") {
  // Hand arithmetic: 47/5 = 9.4 -> 10; 4.8/5 = 0.96 -> 1; 5/5 = 1 -> 1; 120/5 = 24 -> 50; 0.3/5 = 0.06 -> 0.1.
  CHECK(html::tick_step(47.0, 5) == doctest::Approx(10.0));
  CHECK(html::tick_step(4.8, 5) == doctest::Approx(1.0));
  CHECK(html::tick_step(5.0, 5) == doctest::Approx(1.0));
  CHECK(html::tick_step(120.0, 5) == doctest::Approx(50.0));
  CHECK(html::tick_step(0.3, 5) == doctest::Approx(0.1));
}

TEST_CASE("html text: a figure and its unit, a lot code, a date, a range, an option and a rank never break") {
  CHECK(html::text_html("12.3 % alpha") == "<span class=\"nb\">12.3 %</span> alpha");
  CHECK(html::text_html("(80 C for 20 min),") ==
        "<span class=\"nb\">(80 C</span> for <span class=\"nb\">20 min),</span>");
  CHECK(html::text_html("lot KS-25-007 on 2026-06-01:") ==
        "lot <span class=\"nb\">KS-25-007</span> on <span class=\"nb\">2026-06-01:</span>");
  CHECK(html::text_html("6.0-8.0%") == "<span class=\"nb\">6.0-8.0%</span>");
  CHECK(html::text_html("--rate or --oil-dose") == "--rate or <span class=\"nb\">--oil-dose</span>");
  CHECK(html::text_html("2. Clearbourne") == "<span class=\"nb\">2. Clearbourne</span>");
  // Words joined by a hyphen break there as words do; a number before a plain word is not a unit.
  CHECK(html::text_html("Late-hop stone-fruit") == "Late-hop stone-fruit");
  CHECK(html::text_html("of 14 candidates") == "of 14 candidates");
  // Escaped inside and out; a path longer than kMaxUnbroken (24) characters stays free to wrap.
  CHECK(html::text_html("A<1> 5 g") == "A&lt;1&gt; <span class=\"nb\">5 g</span>");
  CHECK(html::text_html("/work/descriptor-data/examples/pale-ale.json") ==
        "/work/descriptor-data/examples/pale-ale.json");
}

TEST_CASE("html text: a heading of three words or more wraps into two balanced lines at most") {
  // "alpha on brew day": halves "alpha on" (8) and "brew day" (8) beat "alpha" / "on brew day" (11).
  CHECK(html::heading_html("alpha on brew day") ==
        "<span class=\"nb\">alpha on</span> <span class=\"nb\">brew day</span>");
  CHECK(html::heading_min_chars("alpha on brew day") == 8);
  CHECK(html::heading_html("on hand") == "on hand");
  CHECK(html::heading_min_chars("on hand") == 4);
  CHECK(html::heading_min_chars("substitute, best first") == 11);  // "substitute," / "best first"
}

TEST_CASE("html table: a table that fits a phone stays a table, a wide one becomes cards") {
  // Two short columns: "figure"/"total bitterness" and "value"/"38.9 IBU" (8 characters kept
  // whole): about 16 x 8.6 px + 8 x 8.6 px + 2 x 14.4 px = 235 px, under the 336 px of a phone.
  html::Table narrow("", {{"figure"}, {"value", true}});
  narrow.add_row({"total bitterness", html::number_cell(38.9, 1, " IBU", "/ibu")});
  CHECK(narrow.phone_width() < html::kPhoneColumnPx);
  CHECK(has(narrow.str(), "<table class=\"sheet\">"));
  // Eight columns of figures with units cannot fit 336 px: cards, and each figure kept whole.
  std::vector<html::Column> columns;
  std::vector<html::Cell> row;
  for (int c = 0; c < 8; ++c) {
    columns.push_back({"weigh " + std::to_string(c), true});
    row.push_back(html::mass_cell(1234.0, UnitSystem::metric, "/g"));
  }
  html::Table wide("", columns);
  wide.add_row(row);
  CHECK(wide.phone_width() > html::kPhoneColumnPx);
  CHECK(has(wide.str(), "<table class=\"sheet cards\">"));
}

TEST_CASE("html table: on a card, long text and a figure too wide for half a card take the whole width") {
  html::Table table("", {{"lot", false, true}, {"note"}, {"total oil", true}, {"days", true}});
  // "more tropical, less citrus" is 26 characters, over the 18 that share a card's row. The range
  // "1.2-2.0 mL/100 g" (16 characters, 138 px) beside "total" (5 bold, 47 px) is wider than half a
  // card ((336 - 14.4) / 2 - 8 = 152.8 px); "12 days" beside "days" is not.
  table.add_row({"KS-1", "more tropical, less citrus", "1.2-2.0 mL/100 g", "12 days"});
  const std::string out = table.str();
  CHECK(has(out, "data-label=\"note\" class=\"long\">"));
  CHECK(has(out, "data-label=\"total oil\" class=\"num long\">"));
  CHECK(has(out, "data-label=\"days\" class=\"num\">12 days</td>"));
  CHECK(has(out, "data-label=\"lot\" class=\"code\">KS-1</td>"));
}
