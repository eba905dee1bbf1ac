#pragma once
// The aroma vocabulary: the axes, the free-text tags that map onto each, and the oil compounds'
// aroma associations with their literature sources (descriptor-data/lexicon.json).
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace bine {

struct AromaAxis {
  std::string name;
  std::string description;
  std::vector<std::string> tags;
};

struct CompoundAssociation {
  std::string compound;                // "linalool"
  std::map<std::string, double> axes;  // axis -> weight 0..1
  std::string source;
};

class Lexicon {
 public:
  Lexicon() = default;
  Lexicon(std::vector<AromaAxis> axes, std::vector<CompoundAssociation> compounds);

  const std::vector<AromaAxis>& axes() const { return axes_; }
  const std::vector<CompoundAssociation>& compounds() const { return compounds_; }
  std::size_t size() const { return axes_.size(); }
  std::vector<std::string> axis_names() const;
  /// Index of an axis by (folded) name, or nullopt.
  std::optional<std::size_t> axis_index(std::string_view name) const;
  /// The axis a free-text tag maps onto (folded comparison), or nullopt.
  std::optional<std::size_t> axis_for_tag(std::string_view tag) const;
  std::vector<std::string> all_tags() const;

 private:
  std::vector<AromaAxis> axes_;
  std::vector<CompoundAssociation> compounds_;
  std::map<std::string, std::size_t> axis_by_name_;
  std::map<std::string, std::size_t> axis_by_tag_;
};

}  // namespace bine
