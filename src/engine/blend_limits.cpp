// The QP of one subset of candidates: the objective's terms, which do not depend on the subset, and
// every limit of the request as a row in the subset's oil shares (docs/methods.md#blend-amounts).
// IBU enters through one coefficient per candidate, c_i = whirlpool share x IBU per gram in the
// whirlpool, from the bitterness engine (linear in grams x alpha, docs/methods.md#linearity).
#include <map>

#include "engine/blend_steps.hpp"

namespace bine {

double whirlpool_ibu_per_gram(const BlendCandidate& candidate, const BlendPlan& plan) {
  HopAddition hop;
  hop.variety = candidate.variety;
  hop.grams = 1.0;
  hop.use = HopUse::whirlpool;
  hop.minutes = plan.whirlpool_minutes;
  hop.temperature_c = plan.whirlpool_temperature_c;
  hop.form = candidate.form;
  return addition_bitterness(hop, candidate.alpha_percent, plan.wort, plan.bitterness).ibu;
}

double bittering_ibu_per_gram(const BitteringHop& bittering, const BlendPlan& plan) {
  HopAddition hop;
  hop.variety = bittering.variety;
  hop.grams = 1.0;
  hop.use = bittering.use.value_or(HopUse::boil);
  hop.minutes = bittering.minutes;
  hop.form = bittering.form;
  return addition_bitterness(hop, bittering.alpha_percent, plan.wort, plan.bitterness).ibu;
}

namespace blend_steps {
namespace {

/// s_i^T W s_j: from the pool's Gram matrix, or computed for candidates outside the pool.
double gram_entry(const Prepared& prepared, std::size_t i, std::size_t j) {
  const Index r = prepared.position[i], c = prepared.position[j];
  if (r >= 0 && c >= 0) return prepared.gram(r, c);
  return prepared.aroma.col(at(i)).dot(prepared.weighted.col(at(j)));
}

/// a^T g <= beta as a row in the shares of `subset`: with fixed grams G,
/// sum_i (G a_i - beta) x_i / O_i <= 0; with fixed oil D, sum_i 100 D a_i x_i / O_i <= beta.
std::pair<Eigen::RowVectorXd, double> share_row(const GramRow& row, const std::vector<std::size_t>& subset,
                                                const BlendRequest& request) {
  const LateAmount& late = request.plan.late;
  Eigen::RowVectorXd coefficients(at(subset.size()));
  for (std::size_t k = 0; k < subset.size(); ++k) {
    const double oil = request.candidates[subset[k]].oil_ml_per_100g;
    const double a = row.a[at(subset[k])];
    coefficients[at(k)] =
        late.kind == LateAmount::Kind::grams ? (late.total * a - row.beta) / oil : 100.0 * late.total * a / oil;
  }
  return {coefficients, late.kind == LateAmount::Kind::grams ? 0.0 : row.beta};
}

/// c_i for every candidate. IBU is linear in grams x alpha at a fixed stage and form: one
/// bitterness-engine call per form gives the coefficient (the whirlpool calls integrate over the
/// stand, so this matters at 1,000 candidates).
Eigen::VectorXd whirlpool_ibu_per_gram_all(const BlendRequest& request) {
  std::map<HopForm, double> per_gram_per_alpha;
  Eigen::VectorXd ibu(at(request.candidates.size()));
  for (std::size_t i = 0; i < request.candidates.size(); ++i) {
    const BlendCandidate& candidate = request.candidates[i];
    auto found = per_gram_per_alpha.find(candidate.form);
    if (found == per_gram_per_alpha.end()) {
      BlendCandidate unit = candidate;
      unit.alpha_percent = 1.0;
      found = per_gram_per_alpha.emplace(candidate.form, whirlpool_ibu_per_gram(unit, request.plan)).first;
    }
    ibu[at(i)] = request.plan.ibu.whirlpool_share * candidate.alpha_percent * found->second;
  }
  return ibu;
}

}  // namespace

Prepared prepare(const BlendRequest& request) {
  Prepared prepared;
  const std::size_t n = request.candidates.size();
  Eigen::MatrixXd& s = prepared.aroma;
  s.resize(request.target.intensity.size(), at(n));
  for (std::size_t i = 0; i < n; ++i) s.col(at(i)) = request.candidates[i].aroma;
  prepared.weighted = request.target.weight.asDiagonal() * s;
  const Eigen::MatrixXd& ws = prepared.weighted;
  prepared.self = s.cwiseProduct(ws).colwise().sum().transpose();
  prepared.linear = ws.transpose() * request.target.intensity;
  prepared.constant = request.target.intensity.dot(request.target.weight.cwiseProduct(request.target.intensity));
  prepared.ibu_per_gram = whirlpool_ibu_per_gram_all(request);
  if (request.plan.bittering)
    prepared.bittering_per_gram = bittering_ibu_per_gram(*request.plan.bittering, request.plan);
  return prepared;
}

void prepare_gram(Prepared& prepared, const std::vector<std::size_t>& pool, const BlendRequest& request) {
  Eigen::MatrixXd s(request.target.intensity.size(), at(pool.size()));
  prepared.position.assign(request.candidates.size(), -1);
  for (std::size_t k = 0; k < pool.size(); ++k) {
    s.col(at(k)) = request.candidates[pool[k]].aroma;
    prepared.position[pool[k]] = at(k);
  }
  prepared.gram = s.transpose() * (request.target.weight.asDiagonal() * s);
}

SubsetLimits gram_limits(const BlendRequest& request, const Prepared& prepared) {
  SubsetLimits limits;
  const auto n = at(request.candidates.size());
  const std::optional<BitteringHop>& bittering = request.plan.bittering;
  const double room = request.plan.ibu.room();  // IBU left for late hops + bittering
  if (bittering) {
    limits.rows.push_back({prepared.ibu_per_gram, room});  // bittering charge >= 0
    if (bittering->on_hand_g && prepared.bittering_per_gram > 0.0) {
      // (room - c^T g) / u_b + g_shared <= on hand
      GramRow row{-prepared.ibu_per_gram / prepared.bittering_per_gram,
                  *bittering->on_hand_g - room / prepared.bittering_per_gram};
      if (!bittering->lot.empty())
        for (Index i = 0; i < n; ++i)
          if (request.candidates[static_cast<std::size_t>(i)].lot == bittering->lot) row.a[i] += 1.0;
      limits.rows.push_back(row);
    }
  } else {
    limits.equality = GramRow{prepared.ibu_per_gram, room};
  }
  for (Index i = 0; i < n; ++i) {
    const auto& candidate = request.candidates[static_cast<std::size_t>(i)];
    if (!candidate.on_hand_g) continue;
    GramRow row{Eigen::VectorXd::Zero(n), *candidate.on_hand_g};
    row.a[i] = 1.0;
    limits.rows.push_back(row);
  }
  return limits;
}

BlendQpSolution solve_subset(const std::vector<std::size_t>& subset, const BlendRequest& request,
                             const Prepared& prepared, const SubsetLimits& limits) {
  const auto k = at(subset.size());
  BlendQp qp;
  qp.hessian.resize(k, k);
  qp.linear.resize(k);
  for (Index r = 0; r < k; ++r) {
    qp.linear[r] = prepared.linear[at(subset[static_cast<std::size_t>(r)])];
    for (Index c = 0; c < k; ++c)
      qp.hessian(r, c) = gram_entry(prepared, subset[static_cast<std::size_t>(r)], subset[static_cast<std::size_t>(c)]);
  }
  qp.constant = prepared.constant;
  // Rows that involve only candidates outside the subset are constant; keep the rest.
  std::vector<std::pair<Eigen::RowVectorXd, double>> rows;
  for (const auto& row : limits.rows) {
    bool touches = row.a.size() == 0;
    for (const std::size_t i : subset) touches = touches || row.a[at(i)] != 0.0;
    if (!touches && row.beta >= 0.0) continue;  // 0 <= beta: always satisfied
    rows.push_back(share_row(row, subset, request));
  }
  qp.inequality.resize(at(rows.size()), k);
  qp.inequality_bound.resize(at(rows.size()));
  for (std::size_t r = 0; r < rows.size(); ++r) {
    qp.inequality.row(at(r)) = rows[r].first;
    qp.inequality_bound[at(r)] = rows[r].second;
  }
  if (limits.equality) {
    auto [row, bound] = share_row(*limits.equality, subset, request);
    qp.equality = row.transpose();
    qp.equality_bound = bound;
  }
  return solve_blend_qp(qp);
}

Eigen::VectorXd grams_for(const Eigen::VectorXd& x, const std::vector<std::size_t>& subset,
                          const BlendRequest& request) {
  const LateAmount& late = request.plan.late;
  Eigen::VectorXd u(x.size());
  for (std::size_t k = 0; k < subset.size(); ++k) u[at(k)] = x[at(k)] / request.candidates[subset[k]].oil_ml_per_100g;
  if (late.kind == LateAmount::Kind::grams) return late.total * u / u.sum();
  return 100.0 * late.total * u;
}

}  // namespace blend_steps
}  // namespace bine
