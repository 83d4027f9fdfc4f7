// The device form's state: what was typed (kept until saved, even when it does not pass), the
// fields that changed since the form was loaded, the live advice for what is on screen, and save.
import { useCallback, useEffect, useMemo, useState } from "react";
import type { SiteItem } from "@/survey/capture";
import type { UnitSystem } from "@/survey/units";
import { walkAdvice, type WalkSiteMeta } from "@/survey/walk/advice";
import { changedFields, deviceToForm, devicePatch, FIELD_KEYS, liveDraft, type DeviceForm, type FormErrors, type FormKey } from "@/survey/walk/device-form";
import { deviceGapList } from "@/survey/walk/gaps";

type Data = Record<string, unknown>;

interface State {
  initial: DeviceForm;
  current: DeviceForm;
}

const POWER_FIGURE_KEYS: readonly FormKey[] = ["watts", "volts", "amps"];

export interface SaveOutcome {
  saved: string[];
  held: string[];
  /** The inputs marked with a message for the held fields, by label. */
  marked: string[];
}

export function useDeviceForm(opts: { deviceId: string; stored: Data; units: UnitSystem; meta: WalkSiteMeta; items: readonly SiteItem[]; save: (patch: Record<string, unknown>) => Promise<unknown> }) {
  const { deviceId, stored, units, meta, items, save } = opts;
  const [state, setState] = useState<State>(() => {
    const form = deviceToForm(stored, units);
    return { initial: form, current: form };
  });
  const [errors, setErrors] = useState<FormErrors>({});
  const [saving, setSaving] = useState(false);
  const storedKey = JSON.stringify(stored);

  // What arrives from the store (a save, another surveyor's change) refreshes the untouched fields.
  useEffect(() => {
    const fresh = deviceToForm(JSON.parse(storedKey) as Data, units);
    setState(({ initial, current }) => {
      const nextInitial = { ...fresh };
      const nextCurrent = { ...fresh };
      for (const field of changedFields(initial, current)) {
        for (const k of FIELD_KEYS[field]) {
          (nextInitial as Record<FormKey, unknown>)[k] = initial[k];
          (nextCurrent as Record<FormKey, unknown>)[k] = current[k];
        }
      }
      return { initial: nextInitial, current: nextCurrent };
    });
  }, [storedKey, units, deviceId]);

  const set = useCallback(<K extends FormKey>(key: K, value: DeviceForm[K]) => {
    setState((s) => {
      const current = { ...s.current, [key]: value };
      // Typing a figure replaces the typical one.
      if (POWER_FIGURE_KEYS.includes(key)) current.powerTypical = false;
      return { ...s, current };
    });
    setErrors((e) => (e[key] ? { ...e, [key]: undefined } : e));
  }, []);

  const setMany = useCallback((patch: Partial<DeviceForm>) => {
    setState((s) => ({ ...s, current: { ...s.current, ...patch } }));
    setErrors((e) => {
      const next = { ...e };
      for (const k of Object.keys(patch) as FormKey[]) delete next[k];
      return next;
    });
  }, []);

  const dirty = useMemo(() => changedFields(state.initial, state.current), [state]);

  // Live advice for what is on screen: the stored device with every valid field of the form on top.
  const live = useMemo(() => liveDraft(stored, state.initial, state.current, units), [stored, state, units]);
  // Keyed by the draft's contents: typing that changes nothing valid does not re-run the rules.
  const draftKey = JSON.stringify(live.data);
  const waitingKey = JSON.stringify(live.waitsFor);
  const advice = useMemo(() => {
    const data = JSON.parse(draftKey) as Data;
    const waitsFor = JSON.parse(waitingKey) as string[];
    if (waitsFor.length > 0) return { evaluation: null, refused: null, waitsFor, gaps: deviceGapList(data).map((g) => g.text) };
    const others = items.filter((i) => i.id !== deviceId);
    const mine: SiteItem = { id: deviceId, siteId: meta.id, kind: "device", data, deleted: false, version: 0 };
    const result = walkAdvice(meta, [...others, mine]);
    return { evaluation: result.byDevice.get(deviceId) ?? null, refused: result.refused.get(deviceId) ?? null, waitsFor, gaps: deviceGapList(data).map((g) => g.text) };
  }, [draftKey, waitingKey, items, meta, deviceId]);

  async function submit(): Promise<SaveOutcome> {
    const { patch, check, held, marked } = devicePatch(state.initial, state.current, units);
    setErrors(check.errors);
    const saved = Object.keys(patch);
    if (saved.length === 0) return { saved, held, marked };
    setSaving(true);
    try {
      await save(patch);
      // Saved fields are now the baseline; held (bad) fields stay changed, with what was typed.
      setState(({ initial, current }) => {
        const nextInitial = { ...initial };
        for (const field of saved) for (const k of FIELD_KEYS[field]) (nextInitial as Record<FormKey, unknown>)[k] = current[k];
        return { initial: nextInitial, current };
      });
    } finally {
      setSaving(false);
    }
    return { saved, held, marked };
  }

  return { form: state.current, set, setMany, errors, dirty, advice, submit, saving };
}
