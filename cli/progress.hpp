#pragma once
// The one progress display of the commands: a bar on stderr with the share done, the rate and the time left,
// redrawn every half second by a helper thread, only when stderr is a terminal (nothing otherwise).
#include <chrono>
#include <condition_variable>
#include <functional>
#include <mutex>
#include <string>
#include <thread>

namespace skein::cli {

// "m:ss" or "h:mm:ss" for a duration in seconds; "--:--" when unknown.
std::string format_duration(double seconds);

class Progress {
 public:
  // `label` starts the line ("coverage", "sweep"); `done` reads the work finished so far, out of `total`;
  // `unit` names it in the line ("layouts"), or is empty to show the share only.
  // `note`, when set, adds a short text after the share (the search's current best and bound).
  Progress(std::string label, std::function<double()> done, double total, std::string unit = "",
           std::function<std::string()> note = {});
  ~Progress();
  Progress(const Progress&) = delete;
  Progress& operator=(const Progress&) = delete;

 private:
  void draw();
  std::string label_, unit_;
  std::function<double()> done_;
  std::function<std::string()> note_;
  double total_;
  std::chrono::steady_clock::time_point start_;
  std::mutex m_;
  std::condition_variable cv_;
  bool stop_ = false;
  std::thread thread_;
};

}  // namespace skein::cli
