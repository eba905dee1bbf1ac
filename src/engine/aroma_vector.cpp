// Descriptor vectors for the neighbour index and the exact similarity behind them.
//
// Blocks. A hop is described by three blocks:
//  - aroma: intensities 0-5 on the lexicon's axes, from aroma_profile() (explicit values, else tags
//    through the lexicon: one tag on an axis scores 3, each further tag +1, capped at 5; else a coarse
//    estimate from oil composition through the lexicon's compound associations). The block compares
//    by cosine: the shape of the aroma matters, its overall loudness is what the amount factor adjusts.
//  - oils: each compound's share of total oil (GC area-%, midpoint of the range), standardised over
//    the catalog (z = (x - mean) / sd), so a compound that varies little between varieties does not
//    dominate and myrcene's large raw share does not drown linalool.
//  - chemistry: alpha acid, beta acid, cohumulone (% of alpha) and total oil, midpoints (or a lot's
//    measured values), standardised by the catalog's spread.
//
// Encoding of standardised values. A cosine over raw z-scores would call a hop at +0.1 sd and one at
// +2 sd identical (same direction). Instead each standardised value z becomes a 2-D unit vector at
// angle phi = clamp(z, -max_sd, max_sd) x angle_per_sd; the inner product of two such vectors is
// cos(phi_a - phi_b), which depends only on the difference: 1 for equal values, 0 at 2 sd apart, -1
// at the opposite ends of the clamped range (defaults pi/4 per sd, clamp at 2 sd). A block is the
// concatenation of its features' 2-D vectors scaled by sqrt(feature share), so the block cosine is
// the share-weighted mean of cos(phi_a - phi_b).
//
// Weights. Each block is unit length and scaled by sqrt(w_b) with the question's weights summing to
// one, so the inner product of two complete vectors is sum_b w_b cos_b: each weight is the block's
// share of the similarity. The weights are settings (VectorSettings): an aroma question weighs aroma
// and oils; a bittering question weighs alpha, cohumulone and beta.
//
// Missing data. A block (or a feature inside the oil or chemistry block) one side lacks is never filled
// with zeros that would look like data: the vector holds zeros there only so faiss can still rank,
// and every candidate faiss returns is re-scored exactly by similarity(), which drops what either side
// lacks and renormalises the remaining weights per pair. Callers ask faiss for a larger candidate set
// than they show, so the re-scoring can reorder. Coverage is the share of the question's weight both
// sides could be compared on; confidence is coverage x 0.85 when either aroma came from tags and x 0.6
// when it came from oil composition (settings), since those are coarser than rated intensities.
//
// Similarity for brewers: 100 x max(0, score). Symmetric (every step is symmetric in a and b) and 100
// exactly when the compared descriptors are equal.
#include "engine/aroma_vector.hpp"

#include <cmath>
#include <numeric>

#include "model/names.hpp"

namespace bine {
namespace {

constexpr std::size_t kAngleDims = 2;

std::optional<double> mid_of(const std::optional<Range>& range) {
  if (!range) return std::nullopt;
  return range->mid();
}

}  // namespace

std::string_view to_string(SwapPurpose purpose) { return purpose == SwapPurpose::aroma ? "aroma" : "bittering"; }

std::optional<SwapPurpose> swap_purpose_from(std::string_view text) {
  const std::string folded = fold_name(text);
  if (folded == "aroma") return SwapPurpose::aroma;
  if (folded == "bittering") return SwapPurpose::bittering;
  return std::nullopt;
}

CatalogSpread catalog_spread(const Catalog& catalog) {
  // Mean and population standard deviation of each feature over the varieties that have it.
  auto spread_of = [](const std::vector<double>& values) {
    FeatureSpread spread;
    if (values.empty()) return spread;
    spread.mean = std::accumulate(values.begin(), values.end(), 0.0) / static_cast<double>(values.size());
    double squares = 0.0;
    for (double v : values) squares += (v - spread.mean) * (v - spread.mean);
    const double sd = std::sqrt(squares / static_cast<double>(values.size()));
    spread.sd = sd > 1e-9 ? sd : 1.0;  // a feature every variety shares carries no contrast
    return spread;
  };
  CatalogSpread result;
  for (const auto& compound : oil_compounds()) {
    std::vector<double> values;
    for (const auto& variety : catalog.varieties)
      if (auto it = variety.oils.find(compound); it != variety.oils.end()) values.push_back(it->second.mid());
    result.oils.push_back(spread_of(values));
  }
  std::array<std::vector<double>, kChemistryFeatures> chemistry;
  for (const auto& variety : catalog.varieties) {
    const std::array<std::optional<double>, kChemistryFeatures> values{
        mid_of(variety.alpha_acid), mid_of(variety.beta_acid), mid_of(variety.cohumulone), mid_of(variety.total_oil)};
    for (std::size_t f = 0; f < kChemistryFeatures; ++f)
      if (values[f]) chemistry[f].push_back(*values[f]);
  }
  for (std::size_t f = 0; f < kChemistryFeatures; ++f) result.chemistry[f] = spread_of(chemistry[f]);
  return result;
}

Vectorizer::Vectorizer(const Catalog& catalog, const Lexicon& lexicon, SwapPurpose purpose, VectorSettings settings)
    : Vectorizer(catalog_spread(catalog), lexicon, purpose, settings) {}

Vectorizer::Vectorizer(CatalogSpread spread, const Lexicon& lexicon, SwapPurpose purpose, VectorSettings settings)
    : lexicon_(&lexicon), purpose_(purpose), settings_(settings), spread_(std::move(spread)) {
  if (spread_.oils.size() != oil_compounds().size()) spread_.oils.resize(oil_compounds().size());
}

std::optional<double> Vectorizer::standardise(std::optional<double> value, const FeatureSpread& spread) const {
  if (!value || !std::isfinite(*value)) return std::nullopt;
  return (*value - spread.mean) / spread.sd;
}

Descriptors Vectorizer::describe_with(const Variety& variety, std::optional<double> alpha, std::optional<double> beta,
                                      std::optional<double> oil, const AromaProfile* own_aroma) const {
  Descriptors d;
  const AromaProfile profile = own_aroma ? *own_aroma : aroma_profile(variety, *lexicon_);
  d.aroma = profile.intensity;
  d.aroma_source = profile.intensity.norm() > 0.0 ? profile.source : AromaSource::none;
  const auto& compounds = oil_compounds();
  d.oils.resize(compounds.size());
  for (std::size_t c = 0; c < compounds.size(); ++c)
    if (auto it = variety.oils.find(compounds[c]); it != variety.oils.end())
      d.oils[c] = standardise(it->second.mid(), spread_.oils[c]);
  const std::array<std::optional<double>, kChemistryFeatures> raw{alpha, beta, mid_of(variety.cohumulone), oil};
  for (std::size_t f = 0; f < kChemistryFeatures; ++f) d.chemistry[f] = standardise(raw[f], spread_.chemistry[f]);
  return d;
}

Descriptors Vectorizer::describe(const Variety& variety) const {
  return describe_with(variety, mid_of(variety.alpha_acid), mid_of(variety.beta_acid), mid_of(variety.total_oil));
}

Descriptors Vectorizer::describe(const Variety& variety, const Lot& lot, std::optional<double> alpha_today,
                                 const AromaProfile* own_aroma) const {
  const auto pick = [](std::optional<double> first, std::optional<double> second, const std::optional<Range>& range) {
    return first ? first : (second ? second : mid_of(range));
  };
  return describe_with(variety, pick(alpha_today, lot.alpha_acid, variety.alpha_acid),
                       pick(lot.beta_acid, std::nullopt, variety.beta_acid),
                       pick(lot.total_oil, std::nullopt, variety.total_oil), own_aroma);
}

Descriptors Vectorizer::describe_target(const Eigen::VectorXd& intensities) const {
  Descriptors d;
  d.aroma = intensities;
  d.aroma_source = intensities.norm() > 0.0 ? AromaSource::explicit_values : AromaSource::none;
  d.oils.resize(oil_compounds().size());
  return d;
}

int Vectorizer::dimensions() const {
  return static_cast<int>(lexicon_->size() + kAngleDims * (oil_compounds().size() + kChemistryFeatures));
}

std::vector<float> Vectorizer::embed(const Descriptors& d) const {
  const BlockWeights& w = settings_.weights(purpose_);
  const double total = w.aroma + w.oils + w.chemistry;
  std::vector<float> out(static_cast<std::size_t>(dimensions()), 0.0f);
  std::size_t at = 0;
  const double aroma_norm = d.aroma.size() ? d.aroma.norm() : 0.0;
  if (d.has_aroma() && aroma_norm > 0.0) {
    const double scale = std::sqrt(w.aroma / total) / aroma_norm;
    for (Eigen::Index i = 0; i < d.aroma.size(); ++i)
      out[at + static_cast<std::size_t>(i)] = static_cast<float>(d.aroma[i] * scale);
  }
  at += lexicon_->size();
  // One angle-encoded block: features with a value share the block weight by their emphasis.
  auto put_angles = [&](const auto& values, const auto& emphasis, double block_weight) {
    double present = 0.0;
    for (std::size_t f = 0; f < values.size(); ++f)
      if (values[f]) present += emphasis(f);
    for (std::size_t f = 0; f < values.size(); ++f, at += kAngleDims) {
      if (!values[f] || present <= 0.0 || emphasis(f) <= 0.0) continue;
      const double z = std::clamp(*values[f], -settings_.max_sd, settings_.max_sd);
      const double phi = z * settings_.angle_per_sd;
      const double scale = std::sqrt(block_weight / total * emphasis(f) / present);
      out[at] = static_cast<float>(scale * std::cos(phi));
      out[at + 1] = static_cast<float>(scale * std::sin(phi));
    }
  };
  put_angles(
      d.oils, [](std::size_t) { return 1.0; }, w.oils);
  put_angles(
      d.chemistry, [&](std::size_t f) { return w.chemistry_emphasis[f]; }, w.chemistry);
  return out;
}

PairSimilarity Vectorizer::similarity(const Descriptors& a, const Descriptors& b) const {
  const BlockWeights& w = settings_.weights(purpose_);
  const double total = w.aroma + w.oils + w.chemistry;
  double weighted = 0.0;  // sum of effective weight x block cosine
  double covered = 0.0;   // sum of effective weights
  bool aroma_compared = false;
  // Aroma: cosine of intensities, when both sides have aroma.
  if (w.aroma > 0.0 && a.has_aroma() && b.has_aroma()) {
    const double na = a.aroma.norm();
    const double nb = b.aroma.norm();
    if (na > 0.0 && nb > 0.0) {
      weighted += w.aroma * a.aroma.dot(b.aroma) / (na * nb);
      covered += w.aroma;
      aroma_compared = true;
    }
  }
  // Angle blocks: mean of cos(phi_a - phi_b) over the features both sides have, weighted by emphasis;
  // the block counts with its weight times the emphasis share of those features.
  auto angle_block = [&](const auto& va, const auto& vb, const auto& emphasis, double block_weight) {
    if (block_weight <= 0.0) return;
    double all = 0.0, both = 0.0, sum = 0.0;
    for (std::size_t f = 0; f < va.size(); ++f) {
      all += emphasis(f);
      if (!va[f] || !vb[f] || emphasis(f) <= 0.0) continue;
      const double za = std::clamp(*va[f], -settings_.max_sd, settings_.max_sd);
      const double zb = std::clamp(*vb[f], -settings_.max_sd, settings_.max_sd);
      sum += emphasis(f) * std::cos((za - zb) * settings_.angle_per_sd);
      both += emphasis(f);
    }
    if (both <= 0.0 || all <= 0.0) return;
    const double effective = block_weight * both / all;
    weighted += effective * sum / both;
    covered += effective;
  };
  angle_block(
      a.oils, b.oils, [](std::size_t) { return 1.0; }, w.oils);
  angle_block(
      a.chemistry, b.chemistry, [&](std::size_t f) { return w.chemistry_emphasis[f]; }, w.chemistry);

  PairSimilarity result;
  if (covered <= 0.0 || total <= 0.0) return result;
  result.score = std::clamp(weighted / covered, -1.0, 1.0);
  result.coverage = covered / total;
  double factor = 1.0;
  if (aroma_compared)
    for (const AromaSource source : {a.aroma_source, b.aroma_source}) {
      if (source == AromaSource::tags) factor = std::min(factor, settings_.confidence_tags);
      if (source == AromaSource::oils) factor = std::min(factor, settings_.confidence_oils);
    }
  result.confidence = result.coverage * factor;
  return result;
}

}  // namespace bine
