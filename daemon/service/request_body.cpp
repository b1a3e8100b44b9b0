#include "daemon/service/request_body.hpp"

#include "daemon/answers/json_answer.hpp"

#include <nlohmann/json.hpp>

#include <string>
#include <vector>

namespace ringroad::service {

namespace {

using json = nlohmann::ordered_json;

// Builds the document with nlohmann's DOM builder and keeps, beside it, where in the document the
// parser stands, so an error can name the field.
class PathTrackingBuilder {
public:
    using number_integer_t = json::number_integer_t;
    using number_unsigned_t = json::number_unsigned_t;
    using number_float_t = json::number_float_t;
    using string_t = json::string_t;
    using binary_t = json::binary_t;

    PathTrackingBuilder(json& result, std::size_t max_depth) : builder_(result, false), max_depth_(max_depth) {}

    bool null() { return scalar(builder_.null()); }
    bool boolean(bool value) { return scalar(builder_.boolean(value)); }
    bool number_integer(number_integer_t value) { return scalar(builder_.number_integer(value)); }
    bool number_unsigned(number_unsigned_t value) { return scalar(builder_.number_unsigned(value)); }
    bool number_float(number_float_t value, const string_t& text) { return scalar(builder_.number_float(value, text)); }
    bool string(string_t& value) { return scalar(builder_.string(value)); }
    bool binary(binary_t& value) { return scalar(builder_.binary(value)); }

    bool start_object(std::size_t elements) { return open(false) && builder_.start_object(elements); }
    bool start_array(std::size_t elements) { return open(true) && builder_.start_array(elements); }
    bool key(string_t& name) {
        frames_.back().key = name;
        frames_.back().has_key = true;
        return builder_.key(name);
    }
    bool end_object() { return close(builder_.end_object()); }
    bool end_array() { return close(builder_.end_array()); }

    bool parse_error(std::size_t position, const std::string& /*last_token*/, const nlohmann::detail::exception& error) {
        std::string message = error.what();
        // "[json.exception.parse_error.101] parse error at line 1, column 7: ..." -> from "parse error"
        if (const auto bracket = message.find("] "); message.rfind("[json.exception.", 0) == 0 && bracket != std::string::npos) {
            message.erase(0, bracket + 2);
        }
        if (message.find("byte") == std::string::npos && message.find("position") == std::string::npos) {
            message += " (at byte " + std::to_string(position) + ")";
        }
        throw answers::RequestError(400, "invalid_json", "the body is not valid JSON: " + message, path());
    }

private:
    struct Frame {
        bool is_array = false;
        std::size_t index = 0;   // arrays: the element being read
        std::string key;         // objects: the member being read
        bool has_key = false;
    };

    bool scalar(bool accepted) {
        value_done();
        return accepted;
    }
    bool open(bool is_array) {
        if (frames_.size() >= max_depth_) {
            throw answers::RequestError(400, "too_deep",
                                        "the body nests arrays and objects deeper than " + std::to_string(max_depth_) +
                                            " levels",
                                        path());
        }
        frames_.push_back(Frame{is_array, 0, {}, false});
        return true;
    }
    bool close(bool accepted) {
        frames_.pop_back();
        value_done();
        return accepted;
    }
    void value_done() {
        if (frames_.empty()) return;
        Frame& frame = frames_.back();
        if (frame.is_array) {
            ++frame.index;
        } else {
            frame.has_key = false;
        }
    }
    std::string path() const {
        std::string text;
        for (const Frame& frame : frames_) {
            if (frame.is_array) {
                text += "[" + std::to_string(frame.index) + "]";
            } else if (frame.has_key) {
                if (!text.empty()) text += '.';
                text += frame.key;
            } else {
                break;   // between members: the object itself is at fault
            }
        }
        return text;
    }

    nlohmann::detail::json_sax_dom_parser<json> builder_;
    std::size_t max_depth_;
    std::vector<Frame> frames_;
};

} // namespace

json parse_request_body(std::string_view body, std::size_t max_depth) {
    if (body.find_first_not_of(" \t\r\n") == std::string_view::npos) {
        throw answers::RequestError(400, "invalid_json", "the body is empty; send a JSON object");
    }
    json result;
    PathTrackingBuilder builder(result, max_depth);
    json::sax_parse(body.begin(), body.end(), &builder, nlohmann::detail::input_format_t::json, true);
    return result;
}

} // namespace ringroad::service
