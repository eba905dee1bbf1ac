// What a blend may be made of: in catalog mode every variety with aroma and oil data whose purpose
// is not bittering only, in stock mode every lot on hand whose variety the catalog knows, with the
// lot's own oil and alpha where it has them (docs/methods.md#blend-profile). What is left out is
// noted, one note per reason.
#include <fmt/format.h>
#include <fmt/ranges.h>

#include "engine/aroma_profile.hpp"
#include "engine/blend.hpp"
#include "model/catalog_lookup.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

std::string join_names(const std::vector<std::string>& names) {
  std::string text;
  for (std::size_t i = 0; i < names.size() && i < 6; ++i) text += (i ? ", " : "") + names[i];
  if (names.size() > 6) text += fmt::format(" and {} more", names.size() - 6);
  return text;
}

/// The names left out, by reason.
struct LeftOut {
  std::vector<std::string> no_aroma, no_oil, stale;
};

/// Sets the candidate's aroma from the variety; false (and noted) when it has no aroma data.
bool take_aroma(const Variety& variety, const Lexicon& lexicon, const std::string& label, BlendCandidate& candidate,
                LeftOut& left_out) {
  Eigen::VectorXd aroma;
  if (catalog_blend_row(variety, lexicon, aroma).aroma == nullptr) {
    left_out.no_aroma.push_back(label);
    return false;
  }
  candidate.aroma = std::move(aroma);
  return true;
}

void add_catalog_candidate(const CatalogBlendRow& row, const std::string& excluded, CandidateSet& set,
                           LeftOut& left_out) {
  if (!excluded.empty() && fold_name(row.name) == excluded) return;
  if (row.bittering_only) return;
  const std::string name(row.name);
  if (row.aroma == nullptr) {
    left_out.no_aroma.push_back(name);
    return;
  }
  if (!row.total_oil || row.total_oil->mid() <= 0.0) {
    left_out.no_oil.push_back(name);
    return;
  }
  BlendCandidate candidate;
  candidate.variety = name;
  candidate.aroma = *row.aroma;
  candidate.oil_ml_per_100g = row.total_oil->mid();
  const CatalogAlpha alpha = catalog_alpha(row.name, row.alpha_acid);
  candidate.alpha_percent = alpha.alpha_percent.value_or(0.0);
  candidate.alpha_note = alpha.note;
  if (row.alpha_acid) candidate.alpha_origin.catalog_range = std::make_pair(row.alpha_acid->min, row.alpha_acid->max);
  set.candidates.push_back(std::move(candidate));
}

void add_stock_candidates(const Catalog& catalog, const Lexicon& lexicon, const Cellar& cellar,
                          const std::string& excluded, bool allow_stale, CandidateSet& set, LeftOut& left_out) {
  for (const auto& aged : cellar.lots) {
    const Lot& lot = aged.lot;
    if (!aged.on_hand()) continue;
    if (!excluded.empty() && fold_name(lot.variety) == excluded) continue;
    // age_cellar has refused every lot of a variety the catalog does not know.
    const Variety* variety = find_variety(catalog, lot.variety);
    if (variety == nullptr) continue;
    const std::string label = fmt::format("{} ({})", lot.variety, aged.code);
    if (aged.stale && !allow_stale) {
      left_out.stale.push_back(fmt::format("{}: {}", label, aged.stale_reason));
      continue;
    }
    BlendCandidate candidate;
    candidate.variety = variety->name;
    candidate.lot = aged.lot.lot;
    candidate.form = lot.form;
    candidate.on_hand_g = lot.on_hand_g;
    if (const auto own = lot_aroma(lot, aged.index, cellar.source_file, lexicon)) {
      candidate.aroma = own->intensity;  // the brewer's rub test stands for this lot
      set.notes.push_back(rub_test_note(lot, aged.code));
    } else if (!take_aroma(*variety, lexicon, label, candidate, left_out)) {
      continue;
    }
    const std::optional<double> oil =
        lot.total_oil ? lot.total_oil : (variety->total_oil ? std::optional(variety->total_oil->mid()) : std::nullopt);
    if (!oil || *oil <= 0.0) {
      left_out.no_oil.push_back(label);
      continue;
    }
    candidate.oil_ml_per_100g = *oil;
    candidate.alpha_percent = aged.alpha_today.value_or(0.0);
    candidate.alpha_note = aged.alpha_note;
    candidate.alpha_origin = lot_alpha_origin(aged, variety);
    if (aged.stale) candidate.alpha_note += "; stale (" + aged.stale_reason + "), allowed";
    set.candidates.push_back(std::move(candidate));
  }
}

/// One note per reason a variety or lot was left out.
void note_left_out(const LeftOut& left_out, CandidateSet& set) {
  set.without_aroma = left_out.no_aroma.size();
  if (!left_out.no_aroma.empty())
    set.notes.push_back(
        fmt::format("{} skipped: no aroma data ({})", left_out.no_aroma.size(), join_names(left_out.no_aroma)));
  if (!left_out.no_oil.empty())
    set.notes.push_back(
        fmt::format("{} skipped: no total oil value ({})", left_out.no_oil.size(), join_names(left_out.no_oil)));
  if (!left_out.stale.empty())
    set.notes.push_back(fmt::format("{} left out ({})", count_of(left_out.stale.size(), "stale lot", "stale lots"),
                                    fmt::format("{}", fmt::join(left_out.stale, "; "))));
}

}  // namespace

CandidateSet blend_candidates(const Catalog& catalog, const Lexicon& lexicon, const Cellar* cellar,
                              std::string_view exclude, bool allow_stale) {
  CandidateSet set;
  LeftOut left_out;
  const std::string excluded = exclude.empty() ? std::string() : fold_name(exclude);
  if (cellar == nullptr) {
    Eigen::VectorXd aroma;
    for (const auto& variety : catalog.varieties)
      add_catalog_candidate(catalog_blend_row(variety, lexicon, aroma), excluded, set, left_out);
  } else {
    add_stock_candidates(catalog, lexicon, *cellar, excluded, allow_stale, set, left_out);
  }
  note_left_out(left_out, set);
  return set;
}

CatalogBlendRow catalog_blend_row(const Variety& variety, const Lexicon& lexicon, Eigen::VectorXd& aroma) {
  CatalogBlendRow row;
  row.name = variety.name;
  row.bittering_only = variety.purpose == Purpose::bittering;
  row.total_oil = variety.total_oil;
  row.alpha_acid = variety.alpha_acid;
  AromaProfile profile = aroma_profile(variety, lexicon);
  if (profile.source != AromaSource::none && profile.intensity.size() > 0 && profile.intensity.maxCoeff() > 0.0) {
    aroma = std::move(profile.intensity);
    row.aroma = &aroma;
  }
  return row;
}

CandidateSet blend_candidates_streamed(const BlendRowStream& each_row, std::string_view exclude) {
  CandidateSet set;
  LeftOut left_out;
  const std::string excluded = exclude.empty() ? std::string() : fold_name(exclude);
  each_row([&](const CatalogBlendRow& row) { add_catalog_candidate(row, excluded, set, left_out); });
  note_left_out(left_out, set);
  return set;
}

}  // namespace bine
