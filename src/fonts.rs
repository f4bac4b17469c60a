//! Which characters the package's bundled fonts can draw. The report embeds only these
//! fonts (no system fonts, so every machine gives the same bytes); text the input gives
//! that none of them can draw is refused when the file is read, naming the characters,
//! rather than failing later in typesetting.

use std::collections::HashSet;
use std::sync::LazyLock;

/// Every code point some bundled font maps to a glyph (Typst falls back from font to
/// font, so one is enough).
static COVERED: LazyLock<HashSet<u32>> = LazyLock::new(|| {
    let mut set = HashSet::new();
    for data in typst_assets::fonts() {
        let count = ttf_parser::fonts_in_collection(data).unwrap_or(1);
        for index in 0..count {
            let Ok(face) = ttf_parser::Face::parse(data, index) else { continue };
            let Some(cmap) = face.tables().cmap else { continue };
            for sub in cmap.subtables {
                if sub.is_unicode() {
                    sub.codepoints(|cp| {
                        if sub.glyph_index(cp).is_some_and(|g| g.0 != 0) {
                            set.insert(cp);
                        }
                    });
                }
            }
        }
    }
    set
});

/// Whether the bundled fonts draw `c` (line breaks and tabs count as drawable).
pub fn drawable(c: char) -> bool {
    matches!(c, ' '..='~' | '\n' | '\t' | '\r') || COVERED.contains(&(c as u32))
}

/// Characters that reorder the text around them (bidirectional embeddings, overrides,
/// isolates and marks): what the sheet shows would not be what the file says.
pub fn reorders(c: char) -> bool {
    matches!(c, '\u{202A}'..='\u{202E}' | '\u{2066}'..='\u{2069}' | '\u{200E}' | '\u{200F}' | '\u{061C}')
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn latin_greek_and_symbols_are_drawn_others_are_not() {
        for c in ['a', 'é', 'ß', 'φ', 'Ω', 'Ж', '×', '≤', '—', '²'] {
            assert!(drawable(c), "{c}");
        }
        // CJK, Thai and emoji: no bundled font has them
        for c in ['漢', 'ก', '😀'] {
            assert!(!drawable(c), "{c}");
        }
        assert!(reorders('\u{202E}') && !reorders('a'));
    }
}
