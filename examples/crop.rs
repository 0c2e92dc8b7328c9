// Local helper (not committed): render a region of an SVG sheet to PNG.
fn main() {
    let a: Vec<String> = std::env::args().collect();
    let svg = std::fs::read_to_string(&a[1]).unwrap();
    let vb = format!("viewBox=\"{}\"", a[3]);
    let re = svg.replacen("viewBox=\"0 0 297 210\"", &vb, 1);
    let parts: Vec<f64> = a[3].split(' ').map(|x| x.parse().unwrap()).collect();
    let re = re
        .replacen("width=\"297mm\"", &format!("width=\"{}mm\"", parts[2]), 1)
        .replacen("height=\"210mm\"", &format!("height=\"{}mm\"", parts[3]), 1);
    let png = beltwright::draw::export::to_png(&re, a[4].parse().unwrap()).unwrap();
    std::fs::write(&a[2], png).unwrap();
}
