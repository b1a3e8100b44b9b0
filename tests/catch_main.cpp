// The one Catch2 main shared (as an object library) by every test executable.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>
