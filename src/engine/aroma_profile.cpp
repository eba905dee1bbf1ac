#include "engine/aroma_profile.hpp"

#include <fmt/format.h>

#include <charconv>
#include <cmath>
#include <map>

#include "model/errors.hpp"
#include "model/names.hpp"

namespace bine {

std::string_view to_string(AromaSource source) {
  switch (source) {
    case AromaSource::explicit_values:
      return "aroma intensities";
    case AromaSource::tags:
      return "descriptor tags";
    case AromaSource::oils:
      return "oil composition";
    case AromaSource::rub_test:
      return "the lot's rub test";
    case AromaSource::none:
      return "none";
  }
  return "none";
}

std::optional<AromaProfile> lot_aroma(const Lot& lot, std::size_t index, std::string_view file,
                                      const Lexicon& lexicon) {
  if (!lot.rub_test) return std::nullopt;
  AromaProfile profile;
  profile.intensity = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(lexicon.size()));
  profile.source = AromaSource::rub_test;
  std::vector<std::string> problems;
  for (const auto& [name, score] : lot.rub_test->scores) {
    const auto axis = lexicon.axis_index(name);
    if (!axis) {
      std::string hint = did_you_mean(name, lexicon.axis_names());
      problems.push_back(fmt::format("{}: /lots/{}/rub_test/scores/{}: \"{}\" is not an aroma axis ({})", file, index,
                                     name, name, hint.empty() ? "see the axes in lexicon.json" : hint));
      continue;
    }
    profile.intensity[static_cast<Eigen::Index>(*axis)] = score;
  }
  if (!problems.empty()) throw InputError(problems);
  return profile;
}

std::string rub_test_note(const Lot& lot, std::string_view code) {
  return fmt::format("lot {}: aroma from the brewer's rub test of {}, not {}'s catalog profile", code,
                     format_date(lot.rub_test->scored), lot.variety);
}

Eigen::VectorXd aroma_from_oils(const Variety& variety, const Lexicon& lexicon) {
  // Typical shares (% of oil), midpoints of docs/methods.md#hop-chemistry-bounds.
  static const std::map<std::string, double> typical{{"myrcene", 45.0},   {"humulene", 24.0}, {"caryophyllene", 9.0},
                                                     {"farnesene", 10.0}, {"linalool", 0.8},  {"geraniol", 0.5}};
  Eigen::VectorXd scores = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(lexicon.size()));
  if (variety.oils.empty()) return scores;
  for (const auto& association : lexicon.compounds()) {
    auto oil = variety.oils.find(association.compound);
    auto reference = typical.find(association.compound);
    if (oil == variety.oils.end() || reference == typical.end()) continue;
    const double relative = oil->second.mid() / reference->second;
    for (const auto& [axis, weight] : association.axes)
      if (auto index = lexicon.axis_index(axis)) scores[static_cast<Eigen::Index>(*index)] += relative * weight;
  }
  const double top = scores.maxCoeff();
  if (top > 0.0) scores *= 3.0 / top;
  return scores;
}

AromaProfile aroma_profile(const Variety& variety, const Lexicon& lexicon) {
  AromaProfile profile;
  const auto axes = static_cast<Eigen::Index>(lexicon.size());
  profile.intensity = Eigen::VectorXd::Zero(axes);
  if (variety.aroma) {
    for (const auto& [axis, value] : *variety.aroma)
      if (auto index = lexicon.axis_index(axis)) profile.intensity[static_cast<Eigen::Index>(*index)] = value;
    profile.source = AromaSource::explicit_values;
    return profile;
  }
  if (!variety.tags.empty()) {
    std::vector<int> counts(lexicon.size(), 0);
    for (const auto& tag : variety.tags) {
      if (auto index = lexicon.axis_for_tag(tag))
        ++counts[*index];
      else if (auto axis = lexicon.axis_index(tag))
        ++counts[*axis];  // an axis name used as a tag
      else
        profile.ignored_tags.push_back(tag);
    }
    bool any = false;
    for (std::size_t i = 0; i < counts.size(); ++i) {
      if (counts[i] == 0) continue;
      profile.intensity[static_cast<Eigen::Index>(i)] = std::min(5.0, 3.0 + (counts[i] - 1));
      any = true;
    }
    if (any) {
      profile.source = AromaSource::tags;
      return profile;
    }
  }
  if (!variety.oils.empty()) {
    profile.intensity = aroma_from_oils(variety, lexicon);
    if (profile.intensity.maxCoeff() > 0.0) {
      profile.source = AromaSource::oils;
      return profile;
    }
  }
  profile.source = AromaSource::none;
  return profile;
}

Eigen::VectorXd parse_aroma_spec(std::string_view spec, const Lexicon& lexicon, std::string_view where,
                                 std::vector<bool>* named, std::vector<std::string>* read_as) {
  Eigen::VectorXd target = Eigen::VectorXd::Zero(static_cast<Eigen::Index>(lexicon.size()));
  if (named) named->assign(lexicon.size(), false);
  std::vector<std::string> given_as(lexicon.size());  // the name each axis was given by
  bool any = false;
  std::size_t start = 0;
  while (start <= spec.size()) {
    std::size_t end = spec.find(',', start);
    if (end == std::string_view::npos) end = spec.size();
    std::string_view item = spec.substr(start, end - start);
    while (!item.empty() && item.front() == ' ') item.remove_prefix(1);
    while (!item.empty() && item.back() == ' ') item.remove_suffix(1);
    start = end + 1;
    if (item.empty()) {
      if (end == spec.size()) break;
      continue;
    }
    const std::size_t eq = item.find('=');
    if (eq == std::string_view::npos)
      throw InputError(fmt::format("{}: \"{}\" has no value (expected AXIS=0-5, e.g. floral=4,citrus=3)", where, item));
    std::string_view axis_name = item.substr(0, eq);
    std::string_view value_text = item.substr(eq + 1);
    while (!axis_name.empty() && axis_name.back() == ' ') axis_name.remove_suffix(1);
    while (!value_text.empty() && value_text.front() == ' ') value_text.remove_prefix(1);
    auto index = lexicon.axis_index(axis_name);
    const bool by_tag = !index && lexicon.axis_for_tag(axis_name).has_value();
    if (by_tag) index = lexicon.axis_for_tag(axis_name);
    if (!index) {
      std::vector<std::string> known = lexicon.axis_names();
      for (auto& tag : lexicon.all_tags()) known.push_back(std::move(tag));
      std::string hint = did_you_mean(axis_name, known);
      if (hint.empty()) {
        hint = "axes are";
        for (const auto& name : lexicon.axis_names()) hint += " " + name;
      }
      throw InputError(fmt::format("{}: unknown aroma axis \"{}\" ({})", where, axis_name, hint));
    }
    double value = 0.0;
    const auto [ptr, ec] = std::from_chars(value_text.data(), value_text.data() + value_text.size(), value);
    if (ec != std::errc() || ptr != value_text.data() + value_text.size() || !std::isfinite(value) || value < 0.0 ||
        value > 5.0)
      throw InputError(fmt::format("{}: {}=\"{}\" is not an intensity (expected a number from 0 to 5)", where,
                                   axis_name, value_text));
    const std::string& axis = lexicon.axes()[*index].name;
    if (!given_as[*index].empty())
      throw InputError(fmt::format("{}: \"{}\" and \"{}\" both set the {} axis (give it once)", where, given_as[*index],
                                   axis_name, axis));
    given_as[*index] = std::string(axis_name);
    if (by_tag && read_as)
      read_as->push_back(fmt::format("{}: {}={} read as {}={} (\"{}\" is a {} tag of the lexicon)", where, axis_name,
                                     value_text, axis, value_text, axis_name, axis));
    target[static_cast<Eigen::Index>(*index)] = value;
    if (named) (*named)[*index] = true;
    any = true;
  }
  if (!any) throw InputError(fmt::format("{}: empty aroma target (expected e.g. floral=4,citrus=3)", where));
  return target;
}

}  // namespace bine
