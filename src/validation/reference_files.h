// The ISO 10211 validation cases as detail-file text, compiled into the program.
#pragma once

namespace edgeflux {

const char* iso10211_case1_xml();  ///< tests/reference/iso10211_case1.xml
const char* iso10211_case2_xml();  ///< tests/reference/iso10211_case2.xml

}  // namespace edgeflux
