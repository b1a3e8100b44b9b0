#pragma once
// Standard output that reports its failures: a full disk (`> /dev/full`), a closed descriptor.
// guard_standard_output() runs first thing in main(): when descriptor 1 is closed it parks
// /dev/null there (so no file opened later lands on descriptor 1 and receives the output) and
// remembers that any write to standard output must fail. Text goes through std::cout.

#include <string>
#include <string_view>

namespace ringroad {

void guard_standard_output();

// Writes and flushes; throws InputError ("standard output: ...") when that fails.
void write_standard_output(std::string_view text);

// Flushes std::cout; an empty string when everything written so far arrived, else the one-line
// reason ("cannot write to standard output: No space left on device").
std::string finish_standard_output();

} // namespace ringroad
