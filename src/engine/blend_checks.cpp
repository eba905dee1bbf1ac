// Why a blend cannot be made, in the words of the domain, with the remedies that would make it
// feasible (model/errors.hpp; the command line names the options): the checks that need no search,
// the reason when every subset searched breaks a limit (docs/methods.md#blend-amounts), and the IBU
// held by the chosen blend (docs/methods.md#bittering-charge).
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include "engine/blend_steps.hpp"
#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine::blend_steps {
namespace {

/// With fixed grams and every candidate a lot on hand: the K largest lots must hold the late grams.
void check_stock_holds_amount(const BlendRequest& request) {
  std::vector<double> stock;
  bool limited = true;
  for (const auto& candidate : request.candidates) {
    limited = limited && candidate.on_hand_g.has_value();
    stock.push_back(candidate.on_hand_g.value_or(0.0));
  }
  std::sort(stock.rbegin(), stock.rend());
  const std::size_t largest = std::min(stock.size(), request.max_varieties);
  const double most = std::accumulate(stock.begin(), stock.begin() + static_cast<std::ptrdiff_t>(largest), 0.0);
  const double needed = request.plan.late.total;
  if (limited && most < needed)
    throw Infeasible(fmt::format("the blend needs {:.0f} g of late hops but the {} largest aroma lots on hand hold "
                                 "only {:.0f} g",
                                 needed, largest, most),
                     {Remedy::lower_late_amount, Remedy::more_varieties, Remedy::add_stock});
}

/// Whether any lot on hand limits the blend or the charge.
bool stock_limited(const BlendRequest& request) {
  if (request.plan.bittering && request.plan.bittering->on_hand_g) return true;
  return std::any_of(request.candidates.begin(), request.candidates.end(),
                     [](const BlendCandidate& candidate) { return candidate.on_hand_g.has_value(); });
}

}  // namespace

void check_request(const BlendRequest& request) {
  const BlendPlan& plan = request.plan;
  if (request.candidates.empty())
    throw Infeasible("no candidate hops with aroma and oil data", {Remedy::add_aroma_stock, Remedy::add_aroma_catalog});
  if (plan.late.total <= 0.0) throw Infeasible("the late-hop amount is zero", {Remedy::give_late_amount});
  if (plan.ibu.kept_ibu > plan.ibu.target_ibu + 0.05)
    throw Infeasible(fmt::format("the boil additions kept from the recipe already give {:.1f} IBU, above the target "
                                 "{:.1f} IBU",
                                 plan.ibu.kept_ibu, plan.ibu.target_ibu),
                     {Remedy::raise_target_ibu, Remedy::trim_kept_additions});
  if (plan.late.kind == LateAmount::Kind::grams) check_stock_holds_amount(request);
}

void explain_infeasible(const BlendRequest& request, const Prepared& prepared) {
  const BlendPlan& plan = request.plan;
  const double room = plan.ibu.room();
  if (plan.bittering) {
    const bool stock = stock_limited(request);
    std::vector<Remedy> remedies{Remedy::lower_whirlpool_share, Remedy::lower_late_amount, Remedy::raise_target_ibu};
    if (stock) remedies.push_back(Remedy::add_stock);
    throw Infeasible(fmt::format("no blend of up to {} fits the limits: the late hops' whirlpool IBU must "
                                 "stay at or below {:.1f} IBU{}",
                                 count_of(request.max_varieties, "candidate", "candidates"), room,
                                 stock ? " and each lot within its stock" : ""),
                     remedies);
  }
  const double most = prepared.ibu_per_gram.size() ? prepared.ibu_per_gram.maxCoeff() : 0.0;
  const double reach =
      plan.late.kind == LateAmount::Kind::grams ? most * plan.late.total : std::numeric_limits<double>::quiet_NaN();
  throw Infeasible(
      fmt::format("without a bittering charge the late hops must give exactly {:.1f} IBU, and no blend of up to {} "
                  "candidates does{}",
                  room, request.max_varieties,
                  std::isnan(reach) ? std::string()
                                    : fmt::format(" (the most bitter candidate alone gives {:.1f} IBU)", reach)),
      {Remedy::raise_whirlpool_share, Remedy::raise_late_amount, Remedy::allow_bittering});
}

void check_ibu_held(const BlendRequest& request, const BlendResult& result) {
  const double target = request.plan.ibu.target_ibu;
  if (std::abs(result.total_ibu - target) > 0.05)
    throw Infeasible(fmt::format("the blend gives {:.1f} IBU but the target is {:.1f} IBU and the bittering hop "
                                 "cannot make up the difference",
                                 result.total_ibu, target),
                     {Remedy::bittering_with_alpha});
}

}  // namespace bine::blend_steps
