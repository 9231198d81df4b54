//! A map's values, one per cell, in 8 bytes a cell.

/// Values of a map's cells, row-major as its grid, with `None` where a cell has no value (outside
/// the mapped areas, or a ratio with nothing to divide by).
///
/// Stored as one `f64` a cell with NaN for "no value": 8 bytes a cell where a `Vec<Option<f64>>`
/// takes 16 (a 2000 × 2000 map's values are 32 MB instead of 64). A NaN given as a value reads back
/// as `None`. Two maps are equal when every cell is: both without a value, or both the same value.
#[derive(Debug, Clone, Default)]
pub struct CellValues(Vec<f64>);

impl CellValues {
    /// Values from one `f64` a cell, NaN (or any non-number) where a cell has none.
    pub fn from_nan_coded(values: Vec<f64>) -> Self {
        CellValues(values)
    }

    /// The cells' values as one `f64` a cell, NaN where a cell has none (as tile files, `Float64Array`s
    /// and pictures take them).
    pub fn as_nan_coded(&self) -> &[f64] {
        &self.0
    }

    /// Cells.
    pub fn len(&self) -> usize {
        self.0.len()
    }

    /// Whether there are no cells.
    pub fn is_empty(&self) -> bool {
        self.0.is_empty()
    }

    /// Cell `k`'s value; `None` where it has none or `k` is past the end.
    pub fn get(&self, k: usize) -> Option<f64> {
        self.0.get(k).copied().filter(|v| !v.is_nan())
    }

    /// Every cell's value in order.
    pub fn iter(&self) -> impl ExactSizeIterator<Item = Option<f64>> + Clone + '_ {
        self.0.iter().map(|&v| (!v.is_nan()).then_some(v))
    }

    /// The values of the cells that have one, in order.
    pub fn values(&self) -> impl Iterator<Item = f64> + Clone + '_ {
        self.0.iter().copied().filter(|v| !v.is_nan())
    }
}

impl PartialEq for CellValues {
    fn eq(&self, other: &Self) -> bool {
        self.iter().eq(other.iter())
    }
}

impl FromIterator<Option<f64>> for CellValues {
    fn from_iter<I: IntoIterator<Item = Option<f64>>>(iter: I) -> Self {
        CellValues(iter.into_iter().map(|v| v.unwrap_or(f64::NAN)).collect())
    }
}

impl From<Vec<Option<f64>>> for CellValues {
    fn from(values: Vec<Option<f64>>) -> Self {
        values.into_iter().collect()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn no_value_reads_back_as_none_and_values_as_given() {
        let v: CellValues = vec![Some(1.5), None, Some(0.0), Some(-2.0)].into();
        assert_eq!(v.len(), 4);
        assert_eq!(v.iter().collect::<Vec<_>>(), vec![Some(1.5), None, Some(0.0), Some(-2.0)]);
        assert_eq!(v.get(1), None);
        assert_eq!(v.get(3), Some(-2.0));
        assert_eq!(v.get(4), None);
        assert_eq!(v.values().collect::<Vec<_>>(), vec![1.5, 0.0, -2.0]);
        assert!(v.as_nan_coded()[1].is_nan());
        // A NaN given as a value is "no value".
        assert_eq!(CellValues::from(vec![Some(f64::NAN)]).get(0), None);
    }

    #[test]
    fn maps_are_equal_cell_by_cell_with_missing_cells_equal() {
        let a: CellValues = vec![Some(1.0), None].into();
        assert_eq!(a, vec![Some(1.0), None].into());
        assert_ne!(a, vec![Some(1.0), Some(0.0)].into());
        assert_ne!(a, vec![Some(1.0)].into());
    }
}
