#pragma once
// RFC 4180 CSV writing: fields are quoted only when they need it; lines end in CRLF as the RFC says.

#include <string>
#include <string_view>
#include <vector>

namespace ringroad {

std::string csv_quote(std::string_view field);
// Appends one record (fields joined by commas, CRLF at the end) to `out`.
void append_csv_row(std::string& out, const std::vector<std::string>& fields);

} // namespace ringroad
