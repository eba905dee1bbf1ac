#include "io/xml_document.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <sstream>

#include "io/shown_value.hpp"
#include "model/names.hpp"

namespace bine {
namespace {

// Everything kept as read (whitespace, comments, processing instructions, declaration); the DOCTYPE
// is parsed into a node only so that it can be refused. No end-of-line or attribute rewriting.
constexpr unsigned kParseFlags = pugi::parse_cdata | pugi::parse_escapes | pugi::parse_comments | pugi::parse_pi |
                                 pugi::parse_declaration | pugi::parse_doctype | pugi::parse_ws_pcdata;

std::string lower(std::string_view text) {
  std::string out(text);
  for (char& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}

/// Line and column (1-based) of a byte offset.
std::pair<std::size_t, std::size_t> line_column(std::string_view text, std::size_t offset) {
  offset = std::min(offset, text.size());
  const std::string_view before = text.substr(0, offset);
  const std::size_t line = 1 + static_cast<std::size_t>(std::count(before.begin(), before.end(), '\n'));
  const auto last = before.rfind('\n');
  return {line, offset - (last == std::string_view::npos ? 0 : last + 1) + 1};
}

/// The deepest element nesting, walked without recursion; stops counting past `limit`.
int element_depth(const pugi::xml_node& root, int limit) {
  int depth = 0, deepest = 0;
  pugi::xml_node node = root.first_child();
  while (node && deepest <= limit) {
    if (node.type() == pugi::node_element) deepest = std::max(deepest, depth + 1);
    if (node.first_child()) {
      node = node.first_child();
      ++depth;
      continue;
    }
    while (node && !node.next_sibling() && node != root) {
      node = node.parent();
      --depth;
    }
    if (!node || node == root) break;
    node = node.next_sibling();
  }
  return deepest;
}

bool declares_latin1(const pugi::xml_document& xml) {
  for (pugi::xml_node node = xml.first_child(); node; node = node.next_sibling())
    if (node.type() == pugi::node_declaration) {
      const std::string encoding = lower(node.attribute("encoding").value());
      return encoding == "iso-8859-1" || encoding == "latin1" || encoding == "iso8859-1" || encoding == "latin-1";
    }
  return false;
}

}  // namespace

XmlEncoding load_xml(std::string_view text, const std::string& file, pugi::xml_document& xml) {
  const pugi::xml_parse_result result = xml.load_buffer(text.data(), text.size(), kParseFlags, pugi::encoding_auto);
  if (!result) {
    const auto [line, column] = line_column(text, static_cast<std::size_t>(result.offset));
    throw InputError(
        fmt::format("{}: not valid XML at line {}, column {} ({})", file, line, column, result.description()));
  }
  for (pugi::xml_node node = xml.first_child(); node; node = node.next_sibling())
    if (node.type() == pugi::node_doctype)
      throw InputError(file +
                       ": has a DOCTYPE declaration (refused: bine never reads a DTD or entity; BeerXML 1.0 "
                       "needs none, remove the <!DOCTYPE ...> line)");
  if (element_depth(xml, kMaxXmlDepth) > kMaxXmlDepth)
    throw InputError(fmt::format(
        "{}: elements nested deeper than {} levels (expected a BeerXML document, which needs 5)", file, kMaxXmlDepth));
  if (!xml.document_element())
    throw InputError(file + ": no XML element (expected a BeerXML 1.0 document such as <RECIPES>...</RECIPES>)");
  XmlEncoding encoding;
  encoding.latin1 = declares_latin1(xml);
  encoding.bom = text.substr(0, 3) == "\xEF\xBB\xBF";
  return encoding;
}

std::string save_xml(const pugi::xml_document& xml, const XmlEncoding& encoding) {
  // pugixml keeps no text outside the root element: the top-level nodes (declaration, comments,
  // root) go one per line, as BeerXML files lay them out.
  std::ostringstream out;
  if (encoding.bom && !encoding.latin1) out << "\xEF\xBB\xBF";
  for (pugi::xml_node node = xml.first_child(); node; node = node.next_sibling()) {
    node.print(out, "", pugi::format_raw, encoding.latin1 ? pugi::encoding_latin1 : pugi::encoding_utf8);
    out << '\n';
  }
  return out.str();
}

bool tag_is(const pugi::xml_node& node, std::string_view tag) {
  if (node.type() != pugi::node_element) return false;
  const std::string_view name = node.name();
  return name.size() == tag.size() && lower(name) == lower(tag);
}

pugi::xml_node child_element(const pugi::xml_node& node, std::string_view tag) {
  for (pugi::xml_node child = node.first_child(); child; child = child.next_sibling())
    if (tag_is(child, tag)) return child;
  return {};
}

std::string child_text(const pugi::xml_node& node, std::string_view tag) {
  return child_element(node, tag).child_value();
}

std::string element_path(const pugi::xml_node& node) {
  std::vector<std::string> parts;
  for (pugi::xml_node at = node; at && at.type() == pugi::node_element; at = at.parent()) {
    std::size_t position = 1, same = 0;
    for (pugi::xml_node sibling = at.parent().first_child(); sibling; sibling = sibling.next_sibling())
      if (tag_is(sibling, at.name())) ++same;
    for (pugi::xml_node sibling = at.previous_sibling(); sibling; sibling = sibling.previous_sibling())
      if (tag_is(sibling, at.name())) ++position;
    parts.push_back(same > 1 ? fmt::format("{}[{}]", at.name(), position) : std::string(at.name()));
  }
  std::string path;
  for (auto part = parts.rbegin(); part != parts.rend(); ++part) path += "/" + *part;
  return path;
}

std::optional<double> parse_plain_number(std::string_view text) {
  text = trim_space(text);
  if (!text.empty() && text.front() == '+') text.remove_prefix(1);
  if (text.empty()) return std::nullopt;
  double value = 0.0;
  const auto [end, error] = std::from_chars(text.data(), text.data() + text.size(), value);
  if (error != std::errc() || end != text.data() + text.size() || !std::isfinite(value)) return std::nullopt;
  return value;
}

std::optional<std::string> XmlFields::text(std::string_view tag, bool required) const {
  const pugi::xml_node child = child_element(node_, tag);
  const std::string value(trim_space(child.child_value()));
  if (!child || value.empty()) {
    if (required) diagnostics_.add(path(tag), child ? "is empty (required)" : "is missing (required)");
    return std::nullopt;
  }
  return value;
}

std::optional<double> XmlFields::number(std::string_view tag, bool required) const {
  const auto value = text(tag, required);
  if (!value) return std::nullopt;
  const auto parsed = parse_plain_number(*value);
  if (!parsed) {
    diagnostics_.add(path(tag),
                     fmt::format("{} is not a number (expected a plain decimal such as 4.5)", shown_value(*value)));
  }
  return parsed;
}

std::optional<double> XmlFields::leading_number(std::string_view tag) const {
  const std::string value(trim_space(child_element(node_, tag).child_value()));
  double parsed = 0.0;
  const auto [end, error] = std::from_chars(value.data(), value.data() + value.size(), parsed);
  if (error != std::errc() || end == value.data() || !std::isfinite(parsed)) return std::nullopt;
  return parsed;
}

}  // namespace bine
