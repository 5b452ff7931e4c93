/**
 * The garage's basket: parts picked from the catalogue before they become an order. Kept with the garage's
 * account on the server (GET/PUT /api/basket), so every manager and every browser sees the same one; this store
 * holds the copy in use and saves each change. Prices are never kept here: the server prices the lines when the
 * order is previewed and placed. A quantity is changed only to a whole number from 1 to 999; the order page says
 * why beside the field otherwise and keeps the line.
 */
import { defineStore } from 'pinia'
import { LineQuantitySchema, MAX_LINE_QUANTITY, MAX_ORDER_LINES } from '#shared/schemas/orders'
import type { BasketItem } from '#shared/types/orders'

export type { BasketItem }

export const useBasketStore = defineStore('basket', () => {
  const items = ref<BasketItem[]>([])
  const loaded = ref(false)
  const saveError = ref('')
  let loading: Promise<void> | null = null
  const count = computed(() => items.value.reduce((s, i) => s + i.quantity, 0))
  const isEmpty = computed(() => items.value.length === 0)

  /** Reads the basket from the server once (again with `force`). */
  function load(force = false): Promise<void> {
    if (loaded.value && !force) return Promise.resolve()
    loading ??= api<{ items: BasketItem[] }>('/api/basket')
      .then((r) => { items.value = r.items; loaded.value = true })
      .finally(() => { loading = null })
    return loading
  }

  async function save(): Promise<void> {
    saveError.value = ''
    try {
      items.value = (await api<{ items: BasketItem[] }>('/api/basket', { method: 'PUT', body: { items: items.value } })).items
    } catch {
      saveError.value = 'The basket could not be saved. Check your connection and try again.'
    }
  }

  async function add(sku: string, description: string, quantity = 1): Promise<void> {
    await load()
    const key = sku.trim().toUpperCase()
    const hit = items.value.find((i) => i.sku.toUpperCase() === key)
    if (hit) hit.quantity = Math.min(MAX_LINE_QUANTITY, hit.quantity + quantity)
    else if (items.value.length < MAX_ORDER_LINES) items.value.push({ sku: sku.trim(), description, quantity: Math.min(MAX_LINE_QUANTITY, Math.max(1, quantity)) })
    await save()
  }

  /** Sets a line's quantity; returns the reason when it is not a whole number from 1 to 999 (nothing changes then). */
  async function setQuantity(sku: string, quantity: number): Promise<string | null> {
    const hit = items.value.find((i) => i.sku === sku)
    if (!hit) return null
    const checked = LineQuantitySchema.safeParse(quantity)
    if (!checked.success) return checked.error.issues[0]?.message ?? 'Enter a whole number.'
    hit.quantity = checked.data
    await save()
    return null
  }

  async function remove(sku: string): Promise<void> {
    items.value = items.value.filter((i) => i.sku !== sku)
    await save()
  }

  async function clear(): Promise<void> {
    items.value = []
    await save()
  }

  /** The `lines` of POST /api/orders. */
  const lines = computed(() => items.value.map((i) => ({ sku: i.sku, quantity: i.quantity })))

  return { items, loaded, saveError, count, isEmpty, lines, load, add, setQuantity, remove, clear }
})
