// The benchmark reads TSPLIB instances with the same reader as the tests; bench/support/*.cpp is
// compiled into ringroad_bench_support, so this thin file brings the reader in.
#include "tests/support/tsplib_reader.cpp"
