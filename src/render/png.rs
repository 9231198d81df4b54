//! PNG encoding of an RGBA image (the `png` crate), for images embedded in SVG documents.

/// PNG bytes of an RGBA image, `w` × `h` pixels, row-major from the top; empty if the encoder refuses
/// the sizes (only when `rgba` is not `w` × `h` × 4 bytes).
pub fn encode_png(rgba: &[u8], w: u32, h: u32) -> Vec<u8> {
    let mut out = Vec::new();
    {
        let mut enc = png::Encoder::new(&mut out, w, h);
        enc.set_color(png::ColorType::Rgba);
        enc.set_depth(png::BitDepth::Eight);
        if let Ok(mut writer) = enc.write_header() {
            let _ = writer.write_image_data(rgba);
        }
    }
    out
}
