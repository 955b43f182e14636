import { ENCRYPTIONS, POLARISATIONS, RADIO_ROLES, type Band, type ChannelWidthMHz } from '../../../../shared/enums';
import { validChannels, type ChannelRegion } from '../../../../shared/radio/channels';
import { radioCreateSchema, type RadioDto } from '../../../../shared/schemas/radio';
import { Caution } from '../../../components/caution';
import { FormMessage, SelectField, TextField, type Option, FormActions } from '../../../components/form-field';
import { toNumber, useSchemaForm } from '../../../lib/schema-form';
import { asWidth, bandOptions, channelOptions, isBand, widthOptions } from '../../../lib/channel-options';
import { useCreateRadio, useUpdateRadio } from '../api/radios';
import { ENCRYPTION_WORDS, ROLE_WORDS } from './radio-words';

interface RadioFormProps {
  nodeId: number;
  /** The network's region (admin setting): the channel list offers only what is allowed there. */
  region: ChannelRegion;
  radio?: RadioDto;
  onSaved: (radio: RadioDto) => void;
  onCancel: () => void;
}

function initialValues(radio?: RadioDto) {
  return {
    iface: radio?.iface ?? 'wlan0',
    role: radio?.role ?? 'access-point',
    band: radio?.band ?? '5',
    channelWidthMHz: String(radio?.channelWidthMHz ?? 20),
    channel: radio ? String(radio.channel) : '',
    txPowerDbm: radio ? String(radio.txPowerDbm) : '',
    antennaGainDbi: radio ? String(radio.antennaGainDbi) : '',
    polarisation: radio?.polarisation ?? 'vertical',
    cableLossDb: radio ? String(radio.cableLossDb) : '0',
    ssid: radio?.ssid ?? '',
    encryption: radio?.encryption ?? 'wpa2-ccmp',
    preSharedKey: '',
    groupRekeyS: radio ? String(radio.groupRekeyS) : '600',
  };
}

const choices = (values: readonly string[], words?: Record<string, string>): Option[] => values.map((v) => ({ value: v, label: words?.[v] ?? v }));
const POLARISATION_WORDS: Record<string, string> = { vertical: 'Vertical', horizontal: 'Horizontal', dual: 'Dual (both)', circular: 'Circular' };

/** Add or edit one radio of a node; validated with the API's own schema, so the messages are the API's. */
export function RadioForm({ nodeId, region, radio, onSaved, onCancel }: RadioFormProps) {
  const create = useCreateRadio();
  const update = useUpdateRadio(radio?.id ?? 0);
  const form = useSchemaForm({
    defaultValues: initialValues(radio),
    schema: radioCreateSchema,
    toInput: (values) => ({
      nodeId,
      iface: values.iface,
      role: values.role,
      band: values.band,
      channel: toNumber(values.channel),
      channelWidthMHz: toNumber(values.channelWidthMHz),
      txPowerDbm: toNumber(values.txPowerDbm),
      antennaGainDbi: toNumber(values.antennaGainDbi),
      polarisation: values.polarisation,
      cableLossDb: toNumber(values.cableLossDb),
      ssid: values.ssid === '' ? null : values.ssid,
      encryption: values.encryption,
      // Write-only: an open network holds no key; a blank field keeps the stored key (or sets none on a new radio).
      ...(values.encryption === 'none' ? { preSharedKey: null } : values.preSharedKey ? { preSharedKey: values.preSharedKey } : {}),
      groupRekeyS: toNumber(values.groupRekeyS),
    }),
  });
  const { field, setValue } = form;
  const [bandValue, widthValue, channel, encryption] = form.watch(['band', 'channelWidthMHz', 'channel', 'encryption']);
  const band: Band = isBand(bandValue) ? bandValue : '5';
  const width = asWidth(widthValue);
  const keyless = encryption === 'none';

  // A new band or width keeps the channel only where it is still offered.
  function changeBandOrWidth(nextBand: Band, nextWidth: ChannelWidthMHz) {
    const usableWidth = widthOptions(region, nextBand).some((o) => o.value === String(nextWidth)) ? nextWidth : 20;
    setValue('band', nextBand);
    setValue('channelWidthMHz', String(usableWidth));
    if (!validChannels(nextBand, usableWidth, region).includes(Number(channel))) setValue('channel', '');
  }

  const submit = form.handleSubmit((input) => {
    if (radio) update.mutate(input, { onSuccess: onSaved, onError: form.showServerError });
    else create.mutate(input, { onSuccess: onSaved, onError: form.showServerError });
  });

  return (
    <form
      noValidate
      aria-label={radio ? `Edit radio ${radio.iface}` : 'New radio'}
      data-testid="radio-form"
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={submit}
    >
      <Caution>
        High-gain antennas concentrate radio energy: keep people out of the beam while the radio transmits, and never work on a mast or antenna while it is
        powered. Power and exposure limits are set by your regulator; follow local codes and licensed practice.
      </Caution>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <TextField label="Interface" {...field('iface')} hint="The router's name for the radio, e.g. wlan0" />
        <SelectField label="Role" {...field('role')} options={choices(RADIO_ROLES, ROLE_WORDS)} />
        <SelectField
          label="Band"
          {...field('band')}
          onChange={(e) => isBand(e.target.value) && changeBandOrWidth(e.target.value, width)}
          options={bandOptions}
        />
        <SelectField
          label="Channel width"
          {...field('channelWidthMHz')}
          onChange={(e) => changeBandOrWidth(band, asWidth(e.target.value))}
          options={widthOptions(region, band)}
        />
        <SelectField
          label="Channel"
          {...field('channel')}
          options={channelOptions(region, band, width, channel)}
          placeholder="Choose…"
          hint={`Channels allowed in ${region} at this band and width (the network's region)`}
        />
        <TextField label="Transmit power (dBm)" inputMode="decimal" {...field('txPowerDbm')} hint="At the radio's output, −10 to 36" />
        <TextField label="Antenna gain (dBi)" inputMode="decimal" {...field('antennaGainDbi')} />
        <SelectField label="Polarisation" {...field('polarisation')} options={choices(POLARISATIONS, POLARISATION_WORDS)} />
        <TextField
          label="Cable and connector loss (dB)"
          inputMode="decimal"
          {...field('cableLossDb')}
          hint="Between the radio and the antenna; 0 for a radio built into its antenna"
        />
        <TextField label="SSID" {...field('ssid')} hint="Blank when the radio announces no network name" />
        <SelectField label="Encryption" {...field('encryption')} options={choices(ENCRYPTIONS, ENCRYPTION_WORDS)} />
        <TextField
          label="Pre-shared key"
          type="password"
          autoComplete="new-password"
          {...field('preSharedKey')}
          disabled={keyless}
          hint={
            keyless
              ? 'An open network has no key.'
              : radio?.hasPreSharedKey
                ? 'A key is stored and never shown. Leave blank to keep it, or type a new one.'
                : '8–63 printable characters or 64 hex digits. Never shown again after saving.'
          }
        />
        <TextField label="Group key rekey interval (s)" inputMode="numeric" {...field('groupRekeyS')} hint="0 turns rekeying off (not advised)" />
      </div>
      <FormActions label={radio ? 'Save radio' : 'Add radio'} busy={create.isPending || update.isPending} onCancel={onCancel} />
    </form>
  );
}
