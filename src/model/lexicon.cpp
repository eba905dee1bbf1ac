#include "model/lexicon.hpp"

#include "model/names.hpp"

namespace bine {

Lexicon::Lexicon(std::vector<AromaAxis> axes, std::vector<CompoundAssociation> compounds)
    : axes_(std::move(axes)), compounds_(std::move(compounds)) {
  for (std::size_t i = 0; i < axes_.size(); ++i) {
    axis_by_name_.emplace(fold_name(axes_[i].name), i);
    for (const auto& tag : axes_[i].tags) axis_by_tag_.emplace(fold_name(tag), i);
  }
}

std::vector<std::string> Lexicon::axis_names() const {
  std::vector<std::string> names;
  for (const auto& axis : axes_) names.push_back(axis.name);
  return names;
}

std::optional<std::size_t> Lexicon::axis_index(std::string_view name) const {
  auto it = axis_by_name_.find(fold_name(name));
  if (it == axis_by_name_.end()) return std::nullopt;
  return it->second;
}

std::optional<std::size_t> Lexicon::axis_for_tag(std::string_view tag) const {
  auto it = axis_by_tag_.find(fold_name(tag));
  if (it == axis_by_tag_.end()) return std::nullopt;
  return it->second;
}

std::vector<std::string> Lexicon::all_tags() const {
  std::vector<std::string> tags;
  for (const auto& axis : axes_) tags.insert(tags.end(), axis.tags.begin(), axis.tags.end());
  return tags;
}

}  // namespace bine
