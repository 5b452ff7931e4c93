/**
 * The vehicle finder's choice: make -> model -> year -> vehicle (engine/variant) and the option answers. Kept here
 * so it survives moving to a part page and back, and mirrored in the URL query (`make`, `model`, `year`,
 * `vehicle`, `opt.<key>`) so a link can be shared and a reload keeps it. The URL wins when both are present.
 */
import { defineStore } from 'pinia'
import type { LocationQuery } from 'vue-router'
import { OPTION_PREFIX as OPT } from '#shared/schemas/catalogue/vehicle-queries'

export const useFinderStore = defineStore('finder', () => {
  const make = ref<string | null>(null)
  const model = ref<string | null>(null)
  const year = ref<number | null>(null)
  const vehicleId = ref<number | null>(null)
  const answers = ref<Record<string, string>>({})

  const first = (v: LocationQuery[string] | undefined) => (Array.isArray(v) ? v[0] : v) ?? null

  /** Reads a URL query; returns false when it carries no finder choice at all. */
  function fromQuery(q: LocationQuery): boolean {
    const m = first(q.make), mo = first(q.model), y = Number(first(q.year)), v = Number(first(q.vehicle))
    if (!m && !v) return false
    make.value = m || null
    model.value = m ? first(q.model) || null : null
    year.value = m && mo && Number.isInteger(y) && y > 0 ? y : null
    vehicleId.value = Number.isInteger(v) && v > 0 ? v : null
    const a: Record<string, string> = {}
    for (const [k, val] of Object.entries(q)) if (k.startsWith(OPT) && first(val)) a[k.slice(OPT.length)] = String(first(val))
    answers.value = a
    return true
  }

  const query = computed(() => {
    const q: Record<string, string> = {}
    if (make.value) q.make = make.value
    if (model.value) q.model = model.value
    if (year.value) q.year = String(year.value)
    if (vehicleId.value) q.vehicle = String(vehicleId.value)
    for (const [k, v] of Object.entries(answers.value)) q[`${OPT}${k}`] = v
    return q
  })

  function chooseMake(m: string | null) { make.value = m; model.value = null; year.value = null; vehicleId.value = null; answers.value = {} }
  function chooseModel(m: string | null) { model.value = m; year.value = null; vehicleId.value = null; answers.value = {} }
  function chooseYear(y: number | null) { year.value = y; vehicleId.value = null; answers.value = {} }
  function chooseVehicle(id: number | null) { vehicleId.value = id; answers.value = {} }
  function answer(key: string, value: string | null) {
    const others = Object.entries(answers.value).filter(([k]) => k !== key)
    answers.value = Object.fromEntries(value === null ? others : [...others, [key, value]])
  }
  function reset() { chooseMake(null) }

  return { make, model, year, vehicleId, answers, query, fromQuery, chooseMake, chooseModel, chooseYear, chooseVehicle, answer, reset }
})
