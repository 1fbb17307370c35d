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
                    for repl in [json!(null), json!(7), json!(2.5), json!("x"), json!("telescope"), json!("class"), json!({}), json!([1.0, 2.0])] {
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
