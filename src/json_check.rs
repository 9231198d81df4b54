//! Checks on JSON text that serde's readers let through: a member named twice in one object (RFC 8259
//! §4 says names SHOULD be unique; readers disagree on which copy wins, so a site that says two things
//! is refused), and the path of a field in the user's terms (`volumes[2].top_m`).

use std::collections::HashSet;
use std::fmt;

use serde::de::{DeserializeSeed, Deserializer, IgnoredAny, MapAccess, SeqAccess, Visitor};

/// Where a value sits in a document: `volumes[2].top_m`.
#[derive(Debug, Clone, Default)]
struct Path(Vec<Step>);

#[derive(Debug, Clone)]
enum Step {
    Key(String),
    Index(usize),
}

impl fmt::Display for Path {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        if self.0.is_empty() {
            return f.write_str("the document");
        }
        for (i, s) in self.0.iter().enumerate() {
            match s {
                Step::Key(k) if i == 0 => write!(f, "{k}")?,
                Step::Key(k) => write!(f, ".{k}")?,
                Step::Index(n) => write!(f, "[{n}]")?,
            }
        }
        Ok(())
    }
}

/// `Err` naming the first member that appears twice in one object, and where (`volumes[2]`); also any
/// JSON syntax error, with its line and column.
///
/// # Errors
/// A message for the user.
pub fn unique_members(text: &str) -> Result<(), String> {
    let mut de = serde_json::Deserializer::from_str(text);
    // Deep nesting is refused by serde_json's own recursion limit (128) with an error, not a crash.
    Walk { path: Path::default() }.deserialize(&mut de).map_err(|e| e.to_string())?;
    de.end().map_err(|e| e.to_string())
}

struct Walk {
    path: Path,
}

impl<'de> DeserializeSeed<'de> for Walk {
    type Value = ();
    fn deserialize<D: Deserializer<'de>>(self, d: D) -> Result<(), D::Error> {
        d.deserialize_any(self)
    }
}

impl<'de> Visitor<'de> for Walk {
    type Value = ();

    fn expecting(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str("any JSON value")
    }

    fn visit_bool<E>(self, _: bool) -> Result<(), E> {
        Ok(())
    }
    fn visit_i64<E>(self, _: i64) -> Result<(), E> {
        Ok(())
    }
    fn visit_u64<E>(self, _: u64) -> Result<(), E> {
        Ok(())
    }
    fn visit_f64<E>(self, _: f64) -> Result<(), E> {
        Ok(())
    }
    fn visit_str<E>(self, _: &str) -> Result<(), E> {
        Ok(())
    }
    fn visit_unit<E>(self) -> Result<(), E> {
        Ok(())
    }

    fn visit_seq<A: SeqAccess<'de>>(self, mut seq: A) -> Result<(), A::Error> {
        let mut i = 0;
        loop {
            let mut path = self.path.clone();
            path.0.push(Step::Index(i));
            if seq.next_element_seed(Walk { path })?.is_none() {
                return Ok(());
            }
            i += 1;
        }
    }

    fn visit_map<A: MapAccess<'de>>(self, mut map: A) -> Result<(), A::Error> {
        let mut seen = HashSet::new();
        while let Some(key) = map.next_key::<String>()? {
            if !seen.insert(key.clone()) {
                let _ = map.next_value::<IgnoredAny>();
                return Err(serde::de::Error::custom(format!(
                    "{}: the member {key:?} appears twice; give it once",
                    self.path
                )));
            }
            let mut path = self.path.clone();
            path.0.push(Step::Key(key));
            map.next_value_seed(Walk { path })?;
        }
        Ok(())
    }
}

/// `T` read from a JSON value, a serde error with the field's path first (as [`read_with_path`],
/// without line and column).
///
/// # Errors
/// The message.
pub fn read_value_with_path<T: serde::de::DeserializeOwned>(value: serde_json::Value) -> Result<T, String> {
    serde_path_to_error::deserialize(value).map_err(|e| {
        let path = e.path().to_string();
        if path.is_empty() || path == "." {
            e.inner().to_string()
        } else {
            format!("{path}: {}", e.inner())
        }
    })
}

/// A serde error from reading `T` out of JSON text, with the field's path in the user's terms first:
/// `volumes[2].top_m: invalid type: string "tall", expected f64 at line 9 column 40`.
///
/// # Errors
/// The message.
pub fn read_with_path<T: serde::de::DeserializeOwned>(text: &str) -> Result<T, String> {
    let mut de = serde_json::Deserializer::from_str(text);
    let value = serde_path_to_error::deserialize(&mut de).map_err(|e| {
        let path = e.path().to_string();
        if path.is_empty() || path == "." {
            e.inner().to_string()
        } else {
            format!("{path}: {}", e.inner())
        }
    })?;
    de.end().map_err(|e| e.to_string())?;
    Ok(value)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_member_named_twice_is_found_with_its_place() {
        assert!(unique_members(r#"{"a": 1, "b": [{"c": 1}, {"c": 2}]}"#).is_ok());
        let e = unique_members(r#"{"a": 1, "b": [{"c": 1}, {"c": 2, "d": 0, "c": 3}]}"#).unwrap_err();
        assert!(e.starts_with("b[1]: the member \"c\" appears twice"), "{e}");
        let e = unique_members(r#"{"top_m": 1, "top_m": 2}"#).unwrap_err();
        assert!(e.starts_with("the document: the member \"top_m\" appears twice"), "{e}");
        assert!(unique_members("{").unwrap_err().contains("line 1"));
        assert!(unique_members("{} x").is_err());
        // Nesting deeper than serde_json's limit is an error, not a stack overflow.
        assert!(unique_members(&"[".repeat(100_000)).is_err());
    }

    #[test]
    fn field_paths_are_in_the_users_terms() {
        #[derive(serde::Deserialize, Debug)]
        #[allow(dead_code)]
        struct V {
            top_m: f64,
        }
        #[derive(serde::Deserialize, Debug)]
        #[allow(dead_code)]
        struct S {
            volumes: Vec<V>,
        }
        let e = read_with_path::<S>(r#"{"volumes": [{"top_m": 1}, {"top_m": "tall"}]}"#).unwrap_err();
        assert!(e.starts_with("volumes[1].top_m: invalid type: string \"tall\", expected f64"), "{e}");
    }
}
