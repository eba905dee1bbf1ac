// Tests of the blend engine: amounts and IBU held exactly, stock limits, a single-variety target,
// and infeasible requests. Candidates are hand-made vectors (not demo data); expected values are
// worked by hand in the comments or come from the bitterness engine's own published formulas.
#include "engine/blend.hpp"

#include <doctest/doctest.h>

#include <random>
#include <string>

#include "engine/bitterness.hpp"
#include "model/errors.hpp"

namespace {

using bine::BlendCandidate;
using bine::BlendRequest;

Eigen::VectorXd axes(std::initializer_list<std::pair<int, double>> values) {
  Eigen::VectorXd v = Eigen::VectorXd::Zero(14);
  for (auto [axis, value] : values) v[axis] = value;
  return v;
}

BlendCandidate candidate(std::string name, Eigen::VectorXd aroma, double oil, double alpha) {
  BlendCandidate c;
  c.variety = std::move(name);
  c.aroma = std::move(aroma);
  c.oil_ml_per_100g = oil;
  c.alpha_percent = alpha;
  return c;
}

/// 20 L at 1.050, 4 g/L late (80 g), 30 % whirlpool at 80 C for 20 min, 35 IBU, 12 % bittering hop.
BlendRequest brew() {
  BlendRequest request;
  request.wort = {20.0, 1.050, 60.0, 0.0};
  request.amount = 80.0;
  request.whirlpool_share = 0.3;
  request.target_ibu = 35.0;
  bine::BitteringHop bittering;
  bittering.variety = "bitter";
  bittering.alpha_percent = 12.0;
  request.bittering = bittering;
  return request;
}

std::vector<bool> named(std::initializer_list<int> list) {
  std::vector<bool> n(14, false);
  for (int a : list) n[static_cast<std::size_t>(a)] = true;
  return n;
}

/// IBU of the blend recomputed addition by addition through the bitterness engine.
double recomputed_ibu(const bine::BlendResult& result, const BlendRequest& request) {
  double total = request.kept_ibu;
  for (const auto& part : result.parts) {
    bine::HopAddition hop;
    hop.grams = part.whirlpool_g;
    hop.use = bine::HopUse::whirlpool;
    hop.minutes = request.whirlpool_minutes;
    hop.temperature_c = request.whirlpool_temperature_c;
    hop.form = part.form;
    total += bine::addition_bitterness(hop, part.alpha_percent, request.wort, request.bitterness).ibu;
  }
  if (result.bittering) {
    bine::HopAddition hop;
    hop.grams = result.bittering_grams;
    hop.use = bine::HopUse::boil;
    hop.minutes = result.bittering->minutes;
    hop.form = result.bittering->form;
    total += bine::addition_bitterness(hop, result.bittering->alpha_percent, request.wort, request.bitterness).ibu;
  }
  return total;
}

}  // namespace

TEST_CASE("two complementary hops meet a two-axis target exactly; grams follow the oil (hand arithmetic)") {
  // A: citrus 4 (oil 1.0 mL/100 g); B: floral 4 (oil 2.0). Target citrus 2, floral 2: x = (1/2, 1/2),
  // P = (2, 2), J = 0. Grams: g_i proportional to x_i / O_i = 0.5 and 0.25, so of 80 g
  // A gets 80 x 0.5 / 0.75 = 53.33 g and B 26.67 g; whirlpool 30 %: 16.0 g and 8.0 g.
  BlendRequest request = brew();
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("B", axes({{5, 4.0}}), 2.0, 6.0),
                        candidate("C", axes({{12, 5.0}}), 1.5, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 2.0}, {5, 2.0}}), named({0, 5}), 0.25);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 2);
  CHECK(result.fit == doctest::Approx(0.0).epsilon(1e-6));
  const auto& a = result.parts[0].variety == "A" ? result.parts[0] : result.parts[1];
  const auto& b = result.parts[0].variety == "A" ? result.parts[1] : result.parts[0];
  CHECK(a.oil_share == doctest::Approx(0.5));
  CHECK(a.grams == doctest::Approx(53.333).epsilon(1e-4));
  CHECK(b.grams == doctest::Approx(26.667).epsilon(1e-4));
  CHECK(a.whirlpool_g == doctest::Approx(16.0));
  CHECK(result.late_grams == doctest::Approx(80.0));  // 4 g/L x 20 L
  // Oil delivered: 53.33 g x 1.0/100 + 26.67 g x 2.0/100 = 1.0667 mL.
  CHECK(result.oil_ml == doctest::Approx(1.0667).epsilon(1e-4));
}

TEST_CASE("a target equal to one variety's profile returns that variety alone with fit 0") {
  BlendRequest request = brew();
  const Eigen::VectorXd profile = axes({{0, 3.0}, {1, 2.0}, {5, 1.5}});
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("twin", profile, 1.2, 5.0),
                        candidate("B", axes({{1, 4.0}, {5, 1.0}}), 2.0, 6.0)};
  request.target = bine::target_like(profile);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 1);
  CHECK(result.parts[0].variety == "twin");
  CHECK(result.parts[0].oil_share == doctest::Approx(1.0));
  CHECK(result.fit == doctest::Approx(0.0).epsilon(1e-9));
}

TEST_CASE("local search finds a complementary pair that the pool leaves out (hand arithmetic)") {
  // Target citrus 3, floral 3 (axes 0, 1; the other axes weigh 0.25 at target 0). A = (citrus 5,
  // floral 1) and B = (citrus 1, floral 5): x = (1/2, 1/2) gives P = (3, 3), J = 0. No other blend
  // reaches 0: 30 near candidates (3, 3) carry 1.0 on axis 2 (J = 0.25 x 1 = 0.25 each, and any mix
  // keeps axis 2 at 1), 10 strong citrus (5, 4.5) and 10 strong floral (4.5, 5) have citrus + floral
  // = 9.5, above the target's 6. The pool takes the 24 nearest (near candidates, J 0.25 < J of A =
  // 4 + 4 = 8) and the 8 strongest per axis (the strong ones come first in the list and tie A and B
  // at score 5), so neither A nor B is in it.
  BlendRequest request = brew();
  for (int i = 0; i < 30; ++i)
    request.candidates.push_back(candidate("near" + std::to_string(i), axes({{0, 3.0}, {1, 3.0}, {2, 1.0}}), 1.5, 5.0));
  for (int i = 0; i < 10; ++i)
    request.candidates.push_back(candidate("citrus" + std::to_string(i), axes({{0, 5.0}, {1, 4.5}}), 1.5, 5.0));
  for (int i = 0; i < 10; ++i)
    request.candidates.push_back(candidate("floral" + std::to_string(i), axes({{0, 4.5}, {1, 5.0}}), 1.5, 5.0));
  request.candidates.push_back(candidate("A", axes({{0, 5.0}, {1, 1.0}}), 1.5, 5.0));
  request.candidates.push_back(candidate("B", axes({{0, 1.0}, {1, 5.0}}), 1.5, 5.0));
  request.target = bine::target_from_spec(axes({{0, 3.0}, {1, 3.0}}), named({0, 1}), 0.25);
  SUBCASE("the pool alone misses it") {
    request.pool.swap_rounds = 0;
    CHECK(bine::design_blend(request).objective > 0.01);
  }
  SUBCASE("local search finds A and B half and half") {
    const auto result = bine::design_blend(request);
    CHECK(result.objective == doctest::Approx(0.0).epsilon(1e-9));
    REQUIRE(result.parts.size() == 2);
    CHECK(result.parts[0].oil_share == doctest::Approx(0.5));
    CHECK(result.parts[1].oil_share == doctest::Approx(0.5));
    CHECK(((result.parts[0].variety == "A" && result.parts[1].variety == "B") ||
           (result.parts[0].variety == "B" && result.parts[1].variety == "A")));
  }
}

TEST_CASE("total IBU equals the target to 0.05 IBU in every blend (100 random requests)") {
  std::mt19937 random(42u);
  std::uniform_real_distribution<double> unit(0.0, 1.0);
  int feasible = 0;
  for (int trial = 0; trial < 100; ++trial) {
    CAPTURE(trial);
    BlendRequest request = brew();
    for (int i = 0; i < 30; ++i) {
      Eigen::VectorXd aroma = Eigen::VectorXd::Zero(14);
      for (int k = 0; k < 3; ++k) aroma[static_cast<Eigen::Index>(unit(random) * 14)] = 1.0 + 4.0 * unit(random);
      request.candidates.push_back(
          candidate("v" + std::to_string(i), aroma, 0.5 + 2.5 * unit(random), 3.0 + 12.0 * unit(random)));
    }
    request.target_ibu = 10.0 + 50.0 * unit(random);
    request.kept_ibu = unit(random) < 0.5 ? 4.0 * unit(random) : 0.0;
    request.whirlpool_share = unit(random);
    request.amount = 20.0 * (1.0 + 9.0 * unit(random));  // 1-10 g/L
    request.target =
        bine::target_from_spec(axes({{static_cast<int>(unit(random) * 14), 4.0}, {0, 2.0}}), named({0}), 0.25);
    request.target.named[0] = true;
    // Least whirlpool IBU any blend can give: every gram in the least bitter candidate.
    double least = 1e300;
    for (const auto& c : request.candidates)
      least = std::min(least, request.amount * request.whirlpool_share * bine::whirlpool_ibu_per_gram(c, request));
    try {
      const auto result = bine::design_blend(request);
      ++feasible;
      CHECK(std::abs(result.total_ibu - request.target_ibu) <= 0.05);
      CHECK(std::abs(recomputed_ibu(result, request) - request.target_ibu) <= 0.05);
      CHECK(result.bittering_grams >= 0.0);
      CHECK(result.late_grams == doctest::Approx(request.amount));
    } catch (const bine::Infeasible&) {
      // Only when even the least bitter candidate alone overshoots the IBU left for late hops.
      CHECK(least > request.target_ibu - request.kept_ibu);
    }
  }
  CHECK(feasible >= 80);
}

TEST_CASE("without a bittering charge the late hops give exactly the IBU left") {
  BlendRequest request = brew();
  request.bittering.reset();
  request.whirlpool_share = 1.0;
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0), candidate("B", axes({{5, 4.0}}), 2.0, 14.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  // 80 g of A alone at 6 % gives some IBU u_A; ask for a bit more so B must come in.
  const double a_only = 80.0 * bine::whirlpool_ibu_per_gram(request.candidates[0], request);
  request.target_ibu = a_only * 1.2;
  const auto result = bine::design_blend(request);
  CHECK(result.parts.size() == 2);
  CHECK(std::abs(result.total_ibu - request.target_ibu) <= 0.05);
  CHECK(std::abs(recomputed_ibu(result, request) - request.target_ibu) <= 0.05);
}

TEST_CASE("stock limits hold for the blend and the bittering lot") {
  BlendRequest request = brew();
  auto a = candidate("A", axes({{0, 4.0}}), 1.0, 6.0);
  a.lot = "A-1";
  a.on_hand_g = 30.0;  // less than the 53 g the free optimum would use
  auto b = candidate("B", axes({{5, 4.0}}), 2.0, 6.0);
  b.lot = "B-1";
  b.on_hand_g = 500.0;
  auto a2 = candidate("A", axes({{0, 4.0}}), 1.0, 6.0);
  a2.lot = "A-2";
  a2.on_hand_g = 10.0;
  request.candidates = {a, b, a2};
  request.bittering->lot = "X-1";
  request.bittering->on_hand_g = 1000.0;
  request.target = bine::target_from_spec(axes({{0, 2.0}, {5, 2.0}}), named({0, 5}), 0.25);
  const auto result = bine::design_blend(request);
  for (const auto& part : result.parts) {
    CAPTURE(part.lot);
    const double on_hand = part.lot == "A-1" ? 30.0 : part.lot == "A-2" ? 10.0 : 500.0;
    CHECK(part.grams <= on_hand + 1e-6);
    REQUIRE(part.left_g);
    CHECK(*part.left_g >= -1e-6);
  }
  CHECK(result.late_grams == doctest::Approx(80.0));
  // Bittering limited to 5 g: the late hops cannot lower the needed charge enough -> infeasible.
  request.bittering->on_hand_g = 5.0;
  CHECK_THROWS_AS(bine::design_blend(request), bine::Infeasible);
}

TEST_CASE("oil dose fixes the oil delivered: grams = dose / oil content (docs/methods.md, derived)") {
  // 1.5 mL/hL over 20 L = 0.3 mL of oil. One hop at 1.5 mL/100 g: 0.3 / 0.015 = 20 g.
  BlendRequest request = brew();
  request.amount_kind = bine::LateAmount::oil_ml;
  request.amount = 0.3;
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.5, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  const auto result = bine::design_blend(request);
  REQUIRE(result.parts.size() == 1);
  CHECK(result.parts[0].grams == doctest::Approx(20.0));
  CHECK(result.oil_ml == doctest::Approx(0.3));
}

TEST_CASE("infeasible requests say why") {
  BlendRequest request = brew();
  request.candidates = {candidate("A", axes({{0, 4.0}}), 1.0, 6.0)};
  request.target = bine::target_from_spec(axes({{0, 4.0}}), named({0}), 0.25);
  SUBCASE("kept boil additions already above the target") {
    request.kept_ibu = 40.0;
    CHECK_THROWS_WITH_AS(bine::design_blend(request), doctest::Contains("already give 40.0 IBU"), bine::Infeasible);
  }
  SUBCASE("no candidates") {
    request.candidates.clear();
    CHECK_THROWS_AS(bine::design_blend(request), bine::Infeasible);
  }
  SUBCASE("no bittering and the late hops cannot reach the IBU") {
    request.bittering.reset();
    request.target_ibu = 200.0;
    CHECK_THROWS_WITH_AS(bine::design_blend(request), doctest::Contains("--no-bittering"), bine::Infeasible);
  }
  SUBCASE("not enough stock for the late amount") {
    request.candidates[0].on_hand_g = 50.0;  // 80 g needed
    CHECK_THROWS_WITH_AS(bine::design_blend(request), doctest::Contains("only 50 g"), bine::Infeasible);
  }
}
