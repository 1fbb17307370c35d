//! The JSON formats did not change when the tagged enums got hand-written `Deserialize`
//! (src/json.rs): reference copies of the enums below keep serde's derive with the
//! original attributes, and every input here (each variant, then each mutated by
//! dropping a field, nulling or retyping it, adding an unknown one, renaming the tag)
//! must be accepted or refused alike and, when accepted, give the same value.
//! Check values: serde's own derive (the previous implementation).

use nightfield::find::finder::{FinderKind, FinderSpec, PrismKind};
use nightfield::json;
use nightfield::optics::presets;
use nightfield::optics::train::*;
use nightfield::plan::sky_brightness::{SkyBrightness, SkyClass};
use nightfield::scenario::{Scenario, TargetSpec};
use serde::{Deserialize, Serialize};
use serde_json::{json, Value};

// --- Reference copies: serde's derive, the attributes the engine's types had. ---

#[derive(Serialize, Deserialize)]
struct RefTrain {
    #[serde(default)]
    name: String,
    instrument: RefInstrument,
    #[serde(default)]
    accessories: Vec<RefAccessory>,
    #[serde(default)]
    mount: RefMount,
}

#[derive(Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
enum RefInstrument {
    NakedEye(NakedEye),
    Telescope(RefTelescope),
    Binoculars(Binoculars),
    Finder(Finder),
}

#[derive(Serialize, Deserialize)]
struct RefTelescope {
    design: RefDesign,
    aperture_mm: f64,
    focal_length_mm: f64,
    #[serde(default)]
    obstruction_mm: f64,
    #[serde(default = "refl")]
    mirror_reflectivity: f64,
    #[serde(default = "glass")]
    glass_transmission: f64,
}
fn refl() -> f64 {
    0.90
}
fn glass() -> f64 {
    0.95
}

#[derive(Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
enum RefDesign {
    Refractor,
    Newtonian {
        #[serde(default)]
        focuser_angle_deg: f64,
    },
    ClassicalCassegrain,
    SchmidtCassegrain,
    MaksutovCassegrain,
    PrimeFocus,
    Nasmyth {
        #[serde(default)]
        port: Port,
    },
    Coude,
}

#[derive(Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
enum RefAccessory {
    StarDiagonal(StarDiagonal),
    Barlow(FocalModifier),
    Reducer(FocalModifier),
    Filter(Filter),
    Eyepiece(Eyepiece),
    Camera(Camera),
    Phone(Phone),
}

#[derive(Default, Serialize, Deserialize)]
#[serde(tag = "kind", rename_all = "snake_case")]
enum RefMount {
    #[default]
    AltAz,
    Equatorial {
        #[serde(default)]
        pier_side: PierSide,
    },
}

#[derive(Serialize, Deserialize)]
#[serde(rename_all = "kebab-case", tag = "by")]
enum RefSky {
    Measured { zenith_mu: f64 },
    Class { class: SkyClass },
}

#[derive(Serialize, Deserialize)]
struct RefFinderSpec {
    kind: RefFinderKind,
    aperture_mm: f64,
    magnification: f64,
    true_field_deg: f64,
}

#[derive(Serialize, Deserialize)]
#[serde(tag = "type", rename_all = "snake_case")]
enum RefFinderKind {
    StraightThrough,
    RightAngle { prism: PrismKind },
    ReflexSight { ring_radii_deg: Vec<f64> },
    Binoculars,
}

#[derive(Serialize, Deserialize)]
#[serde(untagged)]
enum RefTarget {
    Name(String),
    Coordinates { ra_deg: f64, dec_deg: f64 },
}

// --- Inputs ---

fn scope(design: Design) -> Train {
    Train {
        name: "t".into(),
        instrument: Instrument::Telescope(Telescope {
            design,
            aperture_mm: 100.0,
            focal_length_mm: 900.0,
            obstruction_mm: 20.0,
            mirror_reflectivity: 0.9,
            glass_transmission: 0.95,
        }),
        accessories: vec![],
        mount: Mount::AltAz,
    }
}

fn trains() -> Vec<Train> {
    let mut v: Vec<Train> = presets::presets().into_iter().map(|p| p.train).collect();
    for d in [
        Design::Refractor,
        Design::Newtonian { focuser_angle_deg: 30.0 },
        Design::ClassicalCassegrain,
        Design::SchmidtCassegrain,
        Design::MaksutovCassegrain,
        Design::PrimeFocus,
        Design::Nasmyth { port: Port::Right },
        Design::Coude,
    ] {
        v.push(scope(d));
    }
    let mut all = scope(Design::Refractor);
    all.accessories = presets::accessories().into_iter().map(|(_, a)| a).collect();
    all.accessories.extend(presets::eyepieces().into_iter().map(|(_, e)| Accessory::Eyepiece(e)));
    all.accessories.push(Accessory::Phone(Phone { lens_focal_length_mm: 4.2, pixel_pitch_um: Some(1.2), rotation_deg: 10.0 }));
    all.accessories.push(Accessory::Camera(Camera {
        sensor_width_mm: 23.5,
        sensor_height_mm: 15.6,
        pixel_pitch_um: 3.9,
        pixels_x: 6000,
        pixels_y: 4000,
        rotation_deg: 5.0,
        row_order: RowOrder::BottomUp,
    }));
    all.mount = Mount::Equatorial { pier_side: PierSide::East };
    v.push(all);
    v
}

/// A copy of `root` with `f` applied at `path` (object keys and array indices).
fn edited(root: &Value, path: &[Value], f: &dyn Fn(&mut Value)) -> Value {
    let mut r = root.clone();
    let mut cur = &mut r;
    for p in path {
        cur = match p {
            Value::String(k) => cur.get_mut(k.as_str()).unwrap(),
            Value::Number(i) => cur.get_mut(i.as_u64().unwrap() as usize).unwrap(),
            _ => unreachable!(),
        };
    }
    f(cur);
    r
}

/// `v` and variants of it: at every object, each key dropped, nulled, retyped; an unknown
/// key added; the object replaced by other types (a tag renamed is among the retypings).
fn mutations(v: &Value) -> Vec<Value> {
    fn walk(root: &Value, path: &mut Vec<Value>, here: &Value, out: &mut Vec<Value>) {
        match here {
            Value::Object(m) => {
                out.push(edited(root, path, &|c| {
                    c.as_object_mut().unwrap().insert("zzz_unknown".into(), json!(1));
                }));
                out.push(edited(root, path, &|c| *c = json!([])));
                out.push(edited(root, path, &|c| *c = json!("a string")));
                for k in m.keys() {
                    out.push(edited(root, path, &|c| {
                        c.as_object_mut().unwrap().remove(k);
                    }));
                    for repl in [
                        json!(null),
                        json!(7),
                        json!(2.5),
                        json!("x"),
                        json!("telescope"),
                        json!("class"),
                        json!({}),
                        json!([1.0, 2.0]),
                        json!({"mirror90": null}),
                        json!({"erect": null, "x": 1}),
                        json!({"left": 1}),
                        json!(-3),
                    ] {
                        out.push(edited(root, path, &|c| {
                            c.as_object_mut().unwrap().insert(k.clone(), repl.clone());
                        }));
                    }
                    path.push(Value::String(k.clone()));
                    walk(root, path, &m[k], out);
                    path.pop();
                }
            }
            Value::Array(a) => {
                for (i, x) in a.iter().enumerate() {
                    path.push(json!(i));
                    walk(root, path, x, out);
                    path.pop();
                }
            }
            _ => {}
        }
    }
    let mut out = vec![v.clone()];
    walk(v, &mut Vec::new(), v, &mut out);
    out
}

/// Old (serde derive, from text) and new (`json::from_str`) readings agree.
fn same<New: serde::de::DeserializeOwned + Serialize, Old: serde::de::DeserializeOwned + Serialize>(input: &Value) -> bool {
    let text = input.to_string();
    let old = serde_json::from_str::<Old>(&text).map(|o| serde_json::to_value(o).unwrap());
    let new = json::from_str::<New>(&text).map(|n| serde_json::to_value(n).unwrap());
    let agree = match (&old, &new) {
        (Ok(a), Ok(b)) => a == b,
        (Err(_), Err(_)) => true,
        _ => false,
    };
    assert!(agree, "input {text}\n  serde derive: {old:?}\n  engine:       {new:?}");
    old.is_ok()
}

#[test]
fn trains_read_as_serde_derive_read_them() {
    let (mut ok, mut n) = (0, 0);
    for t in trains() {
        let v = serde_json::to_value(&t).unwrap();
        // Unchanged output format: the reference serializes the same.
        assert_eq!(serde_json::to_value(serde_json::from_value::<RefTrain>(v.clone()).unwrap()).unwrap(), v);
        assert_eq!(json::from_value::<Train>(v.clone()).unwrap(), t);
        for m in mutations(&v) {
            n += 1;
            ok += same::<Train, RefTrain>(&m) as usize;
        }
    }
    assert!(n > 3000 && ok > 500 && ok < n, "{ok} of {n} accepted");
}

#[test]
fn sky_finder_and_target_read_as_serde_derive_read_them() {
    for v in [json!({"by": "measured", "zenith_mu": 21.3}), json!({"by": "class", "class": "village-edge"})] {
        assert_eq!(serde_json::to_value(json::from_value::<SkyBrightness>(v.clone()).unwrap()).unwrap(), v);
        for m in mutations(&v) {
            same::<SkyBrightness, RefSky>(&m);
        }
    }
    for kind in [
        json!({"type": "straight_through"}),
        json!({"type": "right_angle", "prism": "erect"}),
        json!({"type": "reflex_sight", "ring_radii_deg": [0.25, 1.0, 2.0]}),
        json!({"type": "binoculars"}),
    ] {
        let v = json!({"kind": kind, "aperture_mm": 50, "magnification": 8, "true_field_deg": 5});
        let f: FinderSpec = json::from_value(v.clone()).unwrap();
        assert!(matches!(f.kind, FinderKind::StraightThrough | FinderKind::RightAngle { .. } | FinderKind::ReflexSight { .. } | FinderKind::Binoculars));
        for m in mutations(&v) {
            same::<FinderSpec, RefFinderSpec>(&m);
        }
    }
    for v in [json!("M 42"), json!({"ra_deg": 83.8, "dec_deg": -5.4}), json!([83.8, -5.4]), json!(5), json!(null), json!({"ra_deg": 1})] {
        for m in mutations(&v) {
            same::<TargetSpec, RefTarget>(&m);
        }
    }
}

#[test]
fn tag_errors_say_what_serde_said() {
    let e = json::from_str::<Train>(r#"{"instrument": {"aperture_mm": 50}}"#).unwrap_err().to_string();
    assert!(e.contains("missing field `kind`"), "{e}");
    let e = json::from_str::<Train>(r#"{"instrument": {"kind": "periscope"}}"#).unwrap_err().to_string();
    assert!(e.contains("unknown variant `periscope`, expected one of `naked_eye`, `telescope`, `binoculars`, `finder`"), "{e}");
    let e = json::from_str::<TargetSpec>("true").unwrap_err().to_string();
    assert!(e.contains("did not match any variant of untagged enum TargetSpec"), "{e}");
}

#[test]
fn scenarios_and_links_read_back() {
    for (name, text) in nightfield::scenario::comparison_scenarios() {
        let s = Scenario::from_json(&text).unwrap();
        let again = Scenario::from_json(&serde_json::to_string(&s).unwrap()).unwrap();
        assert_eq!(s, again, "{name}");
        // As the browser writes the link JSON (JSON.stringify: 80 not 80.0).
        let js_like = serde_json::to_string(&s).unwrap().replace(".0,", ",").replace(".0}", "}").replace(".0]", "]");
        assert_eq!(Scenario::from_json(&js_like).unwrap(), s, "{name}");
        let link = nightfield::share::encode_json_bytes(js_like.as_bytes());
        assert_eq!(nightfield::share::decode::<Scenario>(&link).unwrap(), s, "{name}");
    }
}

// --- The JSON text reader (json::parse) against serde_json::from_str::<Value>. ---

/// Equal values, numbers of the same kind (u64 / i64 / f64) and the same bits (-0.0 ≠ 0.0).
fn identical(a: &Value, b: &Value) -> bool {
    match (a, b) {
        (Value::Number(x), Value::Number(y)) => {
            (x.is_u64(), x.is_i64(), x.is_f64()) == (y.is_u64(), y.is_i64(), y.is_f64())
                && x.as_u64() == y.as_u64()
                && x.as_i64() == y.as_i64()
                && x.as_f64().map(f64::to_bits) == y.as_f64().map(f64::to_bits)
        }
        (Value::Array(x), Value::Array(y)) => x.len() == y.len() && x.iter().zip(y).all(|(p, q)| identical(p, q)),
        (Value::Object(x), Value::Object(y)) => x.len() == y.len() && x.iter().zip(y).all(|((k, p), (l, q))| k == l && identical(p, q)),
        _ => a == b,
    }
}

fn reads_alike(text: &str) -> bool {
    let ours = json::parse(text);
    let theirs = serde_json::from_str::<Value>(text);
    match (&ours, &theirs) {
        (Ok(a), Ok(b)) => assert!(identical(a, b), "{text:?}: ours {a:?}, serde_json {b:?}"),
        (Err(_), Err(_)) => {}
        _ => panic!("{text:?}: ours {ours:?}, serde_json {theirs:?}"),
    }
    theirs.is_ok()
}

#[test]
fn json_reader_reads_as_serde_json() {
    let numbers = [
        "0", "-0", "1", "-1", "01", "-01", "00", "1.", "1.5", "-0.0", "0.0", "1e5", "1E+5", "1e-5", "1.5e-300", "-1.5e-300", "1e400", "-1e400", "1e-400",
        "18446744073709551615", "18446744073709551616", "-9223372036854775808", "-9223372036854775809", "9223372036854775807", "9223372036854775808",
        "-18446744073709551615", "-18446744073709551616", "0.1", "0.30000000000000004", "123456789012345678901234567890", "2.2250738585072011e-308",
        "2.2250738585072014e-308", "4.9e-324", "5e-324", "2.4703282292062327e-324", "2.4703282292062328e-324", "1.7976931348623157e308",
        "1.7976931348623158e308", "1.7976931348623159e308", "0e999999999999", "1e-99999999999999999999", "1e99999999999999999999", "-0e5", "0.000000000000000000000000000000001e33",
        "9007199254740993", "9007199254740993.0", "179769313486231580793728971405303415079934132710037826936173778980444968292764750946649017977587207096330286416692887910946555547851940402630657488671505820681908902000708383676273854845817711531764475730270069855571366959622842914819860834936475292719074168444365510704342711559699508093042880177904174497791.0",
        ".5", "+1", "1e", "1e+", "1e-", "-", "--1", "0x10", "Infinity", "-Infinity", "NaN", "1.e5", "1.5.5", "1ee5", "1e5.5", "- 1",
    ];
    for n in numbers {
        reads_alike(n);
        reads_alike(&format!("[{n}]"));
        reads_alike(&format!("{{\"k\": {n}}}"));
    }
    let strings = [
        r#""""#,
        r#""abc""#,
        r#""a\"b\\c\/d\be\ff\ng\rh\ti""#,
        r#""\u0041\u00e9\u20AC""#,
        r#""\ud83d\ude00""#,
        r#""\uD83D\uDE00x""#,
        r#""\uD800""#,
        r#""\uDC00""#,
        r#""\uD800\u0041""#,
        r#""\uD800x""#,
        r#""\uD800\n""#,
        r#""\uD800\uD800\uDC00""#,
        r#""\u00""#,
        r#""\u00g0""#,
        r#""\x""#,
        r#""\"#,
        r#""abc"#,
        "\"a\tb\"",
        "\"a\u{1}b\"",
        "\"a\u{7f}b\"",
        "\"héllo wörld – ✓\"",
        r#""\u0000""#,
        r#""\U0041""#,
    ];
    for s in strings {
        reads_alike(s);
        reads_alike(&format!("{{{s}: 1}}"));
    }
    let structures = [
        "",
        " ",
        "\t\n\r ",
        "null",
        "true",
        "false",
        "nul",
        "tru",
        "nulll",
        "True",
        "[]",
        "{}",
        "[ ]",
        "{ }",
        "[1,]",
        "[,1]",
        "[1 2]",
        "[1,,2]",
        "{\"a\":1,}",
        "{\"a\" 1}",
        "{1:2}",
        "{\"a\":}",
        "{\"a\":1 \"b\":2}",
        "{\"a\":1,\"a\":2}",
        "{\"b\":1,\"a\":[true,false,null]}",
        "1 2",
        "[] x",
        "{} {}",
        "[1]]",
        "[[1]",
        "{\"a\":{\"b\":{}}}",
        " [ 1 , { \"x\" : \"y\" } ] ",
        "\u{feff}[]",
        "[1]\n",
        "\"x\"\u{0}",
        "[\"a\",\n\"b\"]",
    ];
    for s in structures {
        reads_alike(s);
    }
    for depth in [1, 100, 126, 127, 128, 129, 200, 5000] {
        reads_alike(&format!("{}{}", "[".repeat(depth), "]".repeat(depth)));
        reads_alike(&format!("{}1{}", "{\"a\":".repeat(depth), "}".repeat(depth)));
        reads_alike(&"[".repeat(depth));
    }
}

#[test]
fn json_reader_reads_real_texts_and_their_cuts_as_serde_json() {
    let mut texts: Vec<String> = nightfield::scenario::comparison_scenarios().into_iter().map(|(_, t)| t).collect();
    for t in trains() {
        texts.push(serde_json::to_string(&t).unwrap());
        texts.push(serde_json::to_string_pretty(&t).unwrap());
    }
    let mut n = 0;
    for t in &texts {
        assert!(reads_alike(t));
        // Every prefix, and every single-character change at each position.
        for cut in 0..t.len() {
            if t.is_char_boundary(cut) {
                reads_alike(&t[..cut]);
                for c in ['"', '\\', ',', '}', ']', '1', '-', 'e', '.', ' ', 'x', '\u{1}'] {
                    let mut m = t.clone();
                    let end = (cut + 1..=t.len()).find(|&e| t.is_char_boundary(e)).unwrap_or(t.len());
                    m.replace_range(cut..end, &c.to_string());
                    reads_alike(&m);
                    n += 1;
                }
            }
        }
    }
    assert!(n > 10_000, "{n}");
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(2000))]
    #[test]
    fn json_reader_agrees_on_any_text(s in "[\\[\\]{}\",:0-9eE.+\\-a-z\\\\ \\t\\nu]{0,40}") {
        reads_alike(&s);
    }

    #[test]
    fn json_reader_agrees_on_any_number(int in proptest::num::u64::ANY, frac in proptest::num::u64::ANY, exp in -400i32..400, form in 0u8..6) {
        let text = match form {
            0 => format!("{int}"),
            1 => format!("-{int}"),
            2 => format!("{int}.{frac}"),
            3 => format!("-{int}.{frac}e{exp}"),
            4 => format!("{}.{frac}E+{}", int % 10, exp.abs()),
            _ => format!("{}", f64::from_bits(int)),
        };
        reads_alike(&text);
    }
}

// --- Unit-only enums (json::unit_variants!) against serde's derive. ---

macro_rules! reference_unit_enum {
    ($reference:ident, $rename:literal, [$($variant:ident),*]) => {
        #[derive(Serialize, Deserialize)]
        #[serde(rename_all = $rename)]
        enum $reference { $($variant),* }
    };
}
reference_unit_enum!(RefPort, "snake_case", [Left, Right]);
reference_unit_enum!(RefDiagonalKind, "snake_case", [None, Mirror90, Prism90, ErectingRoof45, ErectingRoof90]);
reference_unit_enum!(RefFilterKind, "snake_case", [Neutral, NebulaBandPass, Solar, Colour]);
reference_unit_enum!(RefRowOrder, "snake_case", [TopDown, BottomUp]);
reference_unit_enum!(RefPierSide, "snake_case", [West, East]);
reference_unit_enum!(RefPrismKind, "snake_case", [Erect, Mirror]);
reference_unit_enum!(RefSkyClass, "kebab-case", [RemoteWilderness, DarkCountryside, Countryside, VillageEdge, Suburb, BrightSuburb, Town, CityCentre]);
#[derive(Serialize, Deserialize)]
enum RefBarrel {
    #[serde(rename = "1.25in")]
    In125,
    #[serde(rename = "2in")]
    In2,
}

fn unit_enum_alike<New: serde::de::DeserializeOwned + Serialize, Old: serde::de::DeserializeOwned + Serialize>(all: &[New]) {
    let mut inputs =
        vec![json!("x"), json!(""), json!(null), json!(1), json!(0), json!(true), json!([]), json!({}), json!({"a": null, "b": null}), json!({"x": null})];
    for v in all {
        let name = serde_json::to_value(v).unwrap();
        // Both ways: the name `Serialize` writes reads back to the same variant.
        assert_eq!(serde_json::to_value(json::from_value::<New>(name.clone()).unwrap()).unwrap(), name);
        let n = name.as_str().unwrap().to_string();
        inputs.extend([
            name.clone(),
            json!(n.to_uppercase()),
            json!({ n.clone(): null }),
            json!({ n.clone(): 1 }),
            json!({ n.clone(): null, "y": null }),
            json!([n]),
        ]);
    }
    for i in inputs {
        same::<New, Old>(&i);
    }
}

#[test]
fn unit_enums_read_as_serde_derive_read_them() {
    unit_enum_alike::<Port, RefPort>(&[Port::Left, Port::Right]);
    unit_enum_alike::<DiagonalKind, RefDiagonalKind>(&[
        DiagonalKind::None,
        DiagonalKind::Mirror90,
        DiagonalKind::Prism90,
        DiagonalKind::ErectingRoof45,
        DiagonalKind::ErectingRoof90,
    ]);
    unit_enum_alike::<FilterKind, RefFilterKind>(&[FilterKind::Neutral, FilterKind::NebulaBandPass, FilterKind::Solar, FilterKind::Colour]);
    unit_enum_alike::<Barrel, RefBarrel>(&[Barrel::In125, Barrel::In2]);
    unit_enum_alike::<RowOrder, RefRowOrder>(&[RowOrder::TopDown, RowOrder::BottomUp]);
    unit_enum_alike::<PierSide, RefPierSide>(&[PierSide::West, PierSide::East]);
    unit_enum_alike::<PrismKind, RefPrismKind>(&[PrismKind::Erect, PrismKind::Mirror]);
    unit_enum_alike::<SkyClass, RefSkyClass>(&SkyClass::ALL);
}

// --- Structs written as arrays (serde reads their fields in order; json::positional). ---

/// Every prefix of `full` (and one element too many), and each element replaced by another type.
fn positional_variants(full: Value) -> Vec<Value> {
    let a = full.as_array().unwrap().clone();
    let mut out = Vec::new();
    for n in 0..=a.len() {
        out.push(Value::Array(a[..n].to_vec()));
    }
    let mut longer = a.clone();
    longer.push(json!(0));
    out.push(Value::Array(longer));
    for i in 0..a.len() {
        for repl in [json!(null), json!("x"), json!(1), json!([]), json!({})] {
            let mut m = a.clone();
            m[i] = repl;
            out.push(Value::Array(m));
        }
    }
    out
}

fn positional_alike<T: serde::de::DeserializeOwned + Serialize>(full: Value) -> usize {
    positional_variants(full).iter().map(|v| same::<T, T>(v) as usize).sum()
}

#[test]
fn structs_written_as_arrays_read_as_serde_json_reads_them() {
    use nightfield::plan::input::{AzSector, HorizonMask, Obstruction};
    use nightfield::scenario::{SiteSpec, ViewSpec};
    let mut accepted = 0;
    accepted += positional_alike::<SiteSpec>(json!(["Field", 47.0, 8.3, 560, "Europe/Zurich", "19:00", "23:00"]));
    accepted += positional_alike::<ViewSpec>(json!([true, false, true, false, 21.0, [1.5, -2.0], 30]));
    accepted += positional_alike::<HorizonMask>(json!([10.0, [[0, 90, 25.0], {"az_from_deg": 270, "az_to_deg": 300, "alt_deg": 15}]]));
    accepted += positional_alike::<Obstruction>(json!([0, 90, 25.0]));
    accepted += positional_alike::<AzSector>(json!([350, 20]));
    accepted += positional_alike::<Eyepiece>(json!([25, 52, 21.2, 17, "2in", 0.9]));
    accepted += positional_alike::<Telescope>(json!([{"type": "newtonian", "focuser_angle_deg": 30}, 200, 1200, 50, 0.92, 0.95]));
    accepted += positional_alike::<FinderSpec>(json!([{"type": "right_angle", "prism": "erect"}, 50, 9, 5]));
    let demo: Value = serde_json::from_str(nightfield::scenario::DEMO_SCENARIO_JSON).unwrap();
    let fields = ["version", "site", "time_utc", "kit", "station", "eyepiece", "train", "stations", "target", "view"];
    let scenario = Value::Array(fields.iter().map(|f| demo.get(*f).cloned().unwrap_or(json!(null))).collect());
    accepted += positional_alike::<Scenario>(scenario);
    assert!(accepted > 40, "{accepted}");
}

#[test]
fn the_kit_is_carried_whole() {
    let kit = json!({"schema": 2, "items": [{"id": "ep25", "f": 25.0, "afov": 52, "neg": -3, "big": 18446744073709551615u64, "tiny": 1e-300,
        "name": "Plössl “25” ✓", "tags": [], "none": null, "ok": true}], "stations": [{"name": "A", "items": ["ep25"]}], "nested": [[[{}]]]});
    let mut demo: Value = serde_json::from_str(nightfield::scenario::DEMO_SCENARIO_JSON).unwrap();
    demo["kit"] = kit.clone();
    let text = demo.to_string();
    let s = Scenario::from_json(&text).unwrap();
    assert!(identical(&s.kit, &kit));
    assert!(identical(&serde_json::from_str::<Scenario>(&text).unwrap().kit, &s.kit));
}
