#pragma once
// A minimal well-formedness check for the XML rimline writes (W3C XML 1.0, 5th ed., 2008:
// every start tag closed in order (sec. 3), attribute values quoted (sec. 3.1), '<' and '&'
// only as markup or entity references (sec. 2.4)). Returns "" when well formed, else what broke.
#include <map>
#include <string>
#include <vector>

namespace rimline::test {

struct XmlCheck {
  std::string error;
  std::map<std::string, int> elements;  // count of each element name
};

inline XmlCheck check_xml(const std::string& s, bool allow_html_void = false) {
  XmlCheck out;
  std::vector<std::string> open;
  std::size_t i = 0;
  auto fail = [&](const std::string& what) {
    out.error = what + " at byte " + std::to_string(i);
    return out;
  };
  while (i < s.size()) {
    if (s[i] == '&') {
      const auto semi = s.find(';', i);
      if (semi == std::string::npos || semi - i > 8) return fail("bare &");
      i = semi + 1;
      continue;
    }
    if (s[i] != '<') {
      ++i;
      continue;
    }
    if (s.compare(i, 4, "<!--") == 0) {
      i = s.find("-->", i);
      if (i == std::string::npos) return fail("open comment");
      i += 3;
      continue;
    }
    if (s.compare(i, 2, "<?") == 0 || s.compare(i, 2, "<!") == 0) {
      i = s.find('>', i);
      if (i == std::string::npos) return fail("open declaration");
      ++i;
      continue;
    }
    const bool closing = s.compare(i, 2, "</") == 0;
    std::size_t j = i + (closing ? 2 : 1);
    std::string name;
    while (j < s.size() && (std::isalnum(static_cast<unsigned char>(s[j])) || s[j] == '-' || s[j] == ':')) name += s[j++];
    if (name.empty()) return fail("'<' not starting a tag");
    char quote = 0;
    while (j < s.size() && (quote || s[j] != '>')) {
      if (quote) {
        if (s[j] == quote) quote = 0;
        else if (s[j] == '<') return fail("'<' in an attribute value");
      } else if (s[j] == '"' || s[j] == '\'') {
        quote = s[j];
      } else if (s[j] == '=' && j + 1 < s.size() && s[j + 1] != '"' && s[j + 1] != '\'') {
        return fail("unquoted attribute");
      }
      ++j;
    }
    if (j >= s.size()) return fail("unterminated tag " + name);
    const bool self_closing = s[j - 1] == '/';
    if (closing) {
      if (open.empty() || open.back() != name) return fail("</" + name + "> does not close " + (open.empty() ? "anything" : "<" + open.back() + ">"));
      open.pop_back();
    } else {
      ++out.elements[name];
      const bool html_void = allow_html_void && (name == "meta" || name == "br" || name == "hr");
      if (!self_closing && !html_void) open.push_back(name);
    }
    i = j + 1;
    // Raw-text elements hold no markup.
    if (!closing && (name == "style" || name == "title")) {
      const auto end = s.find("</" + name + ">", i);
      if (end == std::string::npos) return fail("unclosed " + name);
      i = end;
    }
  }
  if (!open.empty()) return fail("unclosed <" + open.back() + ">");
  return out;
}

}  // namespace rimline::test
