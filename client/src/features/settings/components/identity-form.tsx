import { zodResolver } from '@hookform/resolvers/zod'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { z } from 'zod'
import { UpdateShopIdentitySchema, type ShopIdentity, type UpdateShopIdentity } from '@kitwright/shared/settings'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useUpdateIdentity } from '../api/identity-queries'

const ADDRESS_FIELDS = ['name', 'line1', 'line2', 'city', 'region', 'postalCode', 'country', 'phone'] as const
type AddressField = (typeof ADDRESS_FIELDS)[number]

interface IdentityFormValues {
  shopName: string
  mailFromName: string
  mailFromAddress: string
  replyToAddress: string
  carrierName: string
  shipFrom: Record<AddressField, string>
}

/** What the form sends: blank text is "none", and a ship-from address left wholly blank is no address. */
function toUpdate(v: IdentityFormValues): UpdateShopIdentity {
  const blankAddress = ADDRESS_FIELDS.every((k) => v.shipFrom[k].trim() === '')
  return {
    shopName: v.shopName,
    mailFromName: v.mailFromName,
    mailFromAddress: v.mailFromAddress,
    replyToAddress: v.replyToAddress,
    carrierName: v.carrierName,
    shipFrom: blankAddress ? null : { ...v.shipFrom },
  }
}

/** The form is checked by the shared contract itself, so it says what the server would say. */
const identityFormSchema = z
  .object({
    shopName: z.string(),
    mailFromName: z.string(),
    mailFromAddress: z.string(),
    replyToAddress: z.string(),
    carrierName: z.string(),
    shipFrom: z.object(Object.fromEntries(ADDRESS_FIELDS.map((k) => [k, z.string()])) as Record<AddressField, z.ZodString>),
  })
  .superRefine((v, ctx) => {
    const parsed = UpdateShopIdentitySchema.safeParse(toUpdate(v))
    if (!parsed.success) for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: issue.path, message: issue.message })
  })

function valuesOf(identity: ShopIdentity): IdentityFormValues {
  const a = identity.shipFrom
  return {
    shopName: identity.shopName,
    mailFromName: identity.mailFromName ?? '',
    mailFromAddress: identity.mailFromAddress ?? '',
    replyToAddress: identity.replyToAddress ?? '',
    carrierName: identity.carrierName ?? '',
    shipFrom: Object.fromEntries(ADDRESS_FIELDS.map((k) => [k, a?.[k] ?? ''])) as Record<AddressField, string>,
  }
}

const ADDRESS_LABELS: Record<AddressField, string> = {
  name: 'Name on the label',
  line1: 'Street address',
  line2: 'Second line (optional)',
  city: 'City',
  region: 'State or region (optional)',
  postalCode: 'Postal code',
  country: 'Country (two letters, e.g. US)',
  phone: 'Phone (optional)',
}

/** The owner's form for who the shop is to its customers: name, e-mail sender, reply-to, ship-from address; the public address shown read-only. */
export function IdentityForm({ identity }: { identity: ShopIdentity }) {
  const update = useUpdateIdentity()
  const form = useForm<IdentityFormValues>({ resolver: zodResolver(identityFormSchema), defaultValues: valuesOf(identity) })
  const errors = form.formState.errors
  const submit = form.handleSubmit((v) =>
    update.mutate(toUpdate(v), {
      onSuccess: (saved) => {
        toast.success('Shop identity saved')
        form.reset(valuesOf(saved))
      },
      onError: (err) => applyServerErrors(err, form.setError),
    }),
  )
  return (
    <form onSubmit={submit} aria-label="Shop identity" className="max-w-2xl space-y-6" noValidate>
      <fieldset className="space-y-4">
        <legend className="text-xl font-bold">Shop identity</legend>
        <p className="text-sm text-stone-600">Customers see these on every e-mail, packing slip and shipping label.</p>
        <Field label="Shop name" error={errors.shopName?.message}>
          <Input {...form.register('shopName')} aria-invalid={!!errors.shopName} />
        </Field>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Sender name" error={errors.mailFromName?.message} hint="The From name of every e-mail; blank: the shop name.">
            <Input {...form.register('mailFromName')} aria-invalid={!!errors.mailFromName} />
          </Field>
          <Field
            label="Sender e-mail"
            error={errors.mailFromAddress?.message}
            hint={`The From address; blank: ${identity.mailFromFallback} (MAIL_FROM). Your mail relay must be allowed to send as it.`}
          >
            <Input type="email" {...form.register('mailFromAddress')} aria-invalid={!!errors.mailFromAddress} />
          </Field>
        </div>
        <Field label="Reply-to e-mail" error={errors.replyToAddress?.message} hint="Where customers' replies go; blank: to the From address.">
          <Input type="email" {...form.register('replyToAddress')} aria-invalid={!!errors.replyToAddress} />
        </Field>
        <Field
          label="Carrier"
          error={errors.carrierName?.message}
          hint="The carrier you ship with, as your shipping service names it; printed on labels, e-mails and timelines. Only its rates are offered."
        >
          <Input {...form.register('carrierName')} aria-invalid={!!errors.carrierName} />
        </Field>
      </fieldset>
      <fieldset className="space-y-4">
        <legend className="text-xl font-bold">Ship-from and return address</legend>
        <p className="text-sm text-stone-600">Printed as the sender on every shipping label and as the return address on every packing slip. No label can be bought until it is set.</p>
        {errors.shipFrom?.message ? (
          <p role="alert" className="text-sm text-red-700">
            {errors.shipFrom.message}
          </p>
        ) : null}
        <div className="grid gap-4 sm:grid-cols-2">
          {ADDRESS_FIELDS.map((k) => (
            <Field key={k} label={ADDRESS_LABELS[k]} error={errors.shipFrom?.[k]?.message}>
              <Input {...form.register(`shipFrom.${k}`)} aria-invalid={!!errors.shipFrom?.[k]} />
            </Field>
          ))}
        </div>
      </fieldset>
      <section aria-labelledby="public-address" className="space-y-1">
        <h3 id="public-address" className="text-sm font-bold text-stone-700">
          Public address
        </h3>
        <p className="font-mono text-base" data-testid="public-url">
          {identity.publicUrl}
        </p>
        <p className="text-sm text-stone-600">
          Every link in customer e-mails (build records) and every QR code starts with it. It comes from PUBLIC_URL in the server&rsquo;s
          environment (see the README), because it must match how the app is served; change it there and restart.
        </p>
      </section>
      <Button type="submit" disabled={update.isPending || !form.formState.isDirty}>
        Save shop identity
      </Button>
    </form>
  )
}
