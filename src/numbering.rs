//! Slot and coil numbers as a person reads them. Inside the program slots and coils count
//! from 0; at every edge a person sees they count from 1, as a shop does.

/// The number a person sees for a 0-based index.
pub fn shown(index: usize) -> usize {
    index + 1
}

/// "1-3, 7, 9-10" from sorted numbers (already as shown).
pub fn ranges(ns: &[usize]) -> String {
    let mut parts: Vec<String> = Vec::new();
    let mut i = 0;
    while i < ns.len() {
        let mut j = i;
        while j + 1 < ns.len() && ns[j + 1] == ns[j] + 1 {
            j += 1;
        }
        parts.push(if j > i {
            format!("{}-{}", ns[i], ns[j])
        } else {
            ns[i].to_string()
        });
        i = j + 1;
    }
    parts.join(", ")
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ranges_compress_runs() {
        assert_eq!(ranges(&[1, 2, 3, 7, 9, 10]), "1-3, 7, 9-10");
        assert_eq!(ranges(&[]), "");
        assert_eq!(shown(0), 1);
    }
}
