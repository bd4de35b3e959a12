//! The kernel's logo, drawn by code: a foil strain-gauge grid (a serpentine of five strands with
//! two solder tabs) on a rounded teal tile. One list of rectangles makes both the SVG and the
//! 32 and 64 px PNGs the kernelspec carries, so they always agree.

/// Tile colour (RGB).
const TILE: [u8; 3] = [0x0f, 0x4c, 0x5c];
/// Grid colour.
const GRID: [u8; 3] = [0xf4, 0xf1, 0xe8];
/// Solder tab colour.
const TAB: [u8; 3] = [0xf2, 0x9e, 0x4c];
/// Corner radius of the tile, in the 64-unit design grid.
const CORNER: f64 = 12.0;

/// The design's rectangles `(x0, y0, x1, y1, colour)` on a 64 × 64 grid, painted in order.
fn shapes() -> Vec<(f64, f64, f64, f64, [u8; 3])> {
    let mut s = Vec::new();
    let xs = [17.0, 24.0, 31.0, 38.0, 45.0];
    for x in xs {
        s.push((x, 12.0, x + 3.0, 40.0, GRID));
    }
    // End loops alternate top and bottom, making one continuous strand.
    for (i, pair) in xs.windows(2).enumerate() {
        let y = if i % 2 == 0 { 12.0 } else { 37.0 };
        s.push((pair[0], y, pair[1] + 3.0, y + 3.0, GRID));
    }
    // Leads from the outer strands down to the tabs.
    s.push((17.0, 40.0, 20.0, 46.0, GRID));
    s.push((45.0, 40.0, 48.0, 46.0, GRID));
    s.push((11.0, 46.0, 26.0, 54.0, TAB));
    s.push((39.0, 46.0, 54.0, 54.0, TAB));
    s
}

fn inside_tile(x: f64, y: f64) -> bool {
    let (lo, hi) = (2.0, 62.0);
    if !(lo..hi).contains(&x) || !(lo..hi).contains(&y) {
        return false;
    }
    let cx = x.clamp(lo + CORNER, hi - CORNER);
    let cy = y.clamp(lo + CORNER, hi - CORNER);
    (x - cx).powi(2) + (y - cy).powi(2) <= CORNER * CORNER
}

/// The logo as SVG text.
pub(crate) fn svg() -> String {
    let hex = |c: [u8; 3]| format!("#{:02x}{:02x}{:02x}", c[0], c[1], c[2]);
    let mut out = String::from(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"64\" height=\"64\" viewBox=\"0 0 64 64\">\n",
    );
    out.push_str(&format!(
        "  <rect x=\"2\" y=\"2\" width=\"60\" height=\"60\" rx=\"{CORNER}\" fill=\"{}\"/>\n",
        hex(TILE)
    ));
    for (x0, y0, x1, y1, c) in shapes() {
        out.push_str(&format!(
            "  <rect x=\"{x0}\" y=\"{y0}\" width=\"{}\" height=\"{}\" fill=\"{}\"/>\n",
            x1 - x0,
            y1 - y0,
            hex(c)
        ));
    }
    out.push_str("</svg>\n");
    out
}

/// The logo as RGBA pixels of `size` × `size`, 4 × 4 supersampled.
fn raster(size: u32) -> Vec<u8> {
    const SUB: u32 = 4;
    let shapes = shapes();
    let scale = 64.0 / f64::from(size);
    let mut px = Vec::with_capacity((size * size * 4) as usize);
    for row in 0..size {
        for col in 0..size {
            let mut acc = [0.0f64; 4];
            for sy in 0..SUB {
                for sx in 0..SUB {
                    let x = (f64::from(col) + (f64::from(sx) + 0.5) / f64::from(SUB)) * scale;
                    let y = (f64::from(row) + (f64::from(sy) + 0.5) / f64::from(SUB)) * scale;
                    if !inside_tile(x, y) {
                        continue;
                    }
                    let mut c = TILE;
                    for (x0, y0, x1, y1, colour) in &shapes {
                        if x >= *x0 && x < *x1 && y >= *y0 && y < *y1 {
                            c = *colour;
                        }
                    }
                    for k in 0..3 {
                        acc[k] += f64::from(c[k]);
                    }
                    acc[3] += 255.0;
                }
            }
            let n = f64::from(SUB * SUB);
            let alpha = acc[3] / n;
            for k in 0..3 {
                // Colour is averaged over covered samples only (straight, not premultiplied, alpha).
                let covered = acc[3] / 255.0;
                px.push(if covered > 0.0 {
                    (acc[k] / covered).round() as u8
                } else {
                    0
                });
            }
            px.push(alpha.round() as u8);
        }
    }
    px
}

/// The logo as a PNG file of `size` × `size` pixels.
pub(crate) fn png(size: u32) -> Vec<u8> {
    encode_png(size, size, &raster(size))
}

/// Encodes RGBA pixels as PNG (ISO/IEC 15948 / W3C PNG specification: signature, IHDR, one
/// IDAT of zlib "stored" blocks per RFC 1950/1951, IEND; filter type 0 on every row).
fn encode_png(width: u32, height: u32, rgba: &[u8]) -> Vec<u8> {
    let mut raw = Vec::with_capacity(rgba.len() + height as usize);
    for row in rgba.chunks((width * 4) as usize) {
        raw.push(0);
        raw.extend_from_slice(row);
    }
    // zlib header 0x78 0x01: deflate, 32 KiB window, check bits (RFC 1950 §2.2).
    let mut z = vec![0x78, 0x01];
    let blocks: Vec<&[u8]> = raw.chunks(65_535).collect();
    for (i, block) in blocks.iter().enumerate() {
        z.push(u8::from(i + 1 == blocks.len()));
        let len = block.len() as u16;
        z.extend_from_slice(&len.to_le_bytes());
        z.extend_from_slice(&(!len).to_le_bytes());
        z.extend_from_slice(block);
    }
    z.extend_from_slice(&adler32(&raw).to_be_bytes());

    let mut out = vec![0x89, b'P', b'N', b'G', 0x0d, 0x0a, 0x1a, 0x0a];
    let mut ihdr = Vec::new();
    ihdr.extend_from_slice(&width.to_be_bytes());
    ihdr.extend_from_slice(&height.to_be_bytes());
    // Bit depth 8, colour type 6 (RGBA), deflate, adaptive filtering, no interlace.
    ihdr.extend_from_slice(&[8, 6, 0, 0, 0]);
    chunk(&mut out, b"IHDR", &ihdr);
    chunk(&mut out, b"IDAT", &z);
    chunk(&mut out, b"IEND", &[]);
    out
}

fn chunk(out: &mut Vec<u8>, kind: &[u8; 4], data: &[u8]) {
    out.extend_from_slice(&(data.len() as u32).to_be_bytes());
    let start = out.len();
    out.extend_from_slice(kind);
    out.extend_from_slice(data);
    let crc = crc32(&out[start..]);
    out.extend_from_slice(&crc.to_be_bytes());
}

/// CRC-32 (ISO 3309, reflected polynomial 0xEDB88320), as the PNG specification's annex gives.
fn crc32(data: &[u8]) -> u32 {
    let mut crc = 0xffff_ffffu32;
    for &b in data {
        crc ^= u32::from(b);
        for _ in 0..8 {
            crc = if crc & 1 != 0 {
                (crc >> 1) ^ 0xedb8_8320
            } else {
                crc >> 1
            };
        }
    }
    !crc
}

/// Adler-32 (RFC 1950 §8.2): modulus 65521, the largest prime below 2^16.
fn adler32(data: &[u8]) -> u32 {
    let (mut a, mut b) = (1u32, 0u32);
    for &x in data {
        a = (a + u32::from(x)) % 65_521;
        b = (b + a) % 65_521;
    }
    (b << 16) | a
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn checksums_match_published_check_values() {
        // CRC-32 check value of "123456789" is 0xCBF43926 (Rocksoft/Williams "A Painless Guide
        // to CRC Error Detection Algorithms", CRC-32 parameter table, from memory).
        assert_eq!(crc32(b"123456789"), 0xcbf4_3926);
        // Adler-32 of "Wikipedia" is 0x11E60398 (the worked example often quoted for RFC 1950,
        // from memory); closed form: a = 1 + sum of bytes = 920, b = sum of running a = 4582.
        assert_eq!(adler32(b"Wikipedia"), 0x11e6_0398);
    }

    #[test]
    fn png_is_well_formed() {
        let p = png(32);
        assert_eq!(&p[..8], b"\x89PNG\r\n\x1a\n");
        assert_eq!(&p[12..16], b"IHDR");
        assert_eq!(u32::from_be_bytes([p[16], p[17], p[18], p[19]]), 32);
        assert!(p.ends_with(&[0xae, 0x42, 0x60, 0x82])); // CRC of an empty IEND chunk
    }

    #[test]
    fn svg_and_raster_agree_on_the_design() {
        let s = svg();
        assert_eq!(s.matches("<rect").count(), shapes().len() + 1);
        let px = raster(64);
        let at = |x: usize, y: usize| &px[(y * 64 + x) * 4..(y * 64 + x) * 4 + 4];
        assert_eq!(at(0, 0)[3], 0); // outside the rounded corner
        assert_eq!(at(18, 20), [GRID[0], GRID[1], GRID[2], 255]);
        assert_eq!(at(15, 50), [TAB[0], TAB[1], TAB[2], 255]);
        assert_eq!(at(8, 30), [TILE[0], TILE[1], TILE[2], 255]);
    }
}
