#include "skein/time/epoch.hpp"

#include <charconv>
#include <cmath>
#include <cstdio>

#include "skein/constants.hpp"

namespace skein {
namespace {

bool parse_int(std::string_view s, int& out) {
  if (s.empty()) return false;
  for (char c : s)
    if (c < '0' || c > '9') return false;
  auto [p, ec] = std::from_chars(s.data(), s.data() + s.size(), out);
  return ec == std::errc() && p == s.data() + s.size();
}

bool is_leap(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

int days_in_month(int y, int m) {
  static constexpr int d[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  return (m == 2 && is_leap(y)) ? 29 : d[m - 1];
}

// Julian day number of a Gregorian calendar date (Fliegel & Van Flandern 1968).
long julian_day_number(int y, int m, int d) {
  const long yl = y, ml = m, dl = d;
  return dl - 32075 + 1461 * (yl + 4800 + (ml - 14) / 12) / 4 + 367 * (ml - 2 - (ml - 14) / 12 * 12) / 12 -
         3 * ((yl + 4900 + (ml - 14) / 12) / 100) / 4;
}

}  // namespace

std::optional<UtcEpoch> parse_utc_iso8601(std::string_view t) {
  // YYYY-MM-DDThh:mm:ss
  if (t.size() < 20) return std::nullopt;
  if (t[4] != '-' || t[7] != '-' || (t[10] != 'T' && t[10] != ' ') || t[13] != ':' || t[16] != ':')
    return std::nullopt;
  UtcEpoch e;
  if (!parse_int(t.substr(0, 4), e.year) || !parse_int(t.substr(5, 2), e.month) || !parse_int(t.substr(8, 2), e.day) ||
      !parse_int(t.substr(11, 2), e.hour) || !parse_int(t.substr(14, 2), e.minute))
    return std::nullopt;
  std::string_view rest = t.substr(17);
  std::string_view zone;
  if (rest.ends_with("Z")) {
    zone = "Z";
    rest.remove_suffix(1);
  } else if (rest.ends_with("+00:00")) {
    zone = "+00:00";
    rest.remove_suffix(6);
  } else {
    return std::nullopt;
  }
  int whole = 0;
  std::string_view sec_int = rest.substr(0, rest.find('.'));
  if (sec_int.size() != 2 || !parse_int(sec_int, whole)) return std::nullopt;
  double frac = 0.0;
  if (rest.size() > 2) {
    if (rest[2] != '.' || rest.size() == 3) return std::nullopt;
    std::string_view digits = rest.substr(3);
    double scale = 0.1;
    for (char c : digits) {
      if (c < '0' || c > '9') return std::nullopt;
      frac += (c - '0') * scale;
      scale *= 0.1;
    }
  }
  e.second = whole + frac;
  if (e.year < min_epoch_year || e.year > max_epoch_year || e.month < 1 || e.month > 12 || e.day < 1 ||
      e.day > days_in_month(e.year, e.month) || e.hour > 23 || e.minute > 59 || e.second >= 61.0)
    return std::nullopt;
  return e;
}

std::string format_utc_iso8601(const UtcEpoch& e, int decimals) {
  char buf[64];
  if (decimals <= 0) {
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02dT%02d:%02d:%02dZ", e.year, e.month, e.day, e.hour, e.minute,
                  static_cast<int>(std::floor(e.second)));
  } else {
    std::snprintf(buf, sizeof buf, "%04d-%02d-%02dT%02d:%02d:%0*.*fZ", e.year, e.month, e.day, e.hour, e.minute,
                  decimals + 3, decimals, e.second);
  }
  return buf;
}

JulianDate julian_date(const UtcEpoch& e) {
  JulianDate jd;
  jd.day = static_cast<double>(julian_day_number(e.year, e.month, e.day)) - 0.5;
  jd.fraction = (e.hour * 3600.0 + e.minute * 60.0 + e.second) / seconds_per_day;
  return jd;
}

UtcEpoch add_seconds(const UtcEpoch& epoch, double dt_s) {
  // Work in whole days since the epoch's midnight plus seconds of day, then convert back.
  const double sod = epoch.hour * 3600.0 + epoch.minute * 60.0 + epoch.second + dt_s;
  const double day_shift = std::floor(sod / seconds_per_day);
  double rem = sod - day_shift * seconds_per_day;
  // Calendar from Julian day number (Fliegel & Van Flandern 1968, inverse algorithm).
  long jdn = julian_day_number(epoch.year, epoch.month, epoch.day) + static_cast<long>(day_shift);
  long l = jdn + 68569;
  const long n = 4 * l / 146097;
  l = l - (146097 * n + 3) / 4;
  const long i = 4000 * (l + 1) / 1461001;
  l = l - 1461 * i / 4 + 31;
  const long j = 80 * l / 2447;
  UtcEpoch out;
  out.day = static_cast<int>(l - 2447 * j / 80);
  l = j / 11;
  out.month = static_cast<int>(j + 2 - 12 * l);
  out.year = static_cast<int>(100 * (n - 49) + i + l);
  // Round away sub-microsecond noise so that formatting is stable.
  rem = std::round(rem * 1e6) / 1e6;
  if (rem >= seconds_per_day) rem = seconds_per_day - 1e-6;
  out.hour = static_cast<int>(rem / 3600.0);
  rem -= out.hour * 3600.0;
  out.minute = static_cast<int>(rem / 60.0);
  out.second = rem - out.minute * 60.0;
  return out;
}

double greenwich_mean_sidereal_angle_rad(const JulianDate& jd) {
  // Centuries of UT1 since J2000.0 and the fraction of the UT1 day.
  const double d = (jd.day - j2000_julian_date) + jd.fraction;
  const double t = d / 36525.0;
  // GMST in seconds of time (Aoki et al. 1982):
  // GMST(0h UT1) = 24110.54841 + 8640184.812866 T + 0.093104 T^2 - 6.2e-6 T^3 s, where T counts from J2000.0
  // including the day fraction, so the 1.0027379 ratio of sidereal to solar rate comes from the T term and
  // the elapsed UT1 of the day enters once more as whole seconds; the 12 h shift is because T counts from noon.
  const double frac_day = std::fmod(jd.day, 1.0) + std::fmod(jd.fraction, 1.0);
  const double gmst_s = 24110.54841 - seconds_per_day / 2.0 + seconds_per_day * frac_day +
                        (8640184.812866 + (0.093104 - 6.2e-6 * t) * t) * t;
  double angle = std::fmod(gmst_s * two_pi / seconds_per_day, two_pi);
  if (angle < 0.0) angle += two_pi;
  return angle;
}

}  // namespace skein
