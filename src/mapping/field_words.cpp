#include "mapping/field_words.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <initializer_list>

namespace rimline::mapping::detail {
namespace {

// UTF-8 letters of Latin-1 and Latin Extended-A folded to ASCII (the second byte after 0xC3 / 0xC5).
std::string_view fold(unsigned char lead, unsigned char c) {
  if (lead == 0xC3) {
    switch (c) {
      case 0x84: case 0xA4: return "AE";  // Ä ä
      case 0x96: case 0xB6: return "OE";  // Ö ö
      case 0x9C: case 0xBC: return "UE";  // Ü ü
      case 0x9F: return "SS";             // ß
      case 0x98: case 0xB8: return "OE";  // Ø ø
      case 0x85: case 0xA5: return "AA";  // Å å
      case 0x86: case 0xA6: return "AE";  // Æ æ
      case 0x91: case 0xB1: return "N";   // Ñ ñ
      default: break;
    }
    if ((c >= 0x80 && c <= 0x83) || (c >= 0xA0 && c <= 0xA3)) return "A";
    if ((c >= 0x88 && c <= 0x8B) || (c >= 0xA8 && c <= 0xAB)) return "E";
    if ((c >= 0x8C && c <= 0x8F) || (c >= 0xAC && c <= 0xAF)) return "I";
    if ((c >= 0x92 && c <= 0x95) || (c >= 0xB2 && c <= 0xB5)) return "O";
    if ((c >= 0x99 && c <= 0x9B) || (c >= 0xB9 && c <= 0xBB)) return "U";
    if (c == 0x87 || c == 0xA7) return "C";
  }
  return "";
}

bool any_of(const std::vector<std::string>& words, std::initializer_list<std::string_view> vocabulary) {
  for (const auto& w : words)
    for (std::string_view v : vocabulary)
      if (w == v) return true;
  std::string joined;
  for (const auto& w : words) joined += w;
  for (std::string_view v : vocabulary)
    if (v.size() >= 5 && joined == v) return true;
  return false;
}

// A word that starts with one of the stems ("SOHLHOEHE" with "SOHL").
bool any_stem(const std::vector<std::string>& words, std::initializer_list<std::string_view> stems) {
  for (const auto& w : words)
    for (std::string_view s : stems)
      if (w.size() >= s.size() && w.compare(0, s.size(), s) == 0) return true;
  return false;
}

}  // namespace

std::vector<std::string> words_of(std::string_view text) {
  std::vector<std::string> out;
  std::string w;
  bool prev_lower = false;
  auto flush = [&] {
    if (!w.empty()) out.push_back(std::move(w));
    w.clear();
  };
  for (std::size_t i = 0; i < text.size(); ++i) {
    const auto c = static_cast<unsigned char>(text[i]);
    if (c >= 0xC0 && i + 1 < text.size()) {
      const std::string_view f = fold(c, static_cast<unsigned char>(text[i + 1]));
      ++i;
      if (!f.empty()) {
        w += f;
        prev_lower = true;
        continue;
      }
      flush();
      continue;
    }
    if (!std::isalnum(c)) {
      flush();
      prev_lower = false;
      continue;
    }
    if (std::isupper(c) && prev_lower) flush();
    w += static_cast<char>(std::toupper(c));
    prev_lower = std::islower(c) != 0;
  }
  flush();
  return out;
}

bool says(const std::vector<std::string>& n, Word w) {
  switch (w) {
    case Word::id:
      return any_of(n, {"ID", "NR", "NO", "NUM", "NUMBER", "NUMMER", "NUMERO", "CODE", "KEY", "REF", "IDENT",
                        "KENNUNG", "LOPNR", "TAG", "ASSET", "GUID", "UUID", "CODIGO", "IDENTIFIANT"});
    case Word::invert:
      return any_of(n, {"INV", "INVERT", "IL", "IE", "INVERTLEVEL", "SOHLE", "SH", "RADIER", "FE", "BOB", "COTA",
                        "BATEA", "SOLERA", "FONDO", "VG", "BUND", "BUNDKOTE", "BUNNKOTE", "BOTTOM", "FLOWLINE",
                        "FL", "ELEV", "LEVEL", "NIVEAU", "KOTE", "HOEHE"}) ||
             any_stem(n, {"SOHL", "INVERT", "RADIER", "BUNDK", "BUNNK", "VATTENG"});
    case Word::rim:
      return any_of(n, {"RIM", "COVER", "LID", "TOP", "GROUND", "GL", "RL", "SURFACE", "DECKEL", "DH", "GOK",
                        "GELAENDE", "TAMPON", "TN", "MAAIVELD", "MV", "DEKSEL", "TAPA", "RASANTE", "TERRENO", "LOCK",
                        "MARK", "DAEKSEL", "LOKK", "TERRAENG", "TERRENG", "TERRAIN", "CL"}) ||
             any_stem(n, {"DECKEL", "GELAEND", "TERRAIN", "MAAIVELD", "DAEKSEL"});
    case Word::upstream:
      return any_of(n, {"US", "UP", "UPS", "UPSTREAM", "UPSTR", "START", "BEG", "BEGIN", "OBEN", "ZULAUF", "AMONT",
                        "BOVEN", "ARRIBA", "INICIO", "INI", "OPS", "OPSTROEMS", "OPPSTROEMS", "UPPSTROEMS", "US1",
                        "1", "ANFANG", "A", "IN"}) ||
             any_stem(n, {"UPSTR", "ZULAUF", "AMONT", "OPSTR", "OPPSTR", "UPPSTR", "ANFANG", "INICI"});
    case Word::downstream:
      return any_of(n, {"DS", "DN", "DOWN", "DOWNSTREAM", "DNSTR", "END", "ENDE", "UNTEN", "ABLAUF", "AVAL", "EIND",
                        "BENEDEN", "ABAJO", "FIN", "FINAL", "NED", "NEDSTROEMS", "2", "E", "OUT", "SLUT"}) ||
             any_stem(n, {"DOWNSTR", "ABLAUF", "AVAL", "NEDSTR", "EIND"});
    case Word::from:
      return any_of(n, {"FROM", "VON", "DE", "DEPART", "VAN", "DESDE", "ORIGEN", "FRA", "FRAN", "FRAAN", "SOURCE"});
    case Word::to:
      return any_of(n, {"TO", "NACH", "BIS", "A", "ARRIVEE", "NAAR", "HASTA", "DESTINO", "TIL", "TILL", "TARGET"});
    case Word::node:
      return any_of(n, {"NODE", "NODEID", "MH", "MANHOLE", "KNOTEN", "SCHACHT", "NOEUD", "REGARD", "KNOOP", "PUT",
                        "NODO", "POZO", "KNUDE", "BROEND", "KUM", "BRUNN", "STRUCT", "STRUCTURE", "JUNCTION"}) ||
             any_stem(n, {"SCHACHT", "KNOTEN", "MANHOLE", "NOEUD", "KNOOP"});
    case Word::diameter:
      return any_of(n, {"DIA", "DIAM", "DIAMETER", "DIAMETRE", "DIAMETRO", "DN", "NW", "DURCHMESSER", "DIM",
                        "DIMENSION", "DIMENSJON", "SIZE", "PIPESIZE", "DM"}) ||
             any_stem(n, {"DIAM", "DURCHM"});
    case Word::width:
      return any_of(n, {"WIDTH", "W", "SPAN", "BREITE", "LARGEUR", "BREEDTE", "ANCHO", "BREDDE", "BREDD", "B"}) ||
             any_stem(n, {"BREIT", "LARGEUR", "BREED", "ANCH"});
    case Word::height:
      return any_of(n, {"HEIGHT", "HT", "H", "RISE", "HOEHE", "HAUTEUR", "HOOGTE", "ALTO", "ALTURA", "HOEJDE",
                        "HOEYDE", "HOEJD"}) ||
             any_stem(n, {"HEIGHT", "HAUTEUR", "HOOGT", "ALTUR"});
    case Word::length:
      return any_of(n, {"LENGTH", "LEN", "LENG", "LAENGE", "LONGUEUR", "LENGTE", "LONGITUD", "LAENGDE", "LENGDE",
                        "LAENGD", "L"}) ||
             any_stem(n, {"LENGTH", "LAENG", "LONGUEUR", "LONGITUD"});
    case Word::shape:
      return any_of(n, {"SHAPE", "SECTION", "XSECTION", "FORM", "PROFIL", "PROFILE", "FORME", "VORM", "SECCION",
                        "PROFILART", "TVAERSNIT", "TVARSNITT"}) ||
             any_stem(n, {"PROFIL", "SECTION", "SECCI"});
    case Word::material:
      return any_of(n, {"MATERIAL", "MAT", "MATL", "WERKSTOFF", "MATERIAU", "MATERIAAL", "MATERIALE"}) ||
             any_stem(n, {"MATERI", "WERKST"});
    case Word::roughness:
      return any_of(n, {"MANNING", "MANNINGS", "N", "NVALUE", "ROUGHNESS", "ROUGH", "RAUHEIT", "KST", "RUGOSITE",
                        "RUWHEID", "RUGOSIDAD", "RUHED"});
    case Word::flow:
      return any_of(n, {"FLOW", "Q", "INFLOW", "DISCHARGE", "QDESIGN", "DESIGNFLOW", "QPEAK", "ZUFLUSS", "ABFLUSS",
                        "DEBIT", "CAUDAL", "DEBIET", "AFVOER", "FLOEDE", "FLODE", "LOAD", "QZU", "ZU"}) ||
             any_stem(n, {"ZUFLU", "ABFLU", "CAUDAL", "DEBIT"});
    case Word::type:
      return any_of(n, {"TYPE", "KIND", "CLASS", "SUBTYPE", "FEATURETYPE", "TYP", "ART", "GENRE", "SOORT", "TIPO",
                        "CATEGORY", "KATEGORIE", "FUNCTION", "FUNKTION", "USE"});
    case Word::pressure:
      return any_of(n, {"PRESSURE", "PRESS", "FORCEMAIN", "FM", "RM", "RISING", "DRUCK", "DRUCKLEITUNG",
                        "REFOULEMENT", "PERS", "PERSLEIDING", "IMPULSION", "TRYK", "TRYKK", "TRYCK"}) ||
             any_stem(n, {"DRUCK", "REFOUL", "PERSLEID", "IMPULSI", "TRYK", "TRYCK"});
    case Word::measured:
      return any_of(n, {"MEAS", "MEASURED", "SURVEY", "SURVEYED", "ASBUILT", "ACTUAL", "IST", "GEMESSEN", "MESS",
                        "REEL", "MESURE", "GEMETEN", "MEDIDO", "REAL", "MAALT", "MAETT", "MALT"}) ||
             any_stem(n, {"MEASUR", "SURVEY", "GEMESS", "GEMET", "MESUR"});
    case Word::design:
      return any_of(n, {"DESIGN", "DES", "PLAN", "PLANNED", "PROJ", "SOLL", "PROJET", "ONTWERP", "DISENO",
                        "PROYECTO", "PROJEKT", "PROJEKTERET", "THEORETICAL"}) ||
             any_stem(n, {"DESIGN", "PLANN", "ONTWERP", "PROYECT", "PROJEK"});
    case Word::slope:
      return any_of(n, {"SLOPE", "GRADE", "GRADIENT", "GEFAELLE", "PENTE", "VERHANG", "PENDIENTE", "FALD", "FALL",
                        "LUTNING"});
  }
  return false;
}

std::string kind_named(std::string_view value) {
  const auto w = words_of(value);
  if (any_of(w, {"OUTFALL", "OUTFALLS", "OUTLET", "OF", "OUT", "DISCHARGE", "HEADWALL", "AUSLASS", "AUSLAUF",
                 "EINLEITUNG", "EXUTOIRE", "REJET", "SORTIE", "UITLAAT", "UITSTROOM", "VERTIDO", "DESCARGA",
                 "SALIDA", "DESAGUE", "UDLOEB", "UTLOEP", "UTLOPP", "OUTFLL", "OUTFL", "ENDWALL"}) ||
      any_stem(w, {"OUTFAL", "OUTLET", "AUSLA", "EXUTOIR", "UITLA", "VERTID", "UDLOEB", "UTLOEP", "UTLOPP"}))
    return "outfall";
  if (any_of(w, {"PS", "PUMP", "PUMPSTATION", "LS", "LIFTSTATION", "WETWELL", "WW", "PW", "PUMPWERK", "POMPE",
                 "GEMAAL", "BOMBEO", "EBAR", "PUMPESTATION", "PUMPSTATION"}) ||
      any_stem(w, {"PUMP", "POMP", "GEMAAL", "BOMBE"}))
    return "pump_station";
  if (any_of(w, {"INLET", "CB", "CATCHBASIN", "GULLY", "GI", "DI", "CI", "GRATE", "EINLAUF", "STRASSENABLAUF",
                 "SINKKASTEN", "AVALOIR", "GRILLE", "KOLK", "SUMIDERO", "IMBORNAL", "REJILLA", "RISTBRUNN",
                 "DAGVATTENBRUNN", "RENDESTENSBROEND", "SLUKOEK", "SLUK", "INL", "INLT"}) ||
      any_stem(w, {"INLET", "CATCHB", "GULL", "EINLAUF", "AVALOIR", "SUMIDER", "IMBORNAL", "SINKK"}))
    return "inlet";
  if (any_of(w, {"JUNCTION", "JCT", "JB", "JUNC", "CHAMBER", "VAULT", "BAUWERK", "CHAMBRE", "KAMER", "CAMARA",
                 "KAMMER"}) ||
      any_stem(w, {"JUNCT", "CHAMB"}))
    return "junction";
  if (any_of(w, {"MH", "MANHOLE", "SMH", "SSMH", "SDMH", "AH", "ACCESS", "SCHACHT", "REGARD", "PUT", "POZO",
                 "POZOREGISTRO", "BROEND", "KUM", "BRUNN", "NODE", "CO", "CLEANOUT", "MAN", "INSPECTION", "IC"}) ||
      any_stem(w, {"MANHOL", "SCHACHT", "REGARD", "INSPECT"}))
    return "manhole";
  return "";
}

std::string shape_named(std::string_view value) {
  const auto w = words_of(value);
  if (any_of(w, {"CIRC", "CIRCULAR", "CIRCLE", "ROUND", "C", "CIR", "K", "KREIS", "RUND", "CIRCULAIRE", "ROND",
                 "O", "RO", "CIRKEL", "CIRCULAR", "REDONDO", "CIRKULAER", "SIRKULAER", "KR", "KREISPROFIL"}) ||
      any_stem(w, {"CIRC", "KREIS", "ROND", "REDOND"}))
    return "circular";
  // The egg (ovoid) section of older sewers: English, German (Ei-, Eiprofil), French/Spanish/Italian
  // (ovoide), Dutch (eivormig), Danish/Norwegian written without the letter ae (AEG).
  if (any_of(w, {"EGG", "EGGSHAPED", "OVOID", "OVOIDAL", "OVOIDE", "OV", "EI", "EIPROFIL", "EIFORM", "EIVORMIG",
                 "AEG", "EGGFORMET", "AEGGEFORMET"}) ||
      any_stem(w, {"OVOID", "EIPROF", "EIVORM", "EGGSHAP"}))
    return "egg";
  if (any_of(w, {"BOX", "RECT", "RECTANGULAR", "RECTANGLE", "R", "RE", "RCB", "CULVERT", "RECHTECK", "REC",
                 "KASTEN", "RECTANGULAIRE", "CADRE", "DALOT", "RECHTHOEK", "RECHTHOEKIG", "RECTANGULO", "CAJON",
                 "REKTANGULAER", "SQUARE", "SQ", "KAST"}) ||
      any_stem(w, {"RECT", "RECHT", "KASTEN", "DALOT", "CAJON", "REKTANG"}))
    return "box";
  return "";
}

bool pressure_named(std::string_view value) { return says(words_of(value), Word::pressure); }

bool material_named(std::string_view value) {
  const auto w = words_of(value);
  return any_of(w, {"RC", "RCP", "CONC", "CON", "CONCRETE", "PVC", "UPVC", "PVCU", "PE", "HDPE", "PEHD", "PP",
                    "VC", "VCP", "CLAY", "CI", "DI", "DIP", "CIP", "STEEL", "ST", "STL", "GRP", "GRC", "FRP", "BWK",
                    "BK", "BRICK", "AC", "ACP", "CMP", "CSP", "B", "BETON", "STB", "STZ", "STEINZEUG", "GUSS", "GG",
                    "GGG", "FONTE", "GRES", "FIBROCIMENT", "HORMIGON", "HA", "HM", "FUNDICION", "BETONG", "PLAST",
                    "STAAL", "STAL", "LERA", "TEGL", "AZ", "FZ", "MSCL", "CONCPL", "MAUERWERK", "MW", "PRC", "PCCP",
                    "RPM", "ABS", "SP", "ASBESTOS", "CEMENT", "EW", "KERAMIK", "IRON", "MASONRY", "STONEWARE"}) ||
         any_stem(w, {"CONCR", "BETON", "STEINZ", "PVC", "HDPE", "HORMIG", "FUNDIC", "GRES", "FIBRO", "MAUERW"});
}

bool yes_value(std::string_view value) {
  const auto w = words_of(value);
  return w.size() == 1 &&
         any_of(w, {"Y", "YES", "1", "TRUE", "T", "J", "JA", "OUI", "O", "SI", "S", "X", "WAHR", "VRAI", "WAAR"});
}

}  // namespace rimline::mapping::detail
