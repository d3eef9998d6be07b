/** Canonical JSON and the definition hash; SHA-256 against published vectors and node:crypto. */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { canonicalJson, hashDefinition, sha256Hex } from "@/machines/hash";
import { FORMAT_ID, type SequenceDefinitionInput } from "@/machines/schema";

describe("sha256", () => {
  // FIPS 180-4 / NIST CSRC example values (SHA256.pdf, "Examples with Intermediate Values") and the
  // NIST CAVP short/long message vectors quoted in FIPS 180-2 Appendix B.
  it("matches the one-block message 'abc'", () => {
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
  });
  it("matches the empty message", () => {
    expect(sha256Hex("")).toBe("e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
  });
  it("matches the two-block 448-bit message", () => {
    expect(sha256Hex("abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq")).toBe(
      "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1",
    );
  });
  it("matches one million 'a'", () => {
    expect(sha256Hex("a".repeat(1_000_000))).toBe("cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0");
  });
  it("agrees with node:crypto across the padding boundaries and on non-ASCII text", () => {
    for (let n = 0; n <= 200; n++) {
      const text = Array.from({ length: n }, (_, i) => String.fromCharCode(32 + ((i * 7 + n) % 95))).join("");
      expect(sha256Hex(text)).toBe(createHash("sha256").update(text, "utf8").digest("hex"));
    }
    const unicode = "Druck ≥ 40 cmH₂O — ventilación 🫁";
    expect(sha256Hex(unicode)).toBe(createHash("sha256").update(unicode, "utf8").digest("hex"));
  });
});

describe("canonicalJson", () => {
  it("sorts keys at every depth, keeps array order, writes no whitespace", () => {
    expect(canonicalJson({ b: 1, a: { d: [3, { z: 1, y: 2 }], c: "x" } })).toBe('{"a":{"c":"x","d":[3,{"y":2,"z":1}]},"b":1}');
  });
  it("does not depend on key order or on the whitespace of the source text", () => {
    const pretty = JSON.parse('{\n  "b": [1, 2],\n  "a": { "y": true, "x": null }\n}');
    const compact = JSON.parse('{"a":{"x":null,"y":true},"b":[1,2]}');
    expect(canonicalJson(pretty)).toBe(canonicalJson(compact));
  });
  it("writes numbers in JSON form and drops undefined members", () => {
    expect(canonicalJson({ a: 1.0, b: 1e21, c: -0, d: 0.1, e: undefined })).toBe('{"a":1,"b":1e+21,"c":0,"d":0.1}');
  });
  it("refuses values JSON cannot hold", () => {
    expect(() => canonicalJson({ a: Number.NaN })).toThrow(/\$\.a is NaN/);
    expect(() => canonicalJson({ a: Infinity })).toThrow();
  });
});

const definition = (): SequenceDefinitionInput => ({
  format: FORMAT_ID,
  name: "Hash fixture",
  settings: { Ti: { unit: "s", value: 1, min: 0.3, max: 2 }, Pmax: { unit: "cmH2O", value: 35 } },
  machine: {
    id: "h",
    initial: "inhale",
    states: {
      inhale: {
        meta: { kind: "inhale", command: { kind: "pressure", target: "20", rise: "0.1" } },
        after: { Ti: { target: "exhale" } },
        on: { SCAN: [{ target: "exhale", guard: { type: "formula", params: { expr: "paw > Pmax" } } }, { target: "exhale", guard: { type: "formula", params: { expr: "vol > 800" } } }] },
      },
      exhale: { meta: { kind: "exhale", command: { kind: "release" } }, after: { "2": { target: "inhale" } } },
    },
  },
});

/** The same object with every key order reversed, recursively. */
function reversedKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(reversedKeys);
  if (value && typeof value === "object") {
    return Object.fromEntries(Object.entries(value).reverse().map(([k, v]) => [k, reversedKeys(v)]));
  }
  return value;
}

describe("hashDefinition", () => {
  const base = hashDefinition(definition());
  it("is a SHA-256 hex string of the canonical definition", () => {
    expect(base).toMatch(/^[0-9a-f]{64}$/);
  });
  it("ignores key order and formatting", () => {
    expect(hashDefinition(reversedKeys(definition()) as SequenceDefinitionInput)).toBe(base);
    expect(hashDefinition(JSON.parse(JSON.stringify(definition(), null, 2)))).toBe(base);
  });
  it("treats defaults written out and left out as the same sequence", () => {
    const d = definition();
    d.monitors = [];
    d.machine.states.exhale.meta.alarms = [];
    expect(hashDefinition(d)).toBe(base);
  });
  it("changes with every semantic change", () => {
    const edits: Array<(d: SequenceDefinitionInput) => void> = [
      (d) => (d.name = "Renamed"),
      (d) => (d.settings.Ti.value = 1.1),
      (d) => (d.settings.Ti.max = 3),
      (d) => (d.machine.states.inhale.meta.kind = "custom"),
      (d) => (d.machine.states.exhale.after = { "2.5": { target: "inhale" } }),
      (d) => {
        const scan = d.machine.states.inhale.on!.SCAN as unknown[];
        scan.reverse(); // priority order is meaning
      },
      (d) => {
        const scan = d.machine.states.inhale.on!.SCAN as Array<{ guard: { params: { expr: string } } }>;
        scan[0].guard.params.expr = "paw >= Pmax";
      },
    ];
    const hashes = edits.map((edit) => {
      const d = definition();
      edit(d);
      return hashDefinition(d);
    });
    for (const h of hashes) expect(h).not.toBe(base);
    expect(new Set(hashes).size).toBe(hashes.length);
  });
});
