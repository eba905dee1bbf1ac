#pragma once
// brewhouse.json: the profile bine calibrate writes and ibu, rebalance, blend and swap read.
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <string_view>

#include "model/brewhouse.hpp"

namespace bine {

/// The profile as JSON (deterministic; canonical units).
nlohmann::json brewhouse_profile_to_json(const BrewhouseProfile& profile);
/// Reads a profile; InputError naming file, pointer and value for every problem.
BrewhouseProfile parse_brewhouse_profile(std::string_view text, const std::string& file);
BrewhouseProfile load_brewhouse_profile(const std::filesystem::path& path);
/// Writes the profile atomically.
void write_brewhouse_profile(const std::filesystem::path& path, const BrewhouseProfile& profile);

}  // namespace bine
