#pragma once
// Rendering an alpha-acid storage estimate (bine age) as text or JSON.
#include <nlohmann/json.hpp>
#include <ostream>
#include <string>
#include <vector>

#include "engine/storage_loss.hpp"
#include "model/quantity.hpp"

namespace bine {

/// The question bine age answered, with where the stability came from.
struct AgeQuery {
  StorageHistory history;
  Date packaged;
  Date on;
  bool on_from_clock = false;
  std::string stability_source;  // "--stability", "catalog: NAME", "--hsi 0.31", "fair class ..."
  std::vector<std::string> notes;
};

void render_age(std::ostream& out, const AgeQuery& query, const AgedAlpha& aged, UnitSystem units);
nlohmann::json age_to_json(const AgeQuery& query, const AgedAlpha& aged);

}  // namespace bine
