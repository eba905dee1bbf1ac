#pragma once
// Loading an XML document safely and reading its elements field by field with messages that name
// the file, the element path (/RECIPES/RECIPE[1]/HOPS/HOP[2]/ALPHA) and the value.
//
// Safety: a DOCTYPE is refused outright, so no DTD, internal entity or external entity is read
// (pugixml itself expands only the five predefined entities and character references); a document
// nested deeper than kMaxXmlDepth is refused; the depth walk is iterative, so 10^6 nested elements
// cost one pass and no stack.
#include <optional>
#include <pugixml.hpp>
#include <string>
#include <string_view>

#include "model/errors.hpp"

namespace bine {

/// Deepest element nesting accepted (BeerXML needs 5: RECIPES/RECIPE/HOPS/HOP/NAME).
inline constexpr int kMaxXmlDepth = 64;

/// How a document was stored, so that it is written back the same way.
struct XmlEncoding {
  bool latin1 = false;  // the declaration names ISO-8859-1 (held as UTF-8 in memory)
  bool bom = false;     // the file began with a UTF-8 byte-order mark
};

/// Parses `text` into `xml` or throws InputError ("FILE: not valid XML at line L, column C (...)",
/// "FILE: has a DOCTYPE ...", "FILE: nested deeper than ..."). Whitespace, comments, processing
/// instructions and the declaration are kept, so that a save writes back what was read.
XmlEncoding load_xml(std::string_view text, const std::string& file, pugi::xml_document& xml);

/// The document as text in the encoding it was read in; nothing reformatted.
std::string save_xml(const pugi::xml_document& xml, const XmlEncoding& encoding);

/// Whether the element's tag is `tag`, ignoring case (BeerXML writers differ).
bool tag_is(const pugi::xml_node& node, std::string_view tag);
/// The first child element whose tag is `tag` (ignoring case), or a null node.
pugi::xml_node child_element(const pugi::xml_node& node, std::string_view tag);
/// The text of that child, or "".
std::string child_text(const pugi::xml_node& node, std::string_view tag);
/// /ROOT/CHILD[2]/... with 1-based positions among same-tag siblings, for messages.
std::string element_path(const pugi::xml_node& node);

/// Reads the child elements of one element, reporting problems to Diagnostics with their path.
class XmlFields {
 public:
  XmlFields(pugi::xml_node node, std::string path, Diagnostics& diagnostics)
      : node_(node), path_(std::move(path)), diagnostics_(diagnostics) {}

  std::string path(std::string_view tag) const { return path_ + "/" + std::string(tag); }
  bool has(std::string_view tag) const { return static_cast<bool>(child_element(node_, tag)); }
  pugi::xml_node child(std::string_view tag) const { return child_element(node_, tag); }
  /// The child's text, trimmed; a missing or empty required child is reported.
  std::optional<std::string> text(std::string_view tag, bool required) const;
  /// The child's text as a plain decimal number ("4.5"); anything else is reported.
  std::optional<double> number(std::string_view tag, bool required) const;
  /// The number a text starts with ("1.050 sg" -> 1.05), for BeerXML's display fields; nullopt when
  /// the child is missing or does not start with one (not reported).
  std::optional<double> leading_number(std::string_view tag) const;
  Diagnostics& diagnostics() const { return diagnostics_; }

 private:
  pugi::xml_node node_;
  std::string path_;
  Diagnostics& diagnostics_;
};

/// A plain decimal number with optional sign and exponent, surrounding spaces allowed; nullopt else.
std::optional<double> parse_plain_number(std::string_view text);

}  // namespace bine
