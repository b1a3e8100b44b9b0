// The real `ringroad serve` as a child process: it exits 0 on SIGTERM and reloads on SIGHUP
// (signal(7)), logs one line per request, and refuses what it must at start-up (exit 1). Stopping
// with requests in flight is in service_faults_test. The region is the invented demo town.
#include "tests/daemon/service_test_support.hpp"

#include <fcntl.h>
#include <signal.h>
#include <sys/wait.h>


using namespace ringroad::test;
using nlohmann::json;

namespace {

struct ChildService {
    pid_t pid = -1;
    int stderr_fd = -1;
    std::string log;

    // Reads stderr until `text` appears (or 20 s pass); returns whether it did.
    bool wait_for(const std::string& text) {
        const auto deadline = std::chrono::steady_clock::now() + std::chrono::seconds(20);
        while (log.find(text) == std::string::npos && std::chrono::steady_clock::now() < deadline) {
            char buffer[4096];
            const ssize_t n = ::read(stderr_fd, buffer, sizeof buffer);
            if (n > 0) {
                log.append(buffer, static_cast<std::size_t>(n));
            } else if (n == 0) {
                return log.find(text) != std::string::npos;
            } else {
                std::this_thread::sleep_for(std::chrono::milliseconds(10));
            }
        }
        return log.find(text) != std::string::npos;
    }
};

ChildService start_serve(const std::vector<std::string>& arguments) {
    int pipe_fds[2];
    REQUIRE(::pipe(pipe_fds) == 0);
    ChildService child;
    child.pid = ::fork();
    if (child.pid == 0) {
        ::dup2(pipe_fds[1], 2);
        ::close(pipe_fds[0]);
        std::vector<char*> argv{const_cast<char*>(RINGROAD_BINARY), const_cast<char*>("serve")};
        for (const std::string& argument : arguments) argv.push_back(const_cast<char*>(argument.c_str()));
        argv.push_back(nullptr);
        ::execv(RINGROAD_BINARY, argv.data());
        ::_exit(127);
    }
    ::close(pipe_fds[1]);
    child.stderr_fd = pipe_fds[0];
    ::fcntl(child.stderr_fd, F_SETFL, O_NONBLOCK);
    return child;
}

int wait_exit_code(pid_t pid) {
    for (int wait = 0; wait < 2000; ++wait) {   // 20 s at most
        int status = 0;
        if (::waitpid(pid, &status, WNOHANG) == pid) return WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
        std::this_thread::sleep_for(std::chrono::milliseconds(10));
    }
    ::kill(pid, SIGKILL);
    ::waitpid(pid, nullptr, 0);
    return -1;
}

} // namespace

TEST_CASE("`ringroad serve`: SIGHUP reloads, SIGTERM stops with exit 0, one log line per request") {
    const std::string folder = make_scratch_dir("service-signals");
    const std::string socket_path = folder + "/serve.sock";
    ChildService child = start_serve({demo_region_path(), "--listen", "unix:" + socket_path, "--threads", "1"});
    REQUIRE(child.wait_for("SIGINT or SIGTERM stops"));
    CHECK(child.log.find("caution") != std::string::npos);
    {
        RawConnection connection = RawConnection::unix_socket(socket_path);
        connection.send(http_request_text("GET", "/v1/status", ""));
        CHECK(connection.read_answer().status == 200);
    }
    // time, client, method, path, status, milliseconds, bytes
    CHECK(child.wait_for(" unix GET /v1/status 200 "));
    ::kill(child.pid, SIGHUP);
    CHECK(child.wait_for("reloaded " + demo_region_path()));
    ::kill(child.pid, SIGTERM);
    CHECK(wait_exit_code(child.pid) == 0);
    child.wait_for("stopped");
    CHECK(child.log.find("ringroad: stopped") != std::string::npos);
    CHECK_FALSE(file_exists(socket_path));
    ::close(child.stderr_fd);
}

TEST_CASE("`ringroad serve` refuses an address beyond this machine without --token-file (exit 1)") {
    const CommandResult result = run_ringroad({"serve", demo_region_path(), "--listen", "0.0.0.0:0"});
    CHECK(result.exit_code == 1);
    CHECK(result.err.find("--token-file") != std::string::npos);
    const CommandResult missing = run_ringroad({"serve", "/nonexistent/region.rrg", "--listen", "127.0.0.1:0"});
    CHECK(missing.exit_code == 1);
    CHECK(missing.err.find("/nonexistent/region.rrg") != std::string::npos);
}
