// Substitute ranking: a renamed copy comes first, stock restriction, amount factors and pair shares by
// hand arithmetic, aged lot alpha against the docs/methods.md check value (Garetz 1994).
#include "engine/substitutes.hpp"

#include <doctest/doctest.h>

#include <nlohmann/json.hpp>
#include <set>

#include "io/data_dir.hpp"
#include "io/file_io.hpp"
#include "io/loaders.hpp"
#include "model/errors.hpp"

namespace {

bine::DataSet demo_data() { return bine::load_data({BINE_TEST_DIR "/../descriptor-data", "test data"}, {}); }

bine::Variety variety(const std::string& name, std::map<std::string, double> aroma) {
  bine::Variety v;
  v.name = name;
  if (!aroma.empty()) v.aroma = std::move(aroma);
  return v;
}

}  // namespace

TEST_CASE("a renamed copy of a variety in a user catalog is its first substitute at >= 99") {
  const bine::DataSet data = demo_data();
  const auto demo = nlohmann::json::parse(bine::read_text_file(BINE_TEST_DIR "/../descriptor-data/catalog/demo.json"));
  for (const std::string name : {"Tidewell", "Keelstone", "Mossgate"}) {
    nlohmann::json copy;
    for (const auto& entry : demo["varieties"])
      if (entry["name"] == name) copy = entry;
    REQUIRE(copy.is_object());
    copy["name"] = name + " Copy";
    const nlohmann::json user{{"catalog", {{"name", "user test catalog"}}}, {"varieties", {copy}}};
    const bine::Catalog mine = bine::parse_catalog(user.dump(), "mine.json", data.lexicon);
    const bine::Catalog merged = bine::merge_catalogs({data.catalog, mine});
    for (const auto purpose : {bine::SwapPurpose::aroma, bine::SwapPurpose::bittering}) {
      bine::SwapRequest request;
      request.missing = name;
      request.purpose = purpose;
      const auto result = bine::find_substitutes(merged, data.lexicon, request);
      REQUIRE_FALSE(result.substitutes.empty());
      CHECK(result.substitutes.front().variety.name == name + " Copy");
      CHECK(result.substitutes.front().similarity >= 99.0);
      CHECK(result.substitutes.front().amount_factor == doctest::Approx(1.0));
      CHECK(result.substitutes.size() == 5);
      for (const auto& s : result.substitutes) CHECK(s.variety.name != name);
    }
  }
}

TEST_CASE("with stock only lots on hand of catalog varieties are ranked") {
  const bine::DataSet data = demo_data();
  bine::Stock stock = bine::load_stock(BINE_TEST_DIR "/../descriptor-data/examples/stock.json");
  bine::Lot empty = stock.lots.front();
  empty.lot = "EMPTY-1";
  empty.on_hand_g = 0.0;
  stock.lots.push_back(empty);
  std::set<std::string> stocked;
  for (const auto& lot : stock.lots)
    if (lot.on_hand_g && *lot.on_hand_g > 0.0 && lot.variety != "Tidewell") stocked.insert(lot.lot);

  bine::SwapRequest request;
  request.missing = "Tidewell";
  const bine::Cellar cellar = bine::age_cellar(stock, data.catalog, *bine::parse_date("2026-12-01"));
  request.cellar = &cellar;
  request.top = 100;
  const auto result = bine::find_substitutes(data.catalog, data.lexicon, request);
  CHECK(result.from_stock);
  std::set<std::string> seen;
  for (const auto& s : result.substitutes) {
    REQUIRE(s.lot.has_value());
    CHECK(stocked.count(s.lot->lot) == 1);
    CHECK(s.variety.name != "Tidewell");  // the missing variety's own lots are not substitutes
    seen.insert(s.lot->lot);
  }
  CHECK(seen == stocked);  // every stocked lot is ranked when --top is large enough
}

TEST_CASE("a stock lot of a variety no loaded catalog knows is refused with the closest names") {
  const bine::DataSet data = demo_data();
  bine::Stock stock = bine::load_stock(BINE_TEST_DIR "/../descriptor-data/examples/stock.json");
  bine::Lot typo = stock.lots.front();
  typo.lot = "TYPO-1";
  typo.variety = "Tidewel";  // one letter short of the demo catalog's Tidewell
  stock.lots.push_back(typo);
  const std::string where = "/lots/" + std::to_string(stock.lots.size() - 1) + "/variety";
  try {
    const bine::Cellar cellar = bine::age_cellar(stock, data.catalog, *bine::parse_date("2026-12-01"));
    FAIL("age_cellar accepted a lot of an unknown variety among " << cellar.lots.size() << " lots");
  } catch (const bine::InputError& error) {
    const std::string message = error.what();
    CHECK(message.find(where) != std::string::npos);
    CHECK(message.find("\"Tidewel\"") != std::string::npos);
    CHECK(message.find("did you mean Tidewell") != std::string::npos);
  }
}

TEST_CASE("amount factors by hand") {
  const bine::DataSet data = demo_data();
  bine::Catalog catalog;
  bine::Variety missing = variety("Gone", {{"citrus", 4.0}});
  missing.total_oil = bine::Range{1.0, 1.4};   // midpoint 1.2 mL/100 g
  missing.alpha_acid = bine::Range{6.0, 8.0};  // midpoint 7.0 %
  bine::Variety other = variety("Other", {{"citrus", 3.0}});
  other.total_oil = bine::Range{1.6, 2.0};                // midpoint 1.8 mL/100 g
  other.alpha_acid = bine::Range{13.0, 15.0};             // midpoint 14.0 %
  other.stability = 50.0;                                 // % left after 6 months: PL 50
  bine::Variety dry = variety("Dry", {{"citrus", 2.0}});  // no oil, no alpha
  catalog.varieties = {missing, other, dry};

  bine::SwapRequest request;
  request.missing = "Gone";
  auto factor_of = [](const bine::SwapResult& r, const std::string& name) {
    for (const auto& s : r.substitutes)
      if (s.variety.name == name) return s.amount_factor;
    FAIL("no substitute " << name);
    return std::optional<double>{};
  };
  // Aroma: oil delivered holds, 1.2 / 1.8 = 0.66667 g per g.
  auto aroma = bine::find_substitutes(catalog, data.lexicon, request);
  CHECK(factor_of(aroma, "Other") == doctest::Approx(0.66667).epsilon(1e-4));
  CHECK_FALSE(factor_of(aroma, "Dry").has_value());  // never guessed
  // Bittering: IBU holds, 7.0 / 14.0 = 0.5.
  request.purpose = bine::SwapPurpose::bittering;
  auto bitter = bine::find_substitutes(catalog, data.lexicon, request);
  CHECK(factor_of(bitter, "Other") == doctest::Approx(0.5));

  // From stock: a lot at 6.0 % alpha, PL 50, vacuum, -18 C, 365 days. docs/methods.md check value
  // (Garetz 1994): 5.31 % today. Factor 7.0 / 5.3145 = 1.3172 (hand: k = ln 2 / 180 = 0.0038508,
  // TF = 2^(-38/15) = 0.17263, SF 0.5, exp(-0.0038508 x 0.17263 x 0.5 x 365) = 0.88575).
  bine::Stock stock;
  bine::Lot lot;
  lot.variety = "Other";
  lot.lot = "OT-1";
  lot.alpha_acid = 6.0;
  lot.total_oil = 1.5;
  lot.packaged = *bine::parse_date("2025-01-01");
  lot.storage = bine::Storage{-18.0, bine::Package::vacuum};
  lot.on_hand_g = 1000.0;
  stock.lots.push_back(lot);
  const bine::Cellar cellar = bine::age_cellar(stock, catalog, *bine::parse_date("2026-01-01"));
  request.cellar = &cellar;
  bitter = bine::find_substitutes(catalog, data.lexicon, request);
  REQUIRE(bitter.substitutes.size() == 1);
  CHECK(*bitter.substitutes[0].alpha_today == doctest::Approx(5.31).epsilon(2e-3));
  CHECK(*bitter.substitutes[0].amount_factor == doctest::Approx(1.3172).epsilon(1e-3));
  // Aroma from stock uses the lot's oil: 1.2 / 1.5 = 0.8.
  request.purpose = bine::SwapPurpose::aroma;
  aroma = bine::find_substitutes(catalog, data.lexicon, request);
  CHECK(*aroma.substitutes[0].amount_factor == doctest::Approx(0.8));
}

TEST_CASE("differences in words and two-hop shares by hand") {
  CHECK(bine::differences_in_words({{"pine", 1.5}, {"citrus", -2.0}}) == "more pine, less citrus");
  CHECK(bine::differences_in_words({}) == "close on every aroma axis");
  // minimise (4a - 1)^2 + (4(1 - a) - 3)^2: derivative 8(4a - 1) - 8(1 - 4a) = 0 -> a = 0.25.
  Eigen::VectorXd x(2), y(2), t(2);
  x << 4, 0;
  y << 0, 4;
  t << 1, 3;
  auto shares = bine::two_hop_shares(x, y, t);
  CHECK(shares[0] == doctest::Approx(0.25));
  CHECK(shares[1] == doctest::Approx(0.75));
  // Target (5, 0): unconstrained a = 9/8 > 1, clamped to the first hop alone.
  t << 5, 0;
  shares = bine::two_hop_shares(x, y, t);
  CHECK(shares[0] == doctest::Approx(1.0));
  CHECK(shares[1] == doctest::Approx(0.0).epsilon(1e-9));
}

TEST_CASE("a pair beats the best single substitute when the missing hop sits between two others") {
  const bine::DataSet data = demo_data();
  bine::Catalog catalog;
  catalog.varieties = {variety("Both", {{"citrus", 4.0}, {"pine", 4.0}}), variety("Citrusy", {{"citrus", 4.0}}),
                       variety("Piney", {{"pine", 4.0}})};
  bine::SwapRequest request;
  request.missing = "Both";
  request.pairs = true;
  const auto result = bine::find_substitutes(catalog, data.lexicon, request);
  // Single: cosine (4 x 4) / (4 x sqrt(32)) = 0.70711 -> 70.7. Pair 50/50: (2, 2) is parallel to
  // (4, 4) -> 100.
  REQUIRE(result.substitutes.size() == 2);
  CHECK(result.substitutes[0].similarity == doctest::Approx(70.711).epsilon(1e-4));
  CHECK(result.substitutes[0].differences.size() == 1);  // "less pine" (or citrus): one gap of 4
  REQUIRE(result.pairs.size() == 1);
  CHECK(result.pairs[0].shares[0] == doctest::Approx(0.5));
  CHECK(result.pairs[0].similarity == doctest::Approx(100.0));
}

TEST_CASE("unknown variety and empty choices are reported, not crashed on") {
  const bine::DataSet data = demo_data();
  bine::SwapRequest request;
  request.missing = "Tidewel";
  CHECK_THROWS_AS(bine::find_substitutes(data.catalog, data.lexicon, request), bine::InputError);
  bine::Catalog lonely;
  lonely.varieties = {variety("Alone", {{"citrus", 3.0}})};
  request.missing = "Alone";
  CHECK_THROWS_AS(bine::find_substitutes(lonely, data.lexicon, request), bine::Infeasible);
}
