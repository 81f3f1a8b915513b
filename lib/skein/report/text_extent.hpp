#pragma once
// A conservative estimate of the width of a line of SVG text, so that every figure can size its margins and
// legend from the text it holds instead of clipping it. The figures name "DejaVu Sans" first; its advance
// widths were read from the font's own metrics (hmtx table of /usr/share/fonts/truetype/dejavu/DejaVuSans.ttf,
// Debian fonts-dejavu-core 2.37, units per em 2048): widest glyphs '@' 1.00 em, 'W' 0.99, 'm' 0.97, '%' 0.95,
// 'M' 0.86; capitals 0.67 em on average and at most 0.79 apart from M and W; digits 0.636; lower case 0.56 on
// average. The estimate charges each character at least its class's widest glyph: 1.0 em for m, w, M, W, %, @
// and #, 0.80 em for any other capital, 0.64 em for everything else in ASCII, and 1.0 em for a character
// outside ASCII; bold text (DejaVu Sans Bold, widest 'W' 1.10 em) 1.12 times that. Fonts named after DejaVu
// (Arial and the generic sans-serif) are narrower, so the estimate stays an upper bound there too.
#include <string_view>

namespace skein {

inline constexpr double bold_width_factor = 1.12;

// Estimated width in px of `text` at `font_size_px`; UTF-8, every code point counted once.
inline double text_width_px(std::string_view text, double font_size_px, bool bold = false) {
  double em = 0.0;
  for (size_t i = 0; i < text.size(); ++i) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    if ((c & 0xC0) == 0x80) continue;  // a UTF-8 continuation byte: its code point is already counted
    if (c >= 0x80) em += 1.0;
    else if (c == 'm' || c == 'w' || c == 'M' || c == 'W' || c == '%' || c == '@' || c == '#') em += 1.0;
    else if (c >= 'A' && c <= 'Z') em += 0.80;
    else em += 0.64;
  }
  return em * font_size_px * (bold ? bold_width_factor : 1.0);
}

// Ascent and descent of a line of text as shares of the font size (DejaVu Sans: ascender 0.93 em, descender
// 0.24 em in its hhea table), used to check that text stays inside a figure vertically.
inline constexpr double text_ascent_em = 0.93;
inline constexpr double text_descent_em = 0.24;

}  // namespace skein
