#pragma once
// Tables of ground contacts, shared by `skein contacts` and the report folder.
#include "skein/coverage/contacts.hpp"
#include "skein/report/table.hpp"

namespace skein {

// One row per satellite and station: contacts and contact minutes per day, mean and longest contact.
Table contact_pair_table(const ContactResult& r);
// One row per satellite: contacts per day with all stations, and the longest time without any station in
// contact (the span's edges included).
Table contact_gap_table(const ContactResult& r);
// One row per station: share of the span busy (at least one satellite in contact) and the most satellites in
// contact at once (antennas needed).
Table station_load_table(const ContactResult& r);
// One row per station and count n = 0..max: the share of the span with exactly n satellites in contact.
Table station_in_view_table(const ContactResult& r);

}  // namespace skein
