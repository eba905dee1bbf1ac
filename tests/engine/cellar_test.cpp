// Lots on the brew day: ageing, HSI as a state, stale flags. Check values from docs/methods.md
// (derived from Garetz M. 1994, Brewing Techniques 2(1), and the HSI relation after Nickerson &
// Likens 1979, J. Am. Soc. Brew. Chem. 37:184), and hand arithmetic written out beside each check.
#include "engine/cellar.hpp"

#include <doctest/doctest.h>

#include <cmath>

#include "engine/blend.hpp"
#include "engine/substitutes.hpp"
#include "io/data_dir.hpp"
#include "model/errors.hpp"

namespace {

bine::Date day(const char* text) { return *bine::parse_date(text); }

bine::Variety keeper(double stability) {
  bine::Variety v;
  v.name = "Keeper";
  v.alpha_acid = bine::Range{8.0, 10.0};
  v.total_oil = bine::Range{1.0, 2.0};
  v.stability = stability;
  v.aroma = std::map<std::string, double>{{"citrus", 4.0}};
  return v;
}

bine::Lot lot(const char* code, double alpha, const char* packaged, double celsius, bine::Package package) {
  bine::Lot l;
  l.variety = "Keeper";
  l.lot = code;
  l.alpha_acid = alpha;
  l.packaged = day(packaged);
  l.storage = bine::Storage{celsius, package};
  l.on_hand_g = 500.0;
  return l;
}

}  // namespace

TEST_CASE("HSI is a state: the certificate alpha from the same analysis is aged at the variety's rate") {
  // docs/methods.md#hsi check value (derived, Garetz 1994): certificate 9.0 % with HSI 0.31 analysed
  // 2026-01-10, sealed at 4 C, variety stability 80 %, on 2026-12-01 (325 days) -> 7.79 %.
  // Hand: k = ln(100/80)/180 = 0.0012397 per day; TF = 2^((4-20)/15) = 0.47741; SF 0.75;
  // exp(-0.0012397 x 0.47741 x 0.75 x 325) = exp(-0.14426) = 0.86566; 9.0 x 0.86566 = 7.791 %.
  bine::Lot with_hsi = lot("K-1", 9.0, "2026-01-10", 4.0, bine::Package::sealed);
  with_hsi.hsi = 0.31;
  const bine::Variety variety = keeper(80.0);
  const bine::CellarLot aged = bine::lot_on_brew_day(with_hsi, 0, &variety, day("2026-12-01"));
  CHECK(aged.days == 325);
  CHECK(aged.basis == bine::AlphaBasis::aged);
  CHECK(*aged.alpha_today == doctest::Approx(7.79).epsilon(1e-3));
  // The HSI's own state, Garetz 1994: 110 x log10(0.31 / 0.25) = 10.3 % lost before the analysis.
  REQUIRE(aged.hsi_loss_percent.has_value());
  CHECK(*aged.hsi_loss_percent == doctest::Approx(10.3).epsilon(5e-3));
  CHECK(aged.hsi_state == bine::HsiState::ageing);  // 0.30-0.45: ageing (common practice, from memory)
  CHECK_FALSE(aged.stale);
}

TEST_CASE("a poor HSI never makes a lot fresher than one without, and there is no jump at HSI 0.25") {
  const bine::Variety variety = keeper(65.0);
  const bine::Lot plain = lot("P-1", 10.0, "2025-10-01", 2.0, bine::Package::vacuum);
  const double reference = *bine::lot_on_brew_day(plain, 0, &variety, day("2026-09-01")).alpha_today;
  for (const double hsi : {0.20, 0.2499, 0.25, 0.2501, 0.31, 0.40, 0.60, 1.2}) {
    bine::Lot measured = plain;
    measured.hsi = hsi;
    const bine::CellarLot aged = bine::lot_on_brew_day(measured, 0, &variety, day("2026-09-01"));
    CAPTURE(hsi);
    // The HSI never sets the storage rate: the alpha today is the same as the lot without one.
    CHECK(*aged.alpha_today <= reference + 1e-12);
    CHECK(*aged.alpha_today == doctest::Approx(reference));
  }
  // The relation is continuous at 0.25 (Garetz 1994): 110 x log10(0.2501 / 0.25) = 0.0191 %.
  CHECK(bine::percent_lost_from_hsi(0.2501) == doctest::Approx(0.0191).epsilon(1e-2));
  CHECK(bine::percent_lost_from_hsi(0.20) == 0.0);  // docs/methods.md: clamped, fresh
  CHECK(bine::percent_lost_from_hsi(0.40) == doctest::Approx(22.5).epsilon(3e-3));
}

TEST_CASE("stale: below the share of the certificate alpha, or an oxidised HSI") {
  // Hand (Garetz 1994): stability 50 %, 20 C, open, 180 days leave exactly 50 % (k's definition) -> stale
  // below 75 %. 60 days leave exp(-ln 2 / 180 x 60) = 2^(-1/3) = 0.7937 -> fresh at 75 %, stale at 80 %.
  const bine::Variety variety = keeper(50.0);
  const bine::Lot old_lot = lot("OLD", 10.0, "2026-01-01", 20.0, bine::Package::open);
  const bine::CellarLot half = bine::lot_on_brew_day(old_lot, 0, &variety, day("2026-06-30"));
  CHECK(half.days == 180);
  CHECK(half.remaining == doctest::Approx(0.5));
  CHECK(half.stale);
  CHECK(half.stale_reason.find("50 % of its certificate alpha left") != std::string::npos);
  const bine::CellarLot young = bine::lot_on_brew_day(old_lot, 0, &variety, day("2026-03-02"));
  CHECK(young.days == 60);
  CHECK(young.remaining == doctest::Approx(std::pow(2.0, -1.0 / 3.0)));
  CHECK_FALSE(young.stale);
  bine::CellarSettings strict;
  strict.stale_below = 0.80;
  CHECK(bine::lot_on_brew_day(old_lot, 0, &variety, day("2026-03-02"), strict).stale);
  // Oxidised above HSI 0.45 (common practice, from memory), however little time has passed.
  bine::Lot oxidised = lot("OX", 10.0, "2026-03-01", -20.0, bine::Package::vacuum);
  oxidised.hsi = 0.52;
  const bine::CellarLot ox = bine::lot_on_brew_day(oxidised, 0, &variety, day("2026-03-02"));
  CHECK(ox.hsi_state == bine::HsiState::oxidised);
  CHECK(ox.stale);
  CHECK(ox.stale_reason.find("oxidised") != std::string::npos);
}

TEST_CASE(
    "a lot without alpha uses the catalog midpoint and says so, and a lot packaged after the brew day is refused") {
  const bine::Variety variety = keeper(65.0);
  bine::Lot bare;
  bare.variety = "Keeper";
  bare.on_hand_g = 100.0;
  const bine::CellarLot aged = bine::lot_on_brew_day(bare, 2, &variety, day("2026-12-01"));
  CHECK(aged.basis == bine::AlphaBasis::catalog_midpoint);
  CHECK(*aged.alpha_today == doctest::Approx(9.0));  // (8 + 10) / 2
  CHECK(aged.alpha_note.find("catalog midpoint") != std::string::npos);
  CHECK(aged.code == "lot 3");
  bine::Stock stock;
  stock.source_file = "s.json";
  stock.lots = {lot("LATE", 9.0, "2026-12-02", 0.0, bine::Package::vacuum)};
  bine::Catalog catalog;
  catalog.varieties = {variety};
  CHECK_THROWS_AS(bine::age_cellar(stock, catalog, day("2026-12-01")), bine::InputError);
}

TEST_CASE("blend candidates carry the alpha on the brew day, and stale lots only when allowed") {
  const bine::Lexicon lexicon = bine::load_data({BINE_TEST_DIR "/../descriptor-data", "test data"}, {}).lexicon;
  bine::Catalog catalog;
  catalog.varieties = {keeper(50.0)};
  bine::Stock stock;
  // Warm store: 20 C open, stability 50 %, 60 days -> 10 x 2^(-1/3) = 7.937 % (hand, Garetz 1994).
  stock.lots = {lot("WARM", 10.0, "2026-01-01", 20.0, bine::Package::open),
                lot("OLD", 10.0, "2025-09-03", 20.0, bine::Package::open)};  // 180 days: 50 % left, stale
  const bine::Cellar cellar = bine::age_cellar(stock, catalog, day("2026-03-02"));
  const bine::CandidateSet fresh_only = bine::blend_candidates(catalog, lexicon, &cellar, "");
  REQUIRE(fresh_only.candidates.size() == 1);
  CHECK(fresh_only.candidates[0].lot == "WARM");
  CHECK(fresh_only.candidates[0].alpha_percent == doctest::Approx(10.0 * std::pow(2.0, -1.0 / 3.0)));
  bool noted = false;
  for (const auto& note : fresh_only.notes) noted |= note.find("OLD") != std::string::npos;
  CHECK(noted);
  const bine::CandidateSet all = bine::blend_candidates(catalog, lexicon, &cellar, "", true);
  REQUIRE(all.candidates.size() == 2);
  CHECK(all.candidates[1].alpha_percent == doctest::Approx(5.0));
}

TEST_CASE("swap ranks a stale lot below every fresh lot") {
  const bine::Lexicon lexicon = bine::load_data({BINE_TEST_DIR "/../descriptor-data", "test data"}, {}).lexicon;
  bine::Catalog catalog;
  bine::Variety missing = keeper(50.0);
  missing.name = "Gone";
  bine::Variety near = keeper(50.0);  // the same aroma as the missing variety
  bine::Variety far = keeper(50.0);
  far.name = "Far";
  far.aroma = std::map<std::string, double>{{"citrus", 1.0}, {"pine", 4.0}};
  catalog.varieties = {missing, near, far};
  bine::Stock stock;
  bine::Lot far_lot = lot("F-1", 10.0, "2026-01-01", -18.0, bine::Package::vacuum);
  far_lot.variety = "Far";
  stock.lots = {lot("K-OLD", 10.0, "2025-09-03", 20.0, bine::Package::open), far_lot};
  const bine::Cellar cellar = bine::age_cellar(stock, catalog, day("2026-03-02"));
  bine::SwapRequest request;
  request.missing = "Gone";
  request.cellar = &cellar;
  const bine::SwapResult result = bine::find_substitutes(catalog, lexicon, request);
  REQUIRE(result.substitutes.size() == 2);
  CHECK(result.substitutes[0].lot->lot == "F-1");  // fresh, though far less similar
  CHECK(result.substitutes[1].lot->lot == "K-OLD");
  CHECK(result.substitutes[1].stale);
  CHECK(result.substitutes[1].similarity > result.substitutes[0].similarity);
}
