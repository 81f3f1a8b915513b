#include "progress.hpp"

#include <unistd.h>

#include <fmt/format.h>

#include "commands.hpp"

namespace skein::cli {

std::string format_duration(double s) {
  if (!(s >= 0.0) || s > 1e8) return "--:--";
  const long t = static_cast<long>(s + 0.5);
  return t >= 3600 ? fmt::format("{}:{:02d}:{:02d}", t / 3600, (t / 60) % 60, t % 60)
                   : fmt::format("{}:{:02d}", t / 60, t % 60);
}

Progress::Progress(std::string label, std::function<double()> done, double total, std::string unit,
                   std::function<std::string()> note)
    : label_(std::move(label)), unit_(std::move(unit)), done_(std::move(done)), note_(std::move(note)), total_(total) {
  if (!isatty(STDERR_FILENO) || !(total_ > 0.0)) return;
  start_ = std::chrono::steady_clock::now();
  thread_ = std::thread([this] {
    std::unique_lock<std::mutex> lock(m_);
    while (!cv_.wait_for(lock, std::chrono::milliseconds(500), [this] { return stop_; })) draw();
  });
}

Progress::~Progress() {
  if (!thread_.joinable()) return;
  {
    std::lock_guard<std::mutex> lock(m_);
    stop_ = true;
  }
  cv_.notify_all();
  thread_.join();
  print_stderr("\r" + std::string(note_ ? 120 : 78, ' ') + "\r");
}

void Progress::draw() {
  const double d = done_();
  const double f = std::clamp(d / total_, 0.0, 1.0);
  const double s = std::chrono::duration<double>(std::chrono::steady_clock::now() - start_).count();
  const double rate = s > 0.0 ? d / s : 0.0;
  const int width = 24, fill = static_cast<int>(f * width);
  std::string line = fmt::format("\r{} [{}{}] {:5.1f} %", label_, std::string(fill, '#'), std::string(width - fill, '-'),
                                 100.0 * f);
  if (!unit_.empty()) line += fmt::format(" {:.0f}/{:.0f} {}  {:.2f}/s", d, total_, unit_, rate);
  if (note_)
    line += "  " + note_() + "  ";
  else
    line += "  left " + (rate > 0.0 ? format_duration((total_ - d) / rate) : std::string("--:--")) + "  ";
  print_stderr(line);
}

}  // namespace skein::cli
