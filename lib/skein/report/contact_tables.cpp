#include "skein/report/contact_tables.hpp"

namespace skein {

Table contact_pair_table(const ContactResult& r) {
  Table t;
  t.title = "Ground contacts per satellite and station";
  t.columns = {{"satellite", "satellite", "", 0},
               {"station", "station", "", 0},
               {"contacts_per_day", "contacts", "per day", 2},
               {"contact_min_per_day", "contact time", "min/day", 1},
               {"mean_contact_min", "mean contact", "min", 2},
               {"longest_contact_min", "longest contact", "min", 2}};
  for (const SatelliteContacts& s : r.satellites)
    for (size_t k = 0; k < s.stations.size(); ++k) {
      const PairContacts& p = s.stations[k];
      const bool any = !p.intervals.empty();
      t.add_row({s.id, r.stations[k].name, p.contacts_per_day, p.minutes_per_day,
                 any ? Cell{p.mean_contact_min} : Cell{}, any ? Cell{p.longest_contact_min} : Cell{}});
    }
  return t;
}

Table contact_gap_table(const ContactResult& r) {
  Table t;
  t.title = "Longest time without any ground contact, per satellite";
  t.columns = {{"satellite", "satellite", "", 0},
               {"contacts_per_day", "contacts (all stations)", "per day", 2},
               {"longest_gap_min", "longest time without contact", "min", 1}};
  for (const SatelliteContacts& s : r.satellites) {
    double per_day = 0.0;
    for (const PairContacts& p : s.stations) per_day += p.contacts_per_day;
    t.add_row({s.id, per_day, s.longest_gap_min});
  }
  return t;
}

Table station_load_table(const ContactResult& r) {
  Table t;
  t.title = "Ground station load";
  t.columns = {{"station", "station", "", 0},
               {"busy_pct", "busy", "% of time", 2},
               {"max_in_view", "most satellites at once (antennas)", "", 0}};
  for (const StationLoad& s : r.stations) t.add_row({s.name, 100.0 * s.busy_share, static_cast<long>(s.max_in_view)});
  return t;
}

Table station_in_view_table(const ContactResult& r) {
  Table t;
  t.title = "Time share by number of satellites in contact, per station";
  t.columns = {{"station", "station", "", 0},
               {"satellites_in_contact", "satellites in contact", "", 0},
               {"time_pct", "time", "%", 3}};
  for (const StationLoad& s : r.stations)
    for (size_t n = 0; n < s.share_by_count.size(); ++n)
      t.add_row({s.name, static_cast<long>(n), 100.0 * s.share_by_count[n]});
  return t;
}

}  // namespace skein
