#include "common/standard_output.hpp"

#include "common/input_error.hpp"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <iostream>
#include <streambuf>

namespace ringroad {

namespace {

int last_error = 0;   // errno of the first failed write to standard output

// Stands in for std::cout's buffer when descriptor 1 was closed: every write fails.
class ClosedOutput : public std::streambuf {
protected:
    int_type overflow(int_type) override {
        last_error = EBADF;
        return traits_type::eof();
    }
    std::streamsize xsputn(const char*, std::streamsize) override {
        last_error = EBADF;
        return 0;
    }
};

ClosedOutput closed_output;

std::string reason() {
    return std::string("cannot write to standard output: ") +
           (last_error == EBADF ? "it is closed" : std::strerror(last_error != 0 ? last_error : EIO));
}

bool flush_cout() {
    std::cout.flush();
    if (std::cout) return true;
    if (last_error == 0) last_error = errno;
    return false;
}

} // namespace

void guard_standard_output() {
    if (::fcntl(STDOUT_FILENO, F_GETFD) >= 0 || errno != EBADF) return;
    const int parked = ::open("/dev/null", O_WRONLY);
    if (parked >= 0 && parked != STDOUT_FILENO) {
        ::dup2(parked, STDOUT_FILENO);
        ::close(parked);
    }
    std::cout.rdbuf(&closed_output);
}

void write_standard_output(std::string_view text) {
    if (!flush_cout()) throw InputError(reason());
    errno = 0;
    std::cout.write(text.data(), static_cast<std::streamsize>(text.size()));
    if (!flush_cout()) throw InputError(reason());
}

std::string finish_standard_output() {
    return flush_cout() ? std::string() : reason();
}

} // namespace ringroad
