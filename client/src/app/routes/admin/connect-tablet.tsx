import { useQuery } from '@tanstack/react-query'
import { Section } from '../../../components/ui/section'
import { connectTabletOptions, tabletQrImages } from '../../../features/tablets/api/tablet-queries'

/** "Connect a tablet": the address the shop's tablets open, as text and QR code, and how to trust HTTPS. */
export function Component() {
  const connect = useQuery(connectTabletOptions())
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Connect a tablet</h1>
      {connect.isError ? (
        <p role="alert" className="text-red-700">
          {connect.error.message}
        </p>
      ) : !connect.data ? (
        <p className="text-stone-500">Loading…</p>
      ) : (
        <>
          {connect.data.problems.length > 0 && (
            <div role="alert" aria-label="Tablets cannot connect yet" className="space-y-2 rounded-md border border-amber-400 bg-amber-50 p-4 text-amber-950">
              <p className="font-bold">Tablets cannot reach Kitwright yet:</p>
              <ul className="list-disc space-y-1 pl-6">
                {connect.data.problems.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            </div>
          )}
          {connect.data.caCertificateUrl && (
            <Section title="1. Trust this shop's certificate (once per tablet)" id="trust-certificate">
              <div className="flex flex-wrap items-start gap-6">
                <img src={tabletQrImages.caCertificate} alt="QR code of the certificate authority's download address" width={220} height={220} className="rounded border border-stone-300" />
                <div className="max-w-2xl space-y-3">
                  <p>
                    Kitwright serves HTTPS with a certificate from this computer's own certificate authority. A tablet trusts it once; then the camera scanner works and no
                    warning shows. Scan the code with the tablet's camera, or open{' '}
                    <a className="font-bold break-all text-brand-700 underline" href={connect.data.caCertificateUrl}>
                      {connect.data.caCertificateUrl}
                    </a>{' '}
                    on it (the browser warns this once: the certificate is not trusted yet).
                  </p>
                  <div>
                    <h3 className="font-bold">iPad</h3>
                    <ol className="list-decimal space-y-1 pl-6">
                      <li>Open the address in Safari and allow the download of the configuration profile.</li>
                      <li>Settings → General → VPN &amp; Device Management: tap the Kitwright profile, then Install.</li>
                      <li>Settings → General → About → Certificate Trust Settings: turn on full trust for "Kitwright local certificate authority".</li>
                    </ol>
                  </div>
                  <div>
                    <h3 className="font-bold">Android</h3>
                    <ol className="list-decimal space-y-1 pl-6">
                      <li>Open the address in Chrome; the file kitwright-local-ca.crt downloads.</li>
                      <li>Settings → Security (or Security &amp; privacy) → Encryption &amp; credentials → Install a certificate → CA certificate, and pick that file.</li>
                      <li>Close and reopen Chrome.</li>
                    </ol>
                  </div>
                  <p className="text-sm text-stone-600">Menu names differ a little between versions. The certificate holds no secret; its key never leaves this computer.</p>
                </div>
              </div>
            </Section>
          )}
          <Section title={connect.data.caCertificateUrl ? '2. Open Kitwright on the tablet' : 'Open Kitwright on the tablet'} id="open-on-tablet">
            <div className="flex flex-wrap items-start gap-6">
              <img src={tabletQrImages.signIn} alt={`QR code of ${connect.data.signInUrl}`} width={260} height={260} className="rounded border border-stone-300" />
              <div className="max-w-2xl space-y-3">
                <p>Scan the code with the tablet's camera, or type this address into its browser. It opens the bench sign-in (e-mail and PIN):</p>
                <p data-testid="tablet-address" className="rounded-md bg-stone-100 p-3 font-mono text-2xl font-bold break-all">
                  {connect.data.signInUrl}
                </p>
                <p>The tablet must be on the same network as this computer. Add the page to the home screen so the bench opens with one tap.</p>
                {!connect.data.https && (
                  <p className="text-stone-700">
                    Over plain HTTP, tablet browsers do not allow the camera scanner: scan with a keyboard-wedge barcode scanner, or start Kitwright with{' '}
                    <code className="font-mono">npm start -- --lan --https</code> for the camera.
                  </p>
                )}
              </div>
            </div>
          </Section>
        </>
      )}
    </div>
  )
}
