//! Exporters: SVG text as drawn, PDF through `svg2pdf` (text kept as text, fonts embedded)
//! and PNG through `resvg`. Fonts: the bundled DejaVu Sans first, then the system's fonts
//! as fallback for characters it lacks, so sheets look the same on every machine.

use std::collections::HashMap;
use std::path::Path;
use std::sync::{Arc, OnceLock};

use pdf_writer::{Content, Finish, Name, Pdf, Rect as PdfRect, Ref};
use resvg::tiny_skia;
use thiserror::Error;
use usvg::fontdb;

use super::text::BUNDLED_FONT;

/// Why a sheet could not be exported.
#[derive(Debug, Error, Clone, PartialEq)]
pub enum ExportError {
    /// The SVG we drew did not parse (a bug, reported rather than hidden).
    #[error("the drawn SVG does not parse: {0}")]
    Svg(String),
    /// PDF conversion failed.
    #[error("PDF conversion failed: {0}")]
    Pdf(String),
    /// PNG rendering failed.
    #[error("PNG rendering failed: {0}")]
    Png(String),
    /// The PNG asked for is beyond a stated bound (pixels, or drawing work): bad input.
    #[error("{0}")]
    Bound(String),
}

/// Output file kinds, chosen from the file name's extension.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum FileKind {
    /// Scalable vector graphics, one file per page.
    Svg,
    /// Portable document format, all pages in one file.
    Pdf,
    /// Raster image, one file per page.
    Png,
}

impl FileKind {
    /// The kind a path's extension names, if any (case-insensitive).
    pub fn of_path(path: &Path) -> Option<FileKind> {
        let ext = path.extension()?.to_str()?.to_ascii_lowercase();
        match ext.as_str() {
            "svg" => Some(FileKind::Svg),
            "pdf" => Some(FileKind::Pdf),
            "png" => Some(FileKind::Png),
            _ => None,
        }
    }
}

/// Font database shared by every export: bundled font first, then system fonts.
pub fn fonts() -> Arc<fontdb::Database> {
    static DB: OnceLock<Arc<fontdb::Database>> = OnceLock::new();
    DB.get_or_init(|| {
        let mut db = fontdb::Database::new();
        db.load_font_data(BUNDLED_FONT.to_vec());
        db.load_system_fonts();
        db.set_sans_serif_family("DejaVu Sans");
        Arc::new(db)
    })
    .clone()
}

/// Parse a drawn sheet with `usvg`, fonts resolved against [`fonts`].
pub fn parse(svg: &str) -> Result<usvg::Tree, ExportError> {
    let opt = usvg::Options {
        font_family: "DejaVu Sans".into(),
        fontdb: fonts(),
        ..usvg::Options::default()
    };
    usvg::Tree::from_str(svg, &opt).map_err(|e| ExportError::Svg(e.to_string()))
}

/// The mark every sheet and PNG this tool writes carries (the SVG root's `data-made-by`,
/// a PNG's `Comment` text chunk), so that only its own pages are ever removed as stale.
pub const MARK: &str = "beltwright-sheet";

/// The attribute that names the set a page belongs to (`data-set="NAME"`, NAME the file name
/// of the set's first page with quotes and markup characters made `_`): a page is stale
/// for a set only when it names that set.
pub fn set_mark(set: &str) -> String {
    let safe: String = set
        .chars()
        .map(|c| {
            if matches!(c, '"' | '&' | '<' | '>') || c.is_control() {
                '_'
            } else {
                c
            }
        })
        .collect();
    format!("data-set=\"{safe}\"")
}

/// `svg` (a sheet this tool drew) with the set it is written as named on its root.
pub fn with_set(svg: &str, set: &str) -> String {
    let mark = format!("data-made-by=\"{MARK}\"");
    svg.replacen(&mark, &format!("{mark} {}", set_mark(set)), 1)
}

/// Most pixels a PNG is made with: 40 million (an A3 sheet at 400 dpi is 31 million), about
/// 160 MB of image in memory while it is drawn.
pub const MAX_PNG_PIXELS: u64 = 40_000_000;

/// Most drawn elements a set of PNG pages is rasterised from, all pages together: about
/// 40 000 take 8 s on the 2-core build machine (dashed coil ends are the slow part); a
/// denser set (a 5000-slot slot sheet has 290 000 over 20 pages) would take minutes, so it
/// is refused and SVG or PDF, which keep it as vectors, are offered instead.
pub const MAX_PNG_ELEMENTS: usize = 40_000;

/// Refuse a PNG set beyond [`MAX_PNG_ELEMENTS`] before any page is rendered.
pub fn check_png_work(pages: &[String]) -> Result<(), ExportError> {
    let elements: usize = pages.iter().map(|p| p.matches('<').count()).sum();
    if elements > MAX_PNG_ELEMENTS {
        return Err(ExportError::Bound(format!(
            "{} of about {elements} drawn elements in all are more than the \
             {MAX_PNG_ELEMENTS} PNG pages are rendered from in reasonable time; write .svg or \
             .pdf instead",
            if pages.len() == 1 {
                "one page".to_string()
            } else {
                format!("{} pages", pages.len())
            }
        )));
    }
    Ok(())
}

/// Render one sheet to PNG at `dpi` dots per inch (the sheet is drawn in millimetres).
pub fn to_png(svg: &str, dpi: f64) -> Result<Vec<u8>, ExportError> {
    check_png_work(std::slice::from_ref(&svg.to_string()))?;
    let tree = parse(svg)?;
    // usvg sizes a "mm" document at 96 user px per inch.
    let scale = (dpi / 96.0) as f32;
    let size = tree.size();
    let w = (size.width() * scale).ceil() as u32;
    let h = (size.height() * scale).ceil() as u32;
    let pixels = u64::from(w) * u64::from(h);
    if pixels > MAX_PNG_PIXELS {
        let most = dpi * (MAX_PNG_PIXELS as f64 / pixels as f64).sqrt();
        return Err(ExportError::Bound(format!(
            "{w} x {h} pixels at {dpi} dpi is more than the {MAX_PNG_PIXELS} a PNG is made \
             with; give --dpi {} or less, or write .svg or .pdf",
            most.floor()
        )));
    }
    let mut pixmap = tiny_skia::Pixmap::new(w, h)
        .ok_or_else(|| ExportError::Png(format!("cannot make a {w} × {h} image")))?;
    pixmap.fill(tiny_skia::Color::WHITE);
    resvg::render(
        &tree,
        tiny_skia::Transform::from_scale(scale, scale),
        &mut pixmap.as_mut(),
    );
    let png = pixmap
        .encode_png()
        .map_err(|e| ExportError::Png(e.to_string()))?;
    // The PNG carries the mark and, when the sheet names its set, the same set attribute.
    let set = svg
        .find("data-set=\"")
        .and_then(|i| svg[i..].find("\"").map(|_| i))
        .and_then(|i| {
            let rest = &svg[i + 10..];
            rest.find('"').map(|j| &svg[i..i + 10 + j + 1])
        })
        .unwrap_or("");
    Ok(with_mark(png, set))
}

/// `png` with a `Comment` text chunk carrying [`MARK`], right after its header chunk
/// (PNG specification, ISO/IEC 15948: tEXt chunk, CRC-32 over type and data).
fn with_mark(png: Vec<u8>, set: &str) -> Vec<u8> {
    // Signature (8 bytes) and IHDR (4 length + 4 type + 13 data + 4 CRC).
    const AFTER_IHDR: usize = 8 + 25;
    if png.len() < AFTER_IHDR {
        return png;
    }
    let mut data = b"Comment\0".to_vec();
    data.extend_from_slice(MARK.as_bytes());
    if !set.is_empty() {
        data.push(b' ');
        data.extend_from_slice(set.as_bytes());
    }
    let mut chunk = Vec::with_capacity(data.len() + 12);
    chunk.extend_from_slice(&(data.len() as u32).to_be_bytes());
    let typed: Vec<u8> = b"tEXt".iter().chain(&data).copied().collect();
    chunk.extend_from_slice(&typed);
    chunk.extend_from_slice(&crc32(&typed).to_be_bytes());
    let mut out = Vec::with_capacity(png.len() + chunk.len());
    out.extend_from_slice(&png[..AFTER_IHDR]);
    out.extend_from_slice(&chunk);
    out.extend_from_slice(&png[AFTER_IHDR..]);
    out
}

/// CRC-32 (ISO 3309, polynomial 0xEDB88320 reflected), as PNG chunks use.
fn crc32(bytes: &[u8]) -> u32 {
    let mut crc = 0xFFFF_FFFFu32;
    for &b in bytes {
        crc ^= u32::from(b);
        for _ in 0..8 {
            let mask = (crc & 1).wrapping_neg();
            crc = (crc >> 1) ^ (0xEDB8_8320 & mask);
        }
    }
    !crc
}

/// Convert sheets to one PDF, a page per sheet, text embedded as text.
pub fn to_pdf(pages: &[String]) -> Result<Vec<u8>, ExportError> {
    let mut alloc = Ref::new(1);
    let catalog = alloc.bump();
    let tree_ref = alloc.bump();
    let mut pdf = Pdf::new();
    let mut kids = Vec::new();
    let mut chunks = Vec::new();
    for svg in pages {
        let tree = parse(svg)?;
        let (chunk, root) = svg2pdf::to_chunk(&tree, svg2pdf::ConversionOptions::default())
            .map_err(|e| ExportError::Pdf(e.to_string()))?;
        let mut map = HashMap::new();
        let chunk = chunk.renumber(|old| *map.entry(old).or_insert_with(|| alloc.bump()));
        let xobject = *map
            .get(&root)
            .ok_or_else(|| ExportError::Pdf("the sheet's drawing went missing".into()))?;
        // usvg sizes are CSS px (96 per inch); PDF points are 72 per inch.
        let w = tree.size().width() * 0.75;
        let h = tree.size().height() * 0.75;
        let page_ref = alloc.bump();
        let content_ref = alloc.bump();
        let mut page = pdf.page(page_ref);
        page.media_box(PdfRect::new(0.0, 0.0, w, h));
        page.parent(tree_ref);
        page.contents(content_ref);
        page.resources().x_objects().pair(Name(b"S1"), xobject);
        page.finish();
        let mut content = Content::new();
        content
            .transform([w, 0.0, 0.0, h, 0.0, 0.0])
            .x_object(Name(b"S1"));
        pdf.stream(content_ref, &content.finish());
        kids.push(page_ref);
        chunks.push(chunk);
    }
    pdf.catalog(catalog).pages(tree_ref);
    pdf.pages(tree_ref)
        .kids(kids.iter().copied())
        .count(kids.len() as i32);
    for c in &chunks {
        pdf.extend(c);
    }
    let mut bytes = pdf.finish();
    sort_resource_entries(&mut bytes);
    Ok(bytes)
}

/// Put the entries of every resource dictionary in name order. The converter fills some of
/// them from hash maps, so the same sheets came out in a different byte order from run to
/// run; sorting whole lines in place keeps every length and so every cross-reference
/// offset, and makes the PDF byte-for-byte the same for the same input.
fn sort_resource_entries(pdf: &mut [u8]) {
    let mut i = 0;
    while let Some(pos) = find(&pdf[i..], b"<<\n").map(|p| p + i) {
        let start = pos + 3;
        // The entry lines: "  /name N 0 R\n" up to a line holding only ">>".
        let mut lines: Vec<(usize, usize)> = Vec::new();
        let mut at = start;
        let mut closed = false;
        while at < pdf.len() {
            let end = find(&pdf[at..], b"\n").map_or(pdf.len(), |e| at + e);
            let line = &pdf[at..end];
            let t = line.trim_ascii();
            if t == b">>" {
                closed = true;
                break;
            }
            if !is_reference_entry(t) {
                break;
            }
            lines.push((at, end));
            at = end + 1;
        }
        if closed && lines.len() > 1 {
            let mut sorted: Vec<Vec<u8>> = lines.iter().map(|&(a, b)| pdf[a..b].to_vec()).collect();
            sorted.sort_by(|a, b| a.trim_ascii().cmp(b.trim_ascii()));
            let (first, last) = (lines[0].0, lines[lines.len() - 1].1);
            let joined = sorted.join(&b'\n');
            if joined.len() == last - first {
                pdf[first..last].copy_from_slice(&joined);
            }
        }
        i = start;
    }
}

/// "/Name 12 0 R": one entry of a resource dictionary.
fn is_reference_entry(t: &[u8]) -> bool {
    let mut parts = t.split(|b| *b == b' ');
    matches!(
        (parts.next(), parts.next(), parts.next(), parts.next(), parts.next()),
        (Some(n), Some(num), Some(b"0"), Some(b"R"), None)
            if n.first() == Some(&b'/') && !num.is_empty() && num.iter().all(u8::is_ascii_digit)
    )
}

fn find(hay: &[u8], needle: &[u8]) -> Option<usize> {
    hay.windows(needle.len()).position(|w| w == needle)
}

/// File names for the pages of one output: the given name for the first page, `NAME-2.ext`,
/// `NAME-3.ext`... for the rest (SVG and PNG hold one page each).
pub fn page_paths(path: &Path, pages: usize) -> Vec<std::path::PathBuf> {
    page_names(path, 0..pages)
}

/// Pages numbered `range` (from 0) of the set named `path`: `NAME.ext`, `NAME-2.ext`, ...
pub fn page_names(path: &Path, range: std::ops::Range<usize>) -> Vec<std::path::PathBuf> {
    let stem = path
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_default();
    let ext = path
        .extension()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_default();
    range
        .map(|i| {
            if i == 0 {
                path.to_path_buf()
            } else {
                path.with_file_name(format!("{stem}-{}.{ext}", i + 1))
            }
        })
        .collect()
}

#[cfg(test)]
mod mark_tests {
    use super::*;

    // CRC-32 check value of the ASCII digits "123456789" is 0xCBF43926 (the standard check
    // value of this CRC, e.g. in the PNG specification's sample code and RFC 1952).
    #[test]
    fn crc32_check_value() {
        assert_eq!(crc32(b"123456789"), 0xCBF4_3926);
    }

    // The marked PNG still decodes (the png crate checks every chunk's CRC) and carries
    // the mark in its first bytes.
    #[test]
    fn marked_png_decodes() {
        let svg = "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"10mm\" height=\"10mm\" \
                   viewBox=\"0 0 10 10\"><rect width=\"10\" height=\"10\" fill=\"#000\"/></svg>";
        let png = to_png(svg, 96.0).expect("renders");
        assert!(png[..200].windows(MARK.len()).any(|w| w == MARK.as_bytes()));
        let decoder = png::Decoder::new(std::io::Cursor::new(&png));
        let mut reader = decoder.read_info().expect("header and chunks read");
        let mut buf = vec![0; reader.output_buffer_size().expect("size")];
        reader.next_frame(&mut buf).expect("image decodes");
    }
}
